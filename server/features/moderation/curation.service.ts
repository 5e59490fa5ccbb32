import type { Knex } from 'knex';
import type { CuratedEntry, MergeResult } from '@shared/schemas/moderation';
import { versionOrder, versionString } from '@shared/schemas/catalogue';
import type { CatalogueEntryType, CurateEntryInput } from '@shared/schemas/moderation';
import { ConflictError, NotFoundError, ValidationError } from '../../lib/errors';
import { isUniqueViolation } from '../../lib/pg-errors';
import { recordAudit } from '../audit/audit.repository';
import { updateAggregatesForSubmission } from '../statistics/aggregates';
import * as curation from './curation.repository';

const ENTRY_WORDS: Record<CatalogueEntryType, string> = {
  maker: 'maker',
  model: 'model',
  firmware: 'firmware version',
  recording_device: 'recording device',
};

async function lockExisting(trx: Knex.Transaction, type: CatalogueEntryType, id: number) {
  const entry = await curation.lockEntry(trx, type, id);
  if (!entry) throw new NotFoundError(`No such ${ENTRY_WORDS[type]}.`);
  if (entry.status === 'merged')
    throw new ConflictError(`This ${ENTRY_WORDS[type]} was merged into another entry; change that one instead.`);
  return entry;
}

/** Approve, reject or rename one catalogue entry, audited with before and after. */
export async function curateEntry(
  db: Knex,
  command: { type: CatalogueEntryType; id: number; actorId: number; input: CurateEntryInput },
): Promise<CuratedEntry> {
  const { type, id, actorId, input } = command;
  try {
    return await db.transaction(async (trx) => {
      const entry = await lockExisting(trx, type, id);
      const before = { name: entry.name, status: entry.status };
      let after = before;
      if (input.action === 'approve' || input.action === 'reject') {
        const status = input.action === 'approve' ? 'approved' : 'rejected';
        if (entry.status === status) throw new ConflictError(`This ${ENTRY_WORDS[type]} is already ${status}.`);
        await curation.setStatus(trx, type, id, status);
        after = { ...before, status };
      } else {
        let order: number[] | undefined;
        if (type === 'firmware') {
          const parsed = versionString.safeParse(input.name);
          if (!parsed.success)
            throw new ValidationError('name: a version like 3.2 or 3.2.1', { fields: { name: 'a version like 3.2 or 3.2.1' } });
          order = versionOrder(parsed.data);
        }
        if (input.name === entry.name)
          throw new ValidationError('name: that is its name already', { fields: { name: 'that is its name already' } });
        await curation.rename(trx, type, id, input.name, order);
        // The old name keeps finding the entry.
        await curation.addAlias(trx, { type, entryId: id, name: entry.name, slug: null, createdBy: actorId });
        after = { ...before, name: input.name };
      }
      await recordAudit(trx, {
        actorId,
        action: `catalogue.${input.action === 'approve' ? 'approved' : input.action === 'reject' ? 'rejected' : 'renamed'}`,
        subjectType: type,
        subjectId: id,
        reason: input.action === 'reject' ? input.reason : null,
        before,
        after,
      });
      return { id, type, ...after };
    });
  } catch (err) {
    if (isUniqueViolation(err)) throw new ConflictError(`There is already a ${ENTRY_WORDS[type]} with that name.`);
    throw err;
  }
}

/**
 * Merges one entry into another that is the same thing: its submissions (and so
 * the statistics) move, the old entry stays as "merged" so old links resolve, and
 * its name stays as an alias. All in one transaction.
 */
