import { Router } from 'express';
import * as method from '@shared/analysis/method';
import { firmwareParams, modelParams, OPEN_DATA_LICENCE, scoreboardCsvQuery, scoreboardQuery } from '@shared/schemas/statistics';
import { MINIMUM_PARTNERS } from '@shared/statistics/consensus';
import { MINIMUM_RIDERS, MINIMUM_SUBMISSIONS } from '@shared/statistics/minimum-evidence';
import { WEIGHT_CAP_HOURS } from '@shared/statistics/weighted-bias';
import type { Db } from '../../db/knex';
import { validate } from '../../middleware/validate';
import { scoreboardCsv, writeSubmissionsCsv } from './open-data';
import { getFirmwarePage, getModelPage, getScoreboard } from './scoreboard.service';

// Public, read-only: the scoreboard, model and firmware pages, the method's
// parameters and the open data. Mounted at /api.
export function scoreboardRouter({ db }: { db: Db }) {
  const router = Router();
  const licenceHeader = `<${OPEN_DATA_LICENCE.url}>; rel="license"`;

  router.get('/scoreboard', validate(scoreboardQuery, 'query'), async (_req, res) => {
    res.json(await getScoreboard(db, res.locals.query));
  });

  router.get('/scoreboard.csv', validate(scoreboardCsvQuery, 'query'), async (_req, res) => {
    const csv = await scoreboardCsv(db, res.locals.query);
    res.set({ 'Content-Type': 'text/csv; charset=utf-8', 'Content-Disposition': 'attachment; filename="crosswatt-scoreboard.csv"', Link: licenceHeader });
    res.send(csv);
  });

  router.get('/submissions.csv', async (_req, res) => {
    res.set({ 'Content-Type': 'text/csv; charset=utf-8', 'Content-Disposition': 'attachment; filename="crosswatt-submissions.csv"', Link: licenceHeader });
    await writeSubmissionsCsv(db, (chunk) => res.write(chunk));
    res.end();
  });

  router.get('/models/:slug', validate(modelParams, 'params'), async (_req, res) => {
    res.json(await getModelPage(db, res.locals.params.slug));
  });

  router.get('/models/:slug/firmware/:version', validate(firmwareParams, 'params'), async (_req, res) => {
    res.json(await getFirmwarePage(db, res.locals.params.slug, res.locals.params.version));
  });

  router.get('/methodology', (_req, res) => {
    res.json({
      methodVersion: method.METHOD_VERSION,
      parameters: {
        blockSeconds: method.BLOCK_SECONDS,
        limitsOfAgreementZ: method.LIMITS_OF_AGREEMENT_Z,
        maxCarrySeconds: method.MAX_CARRY_SECONDS,
        maxClockOffsetSeconds: method.MAX_CLOCK_OFFSET_SECONDS,
        minOverlapSeconds: method.MIN_OVERLAP_SECONDS,
        maxCadenceLagSeconds: method.MAX_CADENCE_LAG_SECONDS,
      },
      minimumEvidence: { submissions: MINIMUM_SUBMISSIONS, riders: MINIMUM_RIDERS },
      weightCapHours: WEIGHT_CAP_HOURS,
      consensusMinimumPartners: MINIMUM_PARTNERS,
      confidence: 0.95,
      licence: OPEN_DATA_LICENCE,
    });
  });

  return router;
}
