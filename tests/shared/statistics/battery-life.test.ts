import { describe, expect, it } from 'vitest';
import { batteryLife, batteryLifeByFirmware, batteryPeriods, biasByTemperature, MIN_BATTERIES } from '@shared/statistics/battery-life';
import { holmAdjust } from '@shared/statistics/multiple-comparisons';
import { clusteredLogRankTest, type ClusteredObservation } from '@shared/statistics/survival';
import { simulateBatteryCrowd, type BatteryCrowdOptions } from '@shared/simulator/battery-crowd';

// survival::rats, the female rats (Mantel, Bohidar & Ciminera, Cancer Research 1977): litter is the
// cluster. Printed by tests/shared/statistics/reference/clustered-logrank-rats.R.
const litter = [
  1, 1, 1, 3, 3, 3, 5, 5, 5, 7, 7, 7, 9, 9, 9, 11, 11, 11, 13, 13, 13, 15, 15, 15, 17, 17, 17, 19, 19, 19, 21, 21, 21, 23, 23, 23, 25, 25,
  25, 27, 27, 27, 29, 29, 29, 31, 31, 31, 33, 33, 33, 35, 35, 35, 37, 37, 37, 39, 39, 39, 41, 41, 41, 43, 43, 43, 45, 45, 45, 47, 47, 47,
  49, 49, 49, 51, 51, 51, 53, 53, 53, 55, 55, 55, 57, 57, 57, 59, 59, 59, 61, 61, 61, 63, 63, 63, 65, 65, 65, 67, 67, 67, 69, 69, 69, 71,
  71, 71, 73, 73, 73, 75, 75, 75, 77, 77, 77, 79, 79, 79, 81, 81, 81, 83, 83, 83, 85, 85, 85, 87, 87, 87, 89, 89, 89, 91, 91, 91, 93, 93,
  93, 95, 95, 95, 97, 97, 97, 99, 99, 99,
];
const rx = [
  1, 0, 0, 1, 0, 0, 1, 0, 0, 1, 0, 0, 1, 0, 0, 1, 0, 0, 1, 0, 0, 1, 0, 0, 1, 0, 0, 1, 0, 0, 1, 0, 0, 1, 0, 0, 1, 0, 0, 1, 0, 0, 1, 0, 0, 1,
  0, 0, 1, 0, 0, 1, 0, 0, 1, 0, 0, 1, 0, 0, 1, 0, 0, 1, 0, 0, 1, 0, 0, 1, 0, 0, 1, 0, 0, 1, 0, 0, 1, 0, 0, 1, 0, 0, 1, 0, 0, 1, 0, 0, 1, 0,
  0, 1, 0, 0, 1, 0, 0, 1, 0, 0, 1, 0, 0, 1, 0, 0, 1, 0, 0, 1, 0, 0, 1, 0, 0, 1, 0, 0, 1, 0, 0, 1, 0, 0, 1, 0, 0, 1, 0, 0, 1, 0, 0, 1, 0, 0,
  1, 0, 0, 1, 0, 0, 1, 0, 0, 1, 0, 0,
];
const time = [
  101, 49, 104, 104, 102, 104, 104, 104, 104, 77, 97, 79, 89, 104, 104, 88, 96, 104, 104, 94, 77, 96, 104, 104, 82, 77, 104, 70, 104, 77,
  89, 91, 90, 91, 70, 92, 39, 45, 50, 103, 69, 91, 93, 104, 103, 85, 72, 104, 104, 63, 104, 104, 104, 74, 81, 104, 69, 67, 104, 68, 104,
  104, 104, 104, 104, 104, 104, 83, 40, 87, 104, 104, 104, 104, 104, 89, 104, 104, 78, 104, 104, 104, 81, 64, 86, 55, 94, 34, 104, 54, 76,
  87, 74, 103, 73, 84, 102, 104, 80, 80, 104, 73, 45, 79, 104, 94, 104, 104, 104, 104, 104, 104, 101, 94, 76, 84, 78, 80, 81, 76, 72, 95,
  104, 73, 104, 66, 92, 104, 102, 104, 98, 73, 55, 104, 104, 49, 83, 77, 89, 104, 104, 88, 79, 99, 103, 91, 104, 104, 104, 79,
];
const status = [
  0, 1, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 1, 1, 0, 1, 0, 1, 1, 0, 0, 0, 0, 0, 1, 0, 0, 1, 0, 0, 0, 0, 0, 1, 0, 1, 1, 0, 0, 0, 0, 0, 0,
  0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 1, 0, 1, 0, 0, 0, 0, 0, 0, 0, 0, 1, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 1, 1, 1, 1, 0, 1, 0, 1, 0, 0,
  0, 1, 1, 1, 1, 0, 0, 1, 0, 0, 1, 0, 0, 1, 0, 0, 0, 0, 0, 0, 1, 0, 0, 1, 1, 1, 1, 0, 1, 0, 0, 1, 0, 1, 1, 0, 1, 0, 0, 0, 0, 0, 0, 0, 0, 0,
  1, 0, 0, 0, 0, 0, 1, 0, 0, 0, 0, 1,
];