export async function mergeEntries(
  db: Knex,
  command: { type: CatalogueEntryType; fromId: number; intoId: number; actorId: number; reason: string },
): Promise<MergeResult> {
  const { type, fromId, intoId, actorId } = command;
  if (fromId === intoId)
    throw new ValidationError('intoId: an entry cannot be merged into itself', { fields: { intoId: 'choose another entry' } });
  return db.transaction(async (trx) => {
    // Lock in id order, so two merges of the same pair cannot deadlock.
    const [first, second] = fromId < intoId ? [fromId, intoId] : [intoId, fromId];
    const locked = new Map([
      [first, await lockExisting(trx, type, first)],
      [second, await lockExisting(trx, type, second)],
    ]);
    const from = locked.get(fromId)!;
    const into = locked.get(intoId)!;
    if (into.status === 'rejected')
      throw new ConflictError(`The ${ENTRY_WORDS[type]} to keep was rejected; approve it first or merge the other way round.`);
    if (type === 'firmware' && from.modelId !== into.modelId) {
      throw new ValidationError('intoId: firmware versions can only be merged within one model', {
        fields: { intoId: 'choose a version of the same model' },
      });
    }

    const accepted = await curation.acceptedSubmissionsUsing(trx, type, fromId);
    const recordings = await curation.countRecordingsUsing(trx, type, fromId);
    for (const submissionId of accepted) await updateAggregatesForSubmission(trx, submissionId, 'remove');
    await MERGERS[type](trx, from, into, actorId);
    for (const submissionId of accepted) await updateAggregatesForSubmission(trx, submissionId, 'add');

    await recordAudit(trx, {
      actorId,
      action: 'catalogue.merged',
      subjectType: type,
      subjectId: fromId,
      reason: command.reason,
      before: { from: { id: from.id, name: from.name, status: from.status }, into: { id: into.id, name: into.name } },
      after: {
        from: { id: from.id, status: 'merged', mergedIntoId: into.id },
        movedRecordings: recordings,
        movedAcceptedSubmissions: accepted.length,
      },
    });
    return { mergedId: fromId, intoId, movedRecordings: recordings, movedAcceptedSubmissions: accepted.length };
  });
}

async function retire(trx: Knex.Transaction, type: CatalogueEntryType, from: curation.CatalogueEntry, intoId: number, actorId: number) {
  await curation.setStatus(trx, type, from.id, 'merged', intoId);
  await curation.repointAliases(trx, type, from.id, intoId);
  await curation.addAlias(trx, { type, entryId: intoId, name: from.name, slug: from.slug, createdBy: actorId });
}

async function mergeFirmware(trx: Knex.Transaction, from: curation.CatalogueEntry, into: curation.CatalogueEntry, actorId: number) {
  await trx('submission_recordings').where({ firmware_id: from.id }).update({ firmware_id: into.id });
  await retire(trx, 'firmware', from, into.id, actorId);
}

async function mergeModel(trx: Knex.Transaction, from: curation.CatalogueEntry, into: curation.CatalogueEntry, actorId: number) {
  const theirs = await trx('firmware_versions').where({ model_id: into.id }).select('id', 'version');
  const byVersion = new Map(theirs.map((f) => [f.version as string, f.id as number]));
  for (const firmware of await trx('firmware_versions')
    .where({ model_id: from.id })
    .whereNot({ status: 'merged' })
    .select('id', 'version', 'status')) {
    const same = byVersion.get(firmware.version);
    if (same) {
      await trx('submission_recordings').where({ firmware_id: firmware.id }).update({ firmware_id: same, model_id: into.id });
      await retire(
        trx,
        'firmware',
        { id: firmware.id, name: firmware.version, slug: null, status: firmware.status, makerId: null, modelId: from.id },
        same,
        actorId,
      );
    } else {
      await trx('firmware_versions').where({ id: firmware.id }).update({ model_id: into.id });
    }
  }
  await trx('submission_recordings').where({ model_id: from.id }).update({ model_id: into.id });
  await retire(trx, 'model', from, into.id, actorId);
}

