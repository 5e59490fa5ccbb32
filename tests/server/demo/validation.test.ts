// Known-truth validation: the full demo world (seed 2026, about 436 submissions)
// goes through the real pipeline once, in this file's own database; then the
// public API must give back what the simulator injected. The full world rather
// than a fraction: the coverage statement is about the ~50 model + firmware
// combinations the demo shows, and a fraction leaves most of them below the
// minimum evidence, so a "90 % of combinations" rate would rest on a handful.
import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import type { FirmwareSummary, ModelPage } from '@shared/schemas/statistics';
import { simulatePair } from '@shared/simulator/pair';
import { slugify } from '@shared/schemas/catalogue';
import { seedDemoWorld, type SeedDemoReport } from '../../../seeds/demo-world/seed-demo';
import { isLikeForLike, worldModel, type PlannedSubmission } from '../../../seeds/demo-world/plan';
import { injectedTruth, type CombinationTruth } from '../../../seeds/demo-world/truth';
import { MODELS } from '../../../seeds/demo-world/world';
import { createTestContext } from '../support/test-app';

const { app, db, config } = await createTestContext();

const NOW = Date.UTC(2026, 10, 15, 12) / 1000;
const SEED = 2026;

interface Combination {
  truth: CombinationTruth;
  /** Expected bias against its partners from the firmware's injected gains alone (see nominalBiasAgainstPartners). */
  nominalBiasPercent: number | null;
  reported: FirmwareSummary;
}

let report: SeedDemoReport;
let combinations: Combination[];

beforeAll(async () => {
  report = await seedDemoWorld({ db, now: NOW, seed: SEED, config });
  const truth = injectedTruth(report.plan);
  const nominal = nominalBiasAgainstPartners(report.plan, truth);
  combinations = [];
  for (const model of MODELS) {
    const res = await request(app).get(`/api/models/${slugify(model.name)}`);
    expect(res.status).toBe(200);
    for (const reported of (res.body as ModelPage).firmware) {
      const entry = truth.find((t) => t.model === model.name && t.firmware === reported.version)!;
      combinations.push({ truth: entry, nominalBiasPercent: nominal.get(`${model.name}@${reported.version}`) ?? null, reported });
    }
  }
}, 180_000);

/**
 * The expected mean of a combination's like-for-like comparisons if every meter
 * read exactly its firmware's injected gain: weighted by ride time, as the
 * statistics weight by pedalling hours (every demo ride is under the 4 h cap).
 * Unlike truth.ts's figure it leaves out each ride's zero-offset wander, which is
 * mean-zero noise the interval has to cover, not part of the truth.
 */
function nominalBiasAgainstPartners(plan: PlannedSubmission[], truth: CombinationTruth[]): Map<string, number> {
  const gain = new Map(truth.map((t) => [`${t.model}@${t.firmware}`, 1 + t.measuredBiasPercent / 100]));
  const sums = new Map<string, { weighted: number; hours: number }>();
  for (const planned of plan) {
    if (planned.outcome.decision !== 'accept' || planned.flaw) continue;
    if (!isLikeForLike(worldModel(planned.a.model), worldModel(planned.b.model))) continue;
    const hours = planned.simulation.durationSeconds / 3600;
    for (const [self, partner] of [
      [planned.a, planned.b],
      [planned.b, planned.a],
    ]) {
      const key = `${self.model}@${self.firmware}`;
      // The cold is part of what a meter reads on the ride (a model whose compensation falls short reads low in winter).
      const ratio = (gain.get(key)! * self.coldGain) / (gain.get(`${partner.model}@${partner.firmware}`)! * partner.coldGain);
      const entry = sums.get(key) ?? { weighted: 0, hours: 0 };
      entry.weighted += 100 * (ratio - 1) * hours;
      entry.hours += hours;
      sums.set(key, entry);
    }
  }
  return new Map([...sums].map(([key, { weighted, hours }]) => [key, weighted / hours]));
}

const within = (value: number | null | undefined, lower: number, upper: number) =>
  value !== null && value !== undefined && value >= lower && value <= upper;

