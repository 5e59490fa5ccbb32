import { Router } from 'express';
import { type StartReanalysisInput, startReanalysisInput } from '@shared/schemas/reanalysis';
import { requireRole } from '../../auth/require-user';
import type { Db } from '../../db/knex';
import type { Queue } from '../../jobs/queue';
import { validate } from '../../middleware/validate';
import { getReanalysisOverview, startReanalysis } from './reanalysis.service';

// Admins start a re-analysis of every stored ride with the current method and watch its progress.
export function reanalysisRouter({ db, queue }: { db: Db; queue?: Queue }) {
  const router = Router();
  const admin = requireRole('admin');

  router.get('/', admin, async (_req, res) => {
    res.json(await getReanalysisOverview(db));
  });

  router.post('/', admin, validate(startReanalysisInput), async (req, res) => {
    const { source } = res.locals.body as StartReanalysisInput;
    const run = await startReanalysis({ db, queue, logger: req.log }, { actorId: req.user!.id, source });
    res.status(202).json({ run });
  });
  return router;
}