async function mergeMaker(trx: Knex.Transaction, from: curation.CatalogueEntry, into: curation.CatalogueEntry, actorId: number) {
  const theirs = await trx('models').where({ maker_id: into.id }).whereNot({ status: 'merged' }).select('id', 'name', 'slug', 'status');
  const byName = new Map(theirs.map((m) => [String(m.name).toLowerCase(), m]));
  for (const model of await trx('models')
    .where({ maker_id: from.id })
    .whereNot({ status: 'merged' })
    .select('id', 'name', 'slug', 'status')) {
    const same = byName.get(String(model.name).toLowerCase());
    const entry = { id: model.id, name: model.name, slug: model.slug, status: model.status, makerId: from.id, modelId: model.id };
    if (same) await mergeModel(trx, entry, { ...entry, id: same.id, name: same.name, slug: same.slug, status: same.status }, actorId);
    else await trx('models').where({ id: model.id }).update({ maker_id: into.id });
  }
  await trx('maker_staff').where({ maker_id: from.id }).update({ maker_id: into.id });
  await retire(trx, 'maker', from, into.id, actorId);
}

async function mergeRecordingDevice(trx: Knex.Transaction, from: curation.CatalogueEntry, into: curation.CatalogueEntry, actorId: number) {
  await trx('submission_recordings').where({ recording_device_id: from.id }).update({ recording_device_id: into.id });
  await retire(trx, 'recording_device', from, into.id, actorId);
}

const MERGERS: Record<
  CatalogueEntryType,
  (trx: Knex.Transaction, from: curation.CatalogueEntry, into: curation.CatalogueEntry, actorId: number) => Promise<void>
> = {
  maker: mergeMaker,
  model: mergeModel,
  firmware: mergeFirmware,
  recording_device: mergeRecordingDevice,
};

// Pinned notes and hidden models

export async function pinNote(db: Knex, command: { subject: 'model' | 'firmware'; id: number; body: string | null; actorId: number }) {
  const column = command.subject === 'model' ? 'model_id' : 'firmware_id';
  return db.transaction(async (trx) => {
    await lockExisting(trx, command.subject, command.id);
    const before = await trx('moderator_notes')
      .where({ [column]: command.id })
      .first('body');
    if (command.body === null) {
      if (!before) throw new NotFoundError('There is no pinned note here.');
      await trx('moderator_notes')
        .where({ [column]: command.id })
        .delete();
    } else {
      await trx('moderator_notes')
        .insert({ [column]: command.id, body: command.body, pinned_by: command.actorId })
        .onConflict(column)
        .merge({ body: command.body, pinned_by: command.actorId, pinned_at: trx.fn.now() });
    }
    await recordAudit(trx, {
      actorId: command.actorId,
      action: command.body === null ? `${command.subject}.note_removed` : `${command.subject}.note_pinned`,
      subjectType: command.subject,
      subjectId: command.id,
      before: before ? { note: before.body } : null,
      after: command.body === null ? null : { note: command.body },
    });
    return { subject: command.subject, id: command.id, note: command.body };
  });
}

export async function hideModel(db: Knex, command: { modelId: number; reason: string | null; actorId: number }) {
  return db.transaction(async (trx) => {
    await lockExisting(trx, 'model', command.modelId);
    const before = await trx('models').where({ id: command.modelId }).first('hidden_reason');
    if (command.reason === null && !before.hidden_reason) throw new ConflictError('This model is not hidden.');
    await trx('models')
      .where({ id: command.modelId })
      .update(
        command.reason === null
          ? { hidden_reason: null, hidden_by: null, hidden_at: null }
          : { hidden_reason: command.reason, hidden_by: command.actorId, hidden_at: trx.fn.now() },
      );
    await recordAudit(trx, {
      actorId: command.actorId,
      action: command.reason === null ? 'model.shown' : 'model.hidden',
      subjectType: 'model',
      subjectId: command.modelId,
      reason: command.reason,
      before: { hiddenReason: before.hidden_reason },
      after: { hiddenReason: command.reason },
    });
    return { id: command.modelId, hiddenReason: command.reason };
  });
}