/** Spearman's rank correlation with average ranks for ties (the injected order has ties: firmware that kept its model's bias). */
function spearman(x: number[], y: number[]): number {
  const ranks = (values: number[]) => {
    const order = values.map((v, i) => [v, i] as const).sort((p, q) => p[0] - q[0]);
    const result = new Array<number>(values.length);
    for (let i = 0; i < order.length; ) {
      let j = i;
      while (j + 1 < order.length && order[j + 1][0] === order[i][0]) j += 1;
      for (let k = i; k <= j; k++) result[order[k][1]] = (i + j) / 2;
      i = j + 1;
    }
    return result;
  };
  const [rx, ry] = [ranks(x), ranks(y)];
  const mean = (v: number[]) => v.reduce((s, e) => s + e, 0) / v.length;
  const [mx, my] = [mean(rx), mean(ry)];
  let sxy = 0;
  let sxx = 0;
  let syy = 0;
  for (let i = 0; i < rx.length; i++) {
    sxy += (rx[i] - mx) * (ry[i] - my);
    sxx += (rx[i] - mx) ** 2;
    syy += (ry[i] - my) ** 2;
  }
  return sxy / Math.sqrt(sxx * syy);
}

const describeMiss = (c: Combination, truth: number | null, interval: object | null) =>
  `${c.truth.model} ${c.truth.firmware}: injected ${truth?.toFixed(2)}, reported ${JSON.stringify(interval)}`;

