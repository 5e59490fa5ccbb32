import { Router } from 'express';
import { z } from 'zod';
import { CATALOGUE_ENTRY_TYPES, curateEntryInput, hideModelInput, mergeEntriesInput, pinNoteInput } from '@shared/schemas/moderation';
import { requireNotMakerStaff, requireRole } from '../../auth/require-user';
import type { Db } from '../../db/knex';
import { NotFoundError } from '../../lib/errors';
import { validate } from '../../middleware/validate';
import * as curation from './curation.repository';
import { curateEntry, hideModel, mergeEntries, pinNote } from './curation.service';
import { idNumber } from '@shared/schemas/fields';

const entryParams = z.object({
  type: z.enum(CATALOGUE_ENTRY_TYPES, { message: 'one of maker, model, firmware, recording_device' }),
  id: idNumber('not an entry number'),
});
const noteParams = z.object({
  subject: z.enum(['model', 'firmware'], { message: 'model or firmware' }),
  id: z.coerce.number().int().positive(),
});
const modelParams = z.object({ id: z.coerce.number().int().positive('not a model number') });
const aliasQuery = z.object({ type: z.enum(CATALOGUE_ENTRY_TYPES), q: z.string().trim().min(1).max(80) });

/**
 * Catalogue curation, mounted under /api/moderation/catalogue. Moderators only,
 * and not makers' staff: merges and hidden models change statistics.
 */
export function curationRouter({ db }: { db: Db }) {
  const router = Router();
  router.use(requireRole('moderator'), requireNotMakerStaff);

  router.get('/pending', async (_req, res) => {
    res.json(await curation.listPending(db));
  });

  router.post('/:type/:id', validate(entryParams, 'params'), validate(curateEntryInput), async (req, res) => {
    const { type, id } = res.locals.params;
    res.json(await curateEntry(db, { type, id, actorId: req.user!.id, input: res.locals.body }));
  });

  router.post('/:type/:id/merge', validate(entryParams, 'params'), validate(mergeEntriesInput), async (req, res) => {
    const { type, id } = res.locals.params;
    res.json(
      await mergeEntries(db, { type, fromId: id, intoId: res.locals.body.intoId, reason: res.locals.body.reason, actorId: req.user!.id }),
    );
  });

  router.put('/:subject/:id/note', validate(noteParams, 'params'), validate(pinNoteInput), async (req, res) => {
    const { subject, id } = res.locals.params;
    res.json(await pinNote(db, { subject, id, body: res.locals.body.body, actorId: req.user!.id }));
  });

  router.delete('/:subject/:id/note', validate(noteParams, 'params'), async (req, res) => {
    const { subject, id } = res.locals.params;
    res.json(await pinNote(db, { subject, id, body: null, actorId: req.user!.id }));
  });

  router.put('/model/:id/hidden', validate(modelParams, 'params'), validate(hideModelInput), async (req, res) => {
    res.json(await hideModel(db, { modelId: res.locals.params.id, reason: res.locals.body.reason, actorId: req.user!.id }));
  });

  router.delete('/model/:id/hidden', validate(modelParams, 'params'), async (req, res) => {
    res.json(await hideModel(db, { modelId: res.locals.params.id, reason: null, actorId: req.user!.id }));
  });

  return router;
}

/** Public: finds a catalogue entry by a name it used to have (mounted at /api/catalogue/aliases). */
export function catalogueAliasRouter({ db }: { db: Db }) {
  const router = Router();
  router.get('/', validate(aliasQuery, 'query'), async (_req, res) => {
    const entry = await curation.findByAlias(db, res.locals.query.type, res.locals.query.q);
    if (!entry) throw new NotFoundError('No catalogue entry was ever called that.');
    res.json(entry);
  });
  return router;
}
