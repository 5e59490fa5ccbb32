import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { analyseSubmission } from '../../../server/features/submissions/analyse-submission.job';
import { createSubmission } from '../../../server/features/submissions/submissions.service';
import { sectionFigures } from '../../../shared/analysis/section-figures';
import { rideTraceResponse } from '../../../shared/schemas/ride-trace';
import { createSubmissionInput } from '../../../shared/schemas/submission';
import { createCatalogue, submissionMeta, type TestCatalogue } from '../support/catalogue-factory';
import { signedInAgent, type TestAgent } from '../support/sign-in';
import { createTestContext } from '../support/test-app';
import { asBuffer, cleanPair } from './fit-pairs';
import { testObjectStore } from '../../support/test-object-store';

const { app, db } = await createTestContext({ fakes: true });

let catalogue: TestCatalogue;
let rider: { agent: TestAgent; user: { id: number } };

beforeAll(async () => {
  catalogue = await createCatalogue(db);
  rider = await signedInAgent(app, { handle: 'trace-rider' });
});

async function analysedSubmission(seed: number) {
  const pair = cleanPair(seed);
  const { id } = await createSubmission(
    { db, store: testObjectStore() },
    rider.user.id,
    createSubmissionInput.parse(submissionMeta(catalogue)),
    {
      a: { buffer: asBuffer(pair.a), originalName: 'a.fit' },
      b: { buffer: asBuffer(pair.b), originalName: 'b.fit' },
    },
  );
  await analyseSubmission(db, id);
  return id;
}

describe('GET /api/submissions/:id/trace', () => {
  it('when the rider asks for an analysed ride, then both traces come aligned and the whole-ride section is the headline bias', async () => {
    const id = await analysedSubmission(31);
    const submission = await rider.agent.get(`/api/submissions/${id}`);

    const res = await rider.agent.get(`/api/submissions/${id}/trace`);

    expect(res.status).toBe(200);
    const trace = rideTraceResponse.parse(res.body);
    expect(Object.keys(res.body).sort()).toEqual(Object.keys(rideTraceResponse.shape).sort());
    expect(trace.length).toBeGreaterThanOrEqual(submission.body.result.alignment.overlapSeconds);
    expect(trace.aPower).toHaveLength(trace.length);
    const whole = sectionFigures(trace, 0, trace.length);
    expect(whole.matchedSeconds).toBe(submission.body.result.bias.matchedSeconds);
    expect(whole.differencePercent!).toBeCloseTo(submission.body.result.bias.percent, 1);
  });

  it('when someone else asks for a ride not yet accepted, then it is not found and shows nothing', async () => {
    const id = await analysedSubmission(32);

    const res = await request(app).get(`/api/submissions/${id}/trace`);

    expect(res.status).toBe(404);
    expect(res.body.error.code).toBe('not_found');
    expect(res.body.aPower).toBeUndefined();
  });

  it('when the id is not a number, then the answer is a 400 with a message', async () => {
    const res = await rider.agent.get('/api/submissions/abc/trace');

    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/id/);
  });
});