// Measured on this seed (2026-11-15, seed 2026): 49 of 53 combinations have enough
// evidence; bias intervals cover 48 of 49, power dropout intervals 46, cadence 47;
// 48 combinations have a consensus offset, Spearman 0.97 against the injected order.
describe('known-truth validation over the demo world', () => {
  it('when the demo world is seeded, then every ride went through the pipeline and most combinations have enough evidence', () => {
    const enough = combinations.filter((c) => c.reported.figures.enough);

    expect(report.seeded).toBe(true);
    expect(report.failed).toBe(0);
    expect(enough.length).toBeGreaterThanOrEqual(40);
  });

  // 95 % intervals miss about one time in twenty; over ~49 combinations, 90 % leaves
  // room for four misses where five percent of 49 expects between two and three.
  it('when the bias intervals are read, then at least 90 % of combinations with enough evidence contain the injected bias against their partners', () => {
    const judged = combinations.filter((c) => c.reported.figures.enough && c.reported.figures.bias && c.nominalBiasPercent !== null);
    const missed = judged.filter(
      (c) => !within(c.nominalBiasPercent, c.reported.figures.bias!.lowerPercent, c.reported.figures.bias!.upperPercent),
    );

    expect(judged.length).toBeGreaterThanOrEqual(40);
    expect(
      1 - missed.length / judged.length,
      missed.map((c) => describeMiss(c, c.nominalBiasPercent, c.reported.figures.bias)).join('\n'),
    ).toBeGreaterThanOrEqual(0.9);
  });

  it('when the dropout-rate intervals are read, then at least 90 % of combinations with enough evidence contain the injected power and cadence rates', () => {
    const judged = combinations.filter(
      (c) => c.reported.figures.enough && c.reported.figures.powerDropouts && c.reported.figures.cadenceDropouts,
    );
    const missedPower = judged.filter(
      (c) => !within(c.truth.powerDropoutsPerHour, c.reported.figures.powerDropouts!.lower, c.reported.figures.powerDropouts!.upper),
    );
    const missedCadence = judged.filter(
      (c) => !within(c.truth.cadenceDropoutsPerHour, c.reported.figures.cadenceDropouts!.lower, c.reported.figures.cadenceDropouts!.upper),
    );

    expect(judged.length).toBeGreaterThanOrEqual(40);
    expect(
      1 - missedPower.length / judged.length,
      missedPower.map((c) => describeMiss(c, c.truth.powerDropoutsPerHour, c.reported.figures.powerDropouts)).join('\n'),
    ).toBeGreaterThanOrEqual(0.9);
    expect(
      1 - missedCadence.length / judged.length,
      missedCadence.map((c) => describeMiss(c, c.truth.cadenceDropoutsPerHour, c.reported.figures.cadenceDropouts)).join('\n'),
    ).toBeGreaterThanOrEqual(0.9);
  });

  // Injected offsets run from −3.5 % (trainers, which read after the chain) to +2.6 %,
  // and many firmware versions share their model's bias, so the injected order has
  // ties that the reported offsets break at random: a rank correlation, not an exact
  // order. Two combinations injected more than three combined standard errors apart
  // (each error read off its reported 95 % interval) are clearly separated: they
  // swap with a probability of about 0.1 %, so they must come out in order exactly.
  it('when the consensus offsets are read, then they rank the combinations in the injected order', () => {
    const ranked = combinations.filter((c) => c.reported.consensus && c.truth.crowdOffsetPercent !== null);
    const injected = ranked.map((c) => c.truth.crowdOffsetPercent!);
    const reported = ranked.map((c) => c.reported.consensus!.offsetPercent);
    const standardError = ranked.map(
      ({ reported: { consensus } }) => ((consensus!.upperPercent ?? Infinity) - (consensus!.lowerPercent ?? -Infinity)) / (2 * 1.96),
    );
    const name = (c: Combination) => `${c.truth.model} ${c.truth.firmware}`;
    let separated = 0;
    const swapped: string[] = [];
    for (let i = 0; i < ranked.length; i++) {
      for (let j = 0; j < ranked.length; j++) {
        if (injected[i] - injected[j] <= 3 * Math.hypot(standardError[i], standardError[j])) continue;
        separated += 1;
        if (reported[i] <= reported[j]) swapped.push(`${name(ranked[i])} above ${name(ranked[j])}`);
      }
    }

    expect(ranked.length).toBeGreaterThanOrEqual(40);
    expect(spearman(injected, reported)).toBeGreaterThanOrEqual(0.9);
    // 497 pairs once the minimum evidence became 3 riders (issue 15): fewer combinations show an offset.
    expect(separated).toBeGreaterThan(450);
    expect(swapped).toEqual([]);
  });

  // Every accepted pair of the world, read back over the API, against the truth the
  // simulator reports for it. Tolerances:
  // - bias 0.3 points: the truth is the ride's own gain ratio, so only the meters'
  //   noise (1–2 % per second) is left, which averages to < 0.1 point over 25–75 min;
  // - clock offset 0.5 s: method 2 models the head units' averaging while aligning, so it
  //   reports the clocks' own offset (not offset plus smoothing delay) on whole seconds;
  // - cadence lag 1 s: method 2 estimates it from cadence alone, so smoothing of power
  //   no longer enters it; the second is for change-only recording;
  // - dropouts exact: the simulator places each event where the analysis must see it.
  // Not every pair makes it: change-only recording repeats readings and leaves gaps the
  // engine may read as a dropout or a shifted cadence, and one steady ride (ride 334)
  // aligns 5.5 s off. Hence shares, with the misses named in the failure message:
  // method 1 measured 1 bias, 3 offset, 5 cadence-lag and 2 dropout misses of 410 pairs;
  // method 2 measures 0 bias, 20 offset (1–2 s, pairs with change-only recording), 9
  // cadence-lag and 0 dropout misses. The offset share is an open item of method 2.
  it('when every accepted pair is read back, then nearly all recover their injected bias, clock offset, cadence lag and dropout counts', async () => {
    const accepted = report.plan.filter((p) => p.outcome.decision === 'accept' && !p.flaw);
    const misses = { bias: [] as string[], offset: [] as string[], lag: [] as string[], dropouts: [] as string[] };
    let worstBias = 0;
    for (const planned of accepted) {
      const { truth } = simulatePair(planned.simulation);
      const res = await request(app).get(`/api/submissions/${report.submissionIds[planned.index]}`);
      expect(res.status).toBe(200);
      const result = res.body.result;
      const label = `ride ${planned.index} (${planned.a.model} on ${planned.a.device}, ${planned.a.recordingMode} / ${planned.b.model} on ${planned.b.device}, ${planned.b.recordingMode})`;
      const biasError = Math.abs(result.bias.percent - truth.instrumentBiasPercent);
      worstBias = Math.max(worstBias, biasError);
      if (biasError > 0.3) misses.bias.push(`${label}: ${result.bias.percent} vs ${truth.instrumentBiasPercent}`);
      if (Math.abs(result.alignment.clockOffsetSeconds - truth.clockOffsetSeconds) > 0.5)
        misses.offset.push(`${label}: ${result.alignment.clockOffsetSeconds} vs ${truth.clockOffsetSeconds}`);
      if (result.cadenceLagSeconds === null || Math.abs(result.cadenceLagSeconds - truth.cadenceLagSeconds) > 1)
        misses.lag.push(`${label}: ${result.cadenceLagSeconds} vs ${truth.cadenceLagSeconds}`);
      const counted = [
        result.dropouts.a.power.count,
        result.dropouts.b.power.count,
        result.dropouts.a.cadence.count,
        result.dropouts.b.cadence.count,
      ];
      const injected = [truth.dropouts.a.power, truth.dropouts.b.power, truth.dropouts.a.cadence, truth.dropouts.b.cadence];
      if (counted.some((n: number, i: number) => n !== injected[i])) misses.dropouts.push(`${label}: ${counted} vs ${injected}`);
    }
    const share = (list: string[]) => 1 - list.length / accepted.length;

    expect(accepted.length).toBeGreaterThanOrEqual(400);
    // The seed test's per-ride bound: even a misaligned ride stays inside it.
    expect(worstBias).toBeLessThan(1);
    expect(share(misses.bias), misses.bias.join('\n')).toBeGreaterThanOrEqual(0.99);
    expect(share(misses.offset), misses.offset.join('\n')).toBeGreaterThanOrEqual(0.95);
    expect(share(misses.lag), misses.lag.join('\n')).toBeGreaterThanOrEqual(0.97);
    expect(share(misses.dropouts), misses.dropouts.join('\n')).toBeGreaterThanOrEqual(0.99);
  });

  it("when the demo's threads are read, then riders' reports link accepted rides that show the problem and the maker's answer is on top", async () => {
    const list = await request(app).get('/api/models/larkspur-duo/threads');
    const thread = await request(app).get(`/api/threads/${list.body.threads[0].id}`);
    const [opening] = thread.body.posts;
    const linked = await Promise.all(opening.linkedSubmissions.map((s: { id: number }) => request(app).get(`/api/submissions/${s.id}`)));
    const larkspurCadenceDropouts = linked.map(({ body }) => {
      const side = body.recordings.find((r: { modelSlug: string }) => r.modelSlug === 'larkspur-duo');
      return body.result.dropouts[side.side].cadence.count;
    });

    expect(thread.body).toMatchObject({ title: 'Cadence drops out on gravel since 1.1', status: 'fixed', fixedIn: { version: '1.4' } });
    expect(thread.body.officialResponse.staffOf.name).toBe('Quillon Dynamics');
    expect(opening.linkedSubmissions).toHaveLength(2);
    for (const count of larkspurCadenceDropouts) expect(count).toBeGreaterThan(0);
  });
});

describe('the cold story', () => {
  it('when the model whose compensation falls short in the cold is ridden in winter, then its coldest band reads lower than its warm band, with the rider as the unit', async () => {
    const story = MODELS.find((m) => m.coldResponse)!;
    const { body } = await request(app).get(`/api/models/${slugify(story.name)}/conditions`);

    const band = (label: string) => body.temperature.all.find((b: { band: string }) => b.band === label);
    const cold = band('below 5 °C');
    const warm = band('15 to 25 °C');
    expect(cold.riders).toBeGreaterThanOrEqual(3);
    // world.ts: 0.4 % per °C below 8 °C, so about −1.5 to −3 % below 5 °C; nothing above 8 °C.
    expect(cold.meanPercent - warm.meanPercent).toBeLessThan(-1);
    expect(cold.upperPercent).toBeLessThan(warm.meanPercent);
  });
});
