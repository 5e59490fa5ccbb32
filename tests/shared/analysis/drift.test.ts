import { describe, expect, it } from 'vitest';
import { biasByTemperatureBand, differenceDrift, driftBlocks, type DriftBlock } from '@shared/analysis/drift';
import { simulatePair } from '@shared/simulator/pair';

const HOUR = 3600;

/** The two recordings of a simulated pair as aligned seconds (no clock offset, every second), and the seconds both read power. */
function alignedPair(options: { seed: number; driftPercentPerHour?: number; durationSeconds?: number }) {
  const { recordings } = simulatePair({
    seed: options.seed,
    durationSeconds: options.durationSeconds ?? 2 * HOUR,
    profile: 'endurance',
    a: { position: 'total', driftPercentPerHour: options.driftPercentPerHour },
    b: { position: 'total' },
  });
  const a = Float64Array.from(recordings.a.power);
  const b = Float64Array.from(recordings.b.power);
  const usable = new Uint8Array(a.length).map((_, i) => (a[i]! > 0 || b[i]! > 0 ? 1 : 0));
  return { a, b, usable };
}

describe('drift of the difference over a ride', () => {
  it('when the blocks are fitted, then slope and interval match R: lm and confint', () => {
    // tests/shared/statistics/reference/drift-lm.R: slope 1.44145158613, confint 0.942079626684 to 1.94082354558, watts slope 3.27147769575
    const hours = [0.0417, 0.125, 0.2083, 0.2917, 0.375, 0.4583, 0.5417, 0.625];
    const percent = [0.1, 0.31, 0.22, 0.58, 0.49, 0.8, 0.71, 1.02];
    const watts = [0.2, 0.7, 0.5, 1.3, 1.1, 1.8, 1.6, 2.3];
    const blocks: DriftBlock[] = hours.map((atHours, i) => ({ atHours, percent: percent[i]!, watts: watts[i]! }));

    const drift = differenceDrift(blocks)!;

    expect(drift.percentPerHour).toBeCloseTo(1.44145158613, 9);
    expect(drift.lower).toBeCloseTo(0.942079626684, 8);
    expect(drift.upper).toBeCloseTo(1.94082354558, 8);
    expect(drift.wattsPerHour).toBeCloseTo(3.27147769575, 9);
    expect(drift).toMatchObject({ blocks: 8 });
  });

  it('when a meter creeps 1.5 % per hour over a simulated two-hour ride, then the slope is recovered and its interval covers it', () => {
    const { a, b, usable } = alignedPair({ seed: 77, driftPercentPerHour: 1.5 });

    const drift = differenceDrift(driftBlocks(a, b, usable))!;

    expect(drift.percentPerHour).toBeGreaterThan(1.2);
    expect(drift.percentPerHour).toBeLessThan(1.8);
    expect(drift.lower).toBeLessThan(1.5);
    expect(drift.upper).toBeGreaterThan(1.5);
  });

  it('when neither meter drifts, then the interval of the slope covers zero in most of 40 rides', () => {
    let covered = 0;
    for (let seed = 1; seed <= 40; seed++) {
      const { a, b, usable } = alignedPair({ seed, durationSeconds: HOUR });
      const drift = differenceDrift(driftBlocks(a, b, usable))!;
      if (drift.lower <= 0 && drift.upper >= 0) covered++;
    }
    // 95 % intervals: 40 rides cover 0 at least 34 times with probability > 0.99 (binomial, common practice)
    expect(covered).toBeGreaterThanOrEqual(34);
  });

  it('when a ride is shorter than four blocks, then there is no drift estimate', () => {
    const { a, b, usable } = alignedPair({ seed: 3, durationSeconds: 15 * 60 });
    expect(differenceDrift(driftBlocks(a, b, usable))).toBeNull();
  });
});

describe('bias by temperature band', () => {
  it('when the first half is cold and the second warm, then each band sums its own seconds', () => {
    const a = Float64Array.from([102, 102, 0, 99, 99, 99]);
    const b = Float64Array.from([100, 100, 0, 100, 100, 100]);
    const usable = Uint8Array.from([1, 1, 0, 1, 1, 1]);
    const temperature = Float64Array.from([2, 4.9, 3, 20, 21, Number.NaN]);

    const bands = biasByTemperatureBand(a, b, usable, temperature);

    // hand computation: (204 / 200 − 1) × 100 = 2 %; (198 / 200 − 1) × 100 = −1 %
    expect(bands).toHaveLength(2);
    expect(bands[0]).toMatchObject({ band: 'below 5 °C', seconds: 2 });
    expect(bands[0]!.percent).toBeCloseTo(2, 12);
    expect(bands[1]).toMatchObject({ band: '15 to 25 °C', seconds: 2 });
    expect(bands[1]!.percent).toBeCloseTo(-1, 12);
  });
});