describe('clusteredLogRankTest', () => {
  it('when litters are the clusters, then it matches R coxph(... + cluster(litter), ties = "breslow")$robscore', () => {
    const rats: (ClusteredObservation & { rx: number })[] = time.map((t, i) => ({
      time: t,
      event: status[i] === 1,
      cluster: litter[i]!,
      rx: rx[i]!,
    }));
    const test = clusteredLogRankTest(
      rats.filter((r) => r.rx === 0),
      rats.filter((r) => r.rx === 1),
    );
    // Values from clustered-logrank-rats.R (R 4.x, survival package).
    expect(test.score).toBeCloseTo(8.5482627712, 8);
    expect(test.robustVariance).toBeCloseTo(9.5530012098, 8);
    expect(test.chiSquare).toBeCloseTo(7.6491978595, 8);
    expect(test.pValue).toBeCloseTo(0.005679757083, 9);
    expect(test.clusters).toBe(50);
  });
});

describe('holmAdjust', () => {
  it('when given p-values, then it matches R p.adjust(p, "holm") and leaves untested entries out', () => {
    // clustered-logrank-rats.R: p.adjust(c(0.01, 0.04, 0.03, 0.005), "holm") = 0.03 0.06 0.06 0.02
    const adjusted = holmAdjust([0.01, 0.04, null, 0.03, 0.005]);
    expect(adjusted[2]).toBeNull();
    [0.03, 0.06, 0.06, 0.02].forEach((v, i) => {
      expect(adjusted[[0, 1, 3, 4][i]!]).toBeCloseTo(v, 12);
    });
    // p.adjust(c(0.2, 0.5), "holm") = 0.4 0.5
    expect(holmAdjust([0.2, 0.5])).toEqual([0.4, 0.5]);
  });
});

describe('batteryPeriods', () => {
  it('when a meter logs three batteries, then the one before a flat change ended, an early change is censored and the last still runs', () => {
    const periods = batteryPeriods([
      { occurredOn: '2026-05-01', previousEnded: 'replaced_early', firmwareId: 2 },
      { occurredOn: '2026-01-10', previousEnded: 'first_battery', firmwareId: 1 },
      { occurredOn: '2026-03-02', previousEnded: 'ran_flat', firmwareId: 1 },
    ]);
    expect(periods).toEqual([
      { fromDay: '2026-01-10', toDay: '2026-03-02', firmwareId: 1, ended: true },
      { fromDay: '2026-03-02', toDay: '2026-05-01', firmwareId: 1, ended: false },
      { fromDay: '2026-05-01', toDay: null, firmwareId: 2, ended: false },
    ]);
  });
});

const crowd = (seed: number, options: Omit<BatteryCrowdOptions, 'shape'>) =>
  simulateBatteryCrowd(seed, { ...options, medianHours: options.medianHours, shape: 1 });

describe('batteryLife', () => {
  it('when fewer than the minimum batteries or riders are logged, then there is no median, only the counts', () => {
    const few = crowd(1, { riders: 2, batteriesPerRider: 4, medianHours: 300, firmwareId: 1 });
    const life = batteryLife(few);
    expect(life.enough).toBe(false);
    expect(life.medianHours).toBeNull();
    expect(life.batteries).toBe(8);
    expect(life.riders).toBe(2);
    expect(MIN_BATTERIES).toBeGreaterThan(1);
  });

  it('when a simulated crowd has a known median, then the interval contains it in most crowds (coverage over 40 crowds)', () => {
    let covered = 0;
    for (let seed = 1; seed <= 40; seed++) {
      const life = batteryLife(crowd(seed, { riders: 12, batteriesPerRider: 3, medianHours: 400, firmwareId: 1 }), seed);
      expect(life.enough).toBe(true);
      if ((life.lowerHours ?? 0) <= 400 && 400 <= (life.upperHours ?? Number.POSITIVE_INFINITY)) covered++;
    }
    // The rider effect makes batteries of one rider alike; a 95 % interval should cover nearly always (binomial: ≥ 34 of 40 is common practice for a 95 % goal).
    expect(covered).toBeGreaterThanOrEqual(34);
  });

  it('when fewer than half of the batteries have run flat, then the median is null and the longest time followed is given', () => {
    // Six riders, two batteries each: only the first rider's two have run flat (at 100 and 150 h), the rest still run at 200–300 h.
    const spans = Array.from({ length: 12 }, (_, i) => ({
      riderId: Math.floor(i / 2),
      firmwareId: 1,
      hours: i < 2 ? 100 + 50 * i : 200 + 10 * i,
      ended: i < 2,
    }));
    const life = batteryLife(spans);
    expect(life.medianHours).toBeNull();
    expect(life.upperHours).toBeNull();
    expect(life.longestFollowedHours).toBe(310);
  });
});

