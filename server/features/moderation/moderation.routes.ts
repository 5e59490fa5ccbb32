import { Router } from 'express';
import { z } from 'zod';
import { correctTagsInput, decideSubmissionInput, resubmitTagsInput, reviewQueueQuery } from '@shared/schemas/moderation';
import { requireRole, requireUser } from '../../auth/require-user';
import type { Config } from '../../config/env';
import type { Db } from '../../db/knex';
import type { Queue } from '../../jobs/queue';
import { NotFoundError } from '../../lib/errors';
import { validate } from '../../middleware/validate';
import { enqueueAnalysis } from '../submissions/analyse-submission.job';
import { canSeeSubmission } from '../submissions/submission.presenter';
import { curationRouter } from './curation.routes';
import * as moderation from './moderation.repository';
import { correctSubmissionTags, decideSubmission, resubmitTags, type TagChangeOutcome } from './moderation.service';
import { decisionOf, getReview } from './review.service';

const idParams = z.object({ id: z.coerce.number().int().positive('not a submission number') });

interface Deps {
  db: Db;
  config: Config;
  queue?: Queue;
}

async function afterTagChange(deps: Deps, outcome: TagChangeOutcome) {
  if (outcome.reanalyse && deps.queue) await enqueueAnalysis(deps.queue, outcome.id);
}

/** The review queue and the decisions: moderators only. */
export function moderationRouter(deps: Deps) {
  const { db } = deps;
  const router = Router();
  const moderatorOnly = requireRole('moderator');

  router.get('/queue', moderatorOnly, validate(reviewQueueQuery, 'query'), async (_req, res) => {
    const [{ total, rows }, flagCounts] = await Promise.all([
      moderation.listReviewQueue(db, res.locals.query),
      moderation.queueFlagCounts(db),
    ]);
    res.json({ total, pageSize: moderation.QUEUE_PAGE_SIZE, submissions: rows, flagCounts });
  });

  router.get('/submissions/:id', moderatorOnly, validate(idParams, 'params'), async (req, res) => {
    res.json(await getReview(db, res.locals.params.id, req.user!));
  });

  router.post(
    '/submissions/:id/decision',
    moderatorOnly,
    validate(idParams, 'params'),
    validate(decideSubmissionInput),
    async (req, res) => {
      const input = res.locals.body;
      const outcome = await decideSubmission(
        db,
        {
          submissionId: res.locals.params.id,
          moderatorId: req.user!.id,
          decision: input.decision,
          reason: 'reason' in input ? input.reason : null,
          note: 'note' in input ? input.note || null : null,
          expectedVersion: input.expectedVersion,
        },
        { config: deps.config, queue: deps.queue },
      );
      res.json({ id: outcome.id, status: outcome.status, version: outcome.version });
    },
  );

  router.post('/submissions/:id/tags', moderatorOnly, validate(idParams, 'params'), validate(correctTagsInput), async (req, res) => {
    const outcome = await correctSubmissionTags(db, { submissionId: res.locals.params.id, moderatorId: req.user!.id, ...res.locals.body });
    await afterTagChange(deps, outcome);
    res.json(outcome);
  });

  router.use('/catalogue', curationRouter({ db }));

  return router;
}

/** Mounted beside the submissions router: the decision as the rider sees it, and the rider's correction. */
export function submissionDecisionRouter(deps: Deps) {
  const { db } = deps;
  const router = Router();

  router.get('/:id/decision', validate(idParams, 'params'), async (req, res) => {
    const row = await moderation.findDecision(db, res.locals.params.id);
    if (!row || !canSeeSubmission(req.user, row)) throw new NotFoundError('No such submission, or it is not public yet.');
    res.json({ id: row.id, status: row.status, version: row.version, decision: decisionOf(row) });
  });

  router.patch('/:id/tags', requireUser, validate(idParams, 'params'), validate(resubmitTagsInput), async (req, res) => {
    const outcome = await resubmitTags(db, { submissionId: res.locals.params.id, riderId: req.user!.id, ...res.locals.body });
    await afterTagChange(deps, outcome);
    res.json(outcome);
  });

  return router;
}
