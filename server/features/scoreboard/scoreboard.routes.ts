import { type Response, Router } from 'express';
import * as method from '@shared/analysis/method';
import { firmwareParams, modelParams, OPEN_DATA_LICENCE, scoreboardCsvQuery, scoreboardQuery } from '@shared/schemas/statistics';
import { MINIMUM_PARTNERS } from '@shared/statistics/consensus';
import { MINIMUM_RIDERS, MINIMUM_SUBMISSIONS } from '@shared/statistics/minimum-evidence';
import { WEIGHT_CAP_HOURS } from '@shared/statistics/weighted-bias';
import type { Db } from '../../db/knex';
import type { Queue } from '../../jobs/queue';
import { NotFoundError } from '../../lib/errors';
import { validate } from '../../middleware/validate';
import { scoreboardCsv, writeSubmissionsCsv } from './open-data';
import { createPageCache, type KeptPage } from './page-cache';
import { findMergedFirmwareTarget, findMergedModelTarget } from './scoreboard.repository';
import { getFirmwarePage, getModelPage, getScoreboard } from './scoreboard.service';

// Public, read-only: the scoreboard, model and firmware pages, the method's
// parameters and the open data. Mounted at /api.
export function scoreboardRouter({ db, queue }: { db: Db; queue?: Queue }) {
  const router = Router();
  const licenceHeader = `<${OPEN_DATA_LICENCE.url}>; rel="license"`;
  // Between two changes every shopper sees the same pages: answer them from memory.
  const pages = createPageCache(db, { queue });
  // The entity tag is set beforehand, so Express neither hashes the body again nor sends it to a client that has it (304).
  const sendJson = (res: Response, page: KeptPage) => res.type('json').set('ETag', page.etag).send(page.body);

  router.get('/scoreboard', validate(scoreboardQuery, 'query'), async (_req, res) => {
    const query = res.locals.query;
    sendJson(res, await pages.get(`scoreboard ${JSON.stringify(query)}`, async () => JSON.stringify(await getScoreboard(db, query))));
  });

  router.get('/scoreboard.csv', validate(scoreboardCsvQuery, 'query'), async (_req, res) => {
    const query = res.locals.query;
    const csv = await pages.get(`scoreboard.csv ${JSON.stringify(query)}`, () => scoreboardCsv(db, query));
    res.set({
      'Content-Type': 'text/csv; charset=utf-8',
      'Content-Disposition': 'attachment; filename="crosswatt-scoreboard.csv"',
      Link: licenceHeader,
      ETag: csv.etag,
    });
    res.send(csv.body);
  });

  router.get('/submissions.csv', async (_req, res) => {
    res.set({
      'Content-Type': 'text/csv; charset=utf-8',
      'Content-Disposition': 'attachment; filename="crosswatt-submissions.csv"',
      Link: licenceHeader,
    });
    await writeSubmissionsCsv(db, (chunk) => res.write(chunk));
    res.end();
  });

  router.get('/models/:slug', validate(modelParams, 'params'), async (_req, res) => {
    const { slug } = res.locals.params;
    const page = await pages
      .get(`model ${slug}`, async () => JSON.stringify(await getModelPage(db, slug)))
      .catch(async (error) => {
        const kept = error instanceof NotFoundError ? await findMergedModelTarget(db, slug) : undefined;
        if (!kept) throw error;
        return kept;
      });
    // A merged model's old address leads to the model it became.
    if (typeof page === 'string') return res.redirect(308, `/api/models/${encodeURIComponent(page)}`);
    sendJson(res, page);
  });

  router.get('/models/:slug/firmware/:version', validate(firmwareParams, 'params'), async (_req, res) => {
    const { slug, version } = res.locals.params;
    const page = await pages
      .get(`firmware ${slug} ${version}`, async () => JSON.stringify(await getFirmwarePage(db, slug, version)))
      .catch(async (error) => {
        const kept = error instanceof NotFoundError ? await findMergedFirmwareTarget(db, slug, version) : undefined;
        if (!kept) throw error;
        return kept;
      });
    if ('slug' in page)
      return res.redirect(308, `/api/models/${encodeURIComponent(page.slug)}/firmware/${encodeURIComponent(page.version)}`);
    sendJson(res, page);
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
