import { Router } from 'express';
import { z } from 'zod';
import { type CreatedSubmission, createSubmissionInput } from '@shared/schemas/submission';
import { requireUser } from '../../auth/require-user';
import type { Config } from '../../config/env';
import type { Db } from '../../db/knex';
import type { Queue } from '../../jobs/queue';
import type { ObjectStore } from '../../lib/object-store';
import { NotFoundError, ValidationError } from '../../lib/errors';
import { fitUpload, uploadedFile } from '../../middleware/fit-upload';
import { formatZodError, validate } from '../../middleware/validate';
import { loadRideTrace } from './ride-trace.service';
import { createSubmission } from './submissions.service';
import { canSeeSubmission, presentMySubmission, presentSubmission } from './submission.presenter';
import * as submissions from './submissions.repository';
import { idNumber } from '@shared/schemas/fields';

const idParams = z.object({ id: idNumber('not a submission number') });

function parseMeta(raw: unknown) {
  let json: unknown;
  try {
    json = typeof raw === 'string' ? JSON.parse(raw) : undefined;
  } catch {
    json = undefined;
  }
  if (json === undefined) throw new ValidationError('The form data is missing or not valid JSON.', { fields: { meta: 'missing' } });
  const parsed = createSubmissionInput.safeParse(json);
  if (!parsed.success) {
    const fields = Object.fromEntries(parsed.error.issues.map((i) => [i.path.join('.'), i.message]));
    throw new ValidationError(formatZodError(parsed.error), { fields });
  }
  return parsed.data;
}

export function submissionsRouter(deps: { db: Db; queue?: Queue; config: Config; store: ObjectStore }) {
  const { db } = deps;
  const router = Router();

  router.post('/', requireUser, fitUpload, async (req, res) => {
    const input = parseMeta(req.body?.meta);
    const fileA = uploadedFile(req, 'fileA');
    const fileB = uploadedFile(req, 'fileB');
    if (!fileA || !fileB) {
      const fields = {
        ...(!fileA && { fileA: 'choose the first FIT file (A)' }),
        ...(!fileB && { fileB: 'choose the second FIT file (B)' }),
      };
      throw new ValidationError('Upload exactly two FIT files: the first (A) and the second (B).', { fields });
    }
    const { id } = await createSubmission(
      { db, queue: deps.queue, store: deps.store, submissionsPerDay: deps.config.SUBMISSIONS_PER_DAY },
      req.user!.id,
      input,
      {
        a: { buffer: fileA.buffer, originalName: fileA.originalname },
        b: { buffer: fileB.buffer, originalName: fileB.originalname },
      },
    );
    res.status(201).json({ id, status: 'received', url: `/submissions/${id}` } satisfies CreatedSubmission);
  });

  router.get('/:id', validate(idParams, 'params'), async (req, res) => {
    const submission = await submissions.findSubmission(db, res.locals.params.id);
    if (!submission || !canSeeSubmission(req.user, submission)) throw new NotFoundError('No such submission, or it is not public yet.');
    res.json(presentSubmission(submission, req.user));
  });

  router.get('/:id/trace', validate(idParams, 'params'), async (req, res) => {
    res.json(await loadRideTrace(db, res.locals.params.id, req.user));
  });

  return router;
}

export function mySubmissionsRouter(deps: { db: Db }) {
  const router = Router();
  router.get('/', requireUser, async (req, res) => {
    const rows = await submissions.listByRider(deps.db, req.user!.id);
    res.json({ submissions: rows.map(presentMySubmission) });
  });
  return router;
}