describe('batteryLifeByFirmware', () => {
  const firmware = [
    { id: 1, version: '3.0' },
    { id: 2, version: '3.1' },
    { id: 3, version: '3.2' },
  ];

  it('when battery life halves with one version, then that step reads "run flat sooner" and the unchanged step reads "no clear difference"', () => {
    const spans = [
      ...crowd(11, { riders: 10, batteriesPerRider: 3, medianHours: 400, firmwareId: 1 }),
      ...crowd(12, { riders: 10, batteriesPerRider: 3, medianHours: 400, firmwareId: 2 }),
      ...crowd(13, { riders: 10, batteriesPerRider: 3, medianHours: 150, firmwareId: 3 }),
    ];
    const [first, second, third] = batteryLifeByFirmware(spans, firmware);
    expect(first!.againstPredecessor).toBeNull();
    expect(second!.againstPredecessor!.verdict).toBe('no_clear_difference');
    expect(second!.againstPredecessor!.words).toBe('No clear difference in battery life from 3.0.');
    expect(third!.againstPredecessor!.verdict).toBe('worse');
    expect(third!.againstPredecessor!.words).toBe('Batteries run flat sooner than on 3.1.');
    expect(third!.againstPredecessor!.adjustedPValue!).toBeGreaterThanOrEqual(third!.againstPredecessor!.pValue!);
  });

  it('when nothing differs, then "better" or "worse" comes up in at most about 5 % of simulated model histories', () => {
    let falseVerdicts = 0;
    const histories = 60;
    for (let h = 0; h < histories; h++) {
      const spans = firmware.flatMap((f) =>
        crowd(100 + h * 10 + f.id, { riders: 8, batteriesPerRider: 3, medianHours: 300, firmwareId: f.id }),
      );
      const steps = batteryLifeByFirmware(spans, firmware).slice(1);
      if (steps.some((s) => s.againstPredecessor!.verdict === 'better' || s.againstPredecessor!.verdict === 'worse')) falseVerdicts++;
    }
    // Holm keeps the chance of any false verdict per model near 5 %: allow sampling error (≤ 8 of 60).
    expect(falseVerdicts).toBeLessThanOrEqual(8);
  });
});

describe('biasByTemperature', () => {
  it('when riders have several rides in a band, then the interval is over riders, not rides, and a band with too few riders has none', () => {
    const rides = [
      ...[1, 1, 1, 1].map((riderId) => ({ riderId, band: 'below 5 °C', seconds: 3600, percent: -3 })),
      { riderId: 2, band: 'below 5 °C', seconds: 3600, percent: -1 },
      { riderId: 3, band: 'below 5 °C', seconds: 3600, percent: -2 },
      { riderId: 1, band: '15 to 25 °C', seconds: 1800, percent: 0.5 },
    ];
    const [cold, warm] = biasByTemperature(rides, ['below 5 °C', '15 to 25 °C']);
    // Rider means −3, −1, −2: mean −2, SD 1, t(0.975, 2) = 4.302652730 (R: qt(0.975, 2)), half-width 4.3027 / √3.
    expect(cold!.meanPercent).toBeCloseTo(-2, 12);
    expect(cold!.upperPercent! - cold!.meanPercent!).toBeCloseTo(4.30265273 / Math.sqrt(3), 6);
    expect(cold!.rides).toBe(6);
    expect(cold!.riders).toBe(3);
    expect(warm!.meanPercent).toBeNull();
    expect(warm!.hours).toBeCloseTo(0.5, 12);
  });
});
