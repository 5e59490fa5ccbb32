// End to end on simulated rides: two FIT files written by the reference encoder,
// with known scale, noise, clock offset, cadence lag, dropouts and balance; the
// engine must recover each within the stated tolerance.
import { describe, expect, it } from 'vitest';
import { compareFitFiles } from '@shared/analysis/compare-recordings';
import { AnalysisError } from '@shared/analysis/errors';
import { simulatePair, type PairOptions } from '@shared/simulator/pair';
import { DRIVETRAIN_LOSS_PERCENT } from '@shared/simulator/meter';

const HOUR = 3600;
const DIRECT = { aPosition: 'total', bPosition: 'total' } as const;
/** Bias tolerance in percentage points: noise of 1 % + 2 W per second averages out over an hour. */
const BIAS_TOLERANCE = 0.2;

function pair(options: Partial<PairOptions> & Pick<PairOptions, 'a' | 'b'>) {
  return simulatePair({ seed: 101, durationSeconds: 1.5 * HOUR, ...options });
}

function codeOf(run: () => unknown): string {
  try {
    run();
  } catch (error) {
    if (error instanceof AnalysisError) return error.code;
    throw error;
  }
  return 'no error';
}

describe('synthetic pairs: what the engine recovers', () => {
  it('when A reads 2.5 % high with ordinary noise, then the bias is +2.5 % and the agreement is tight', () => {
    // Maier et al., Int J Sports Med 2017: 54 meters deviated −0.9 ± 3.2 % in the lab, so a few % is a realistic bias.
    const { a, b, truth } = pair({ a: { position: 'total', scale: 1.025 }, b: { position: 'total' } });

    const result = compareFitFiles(a, b, DIRECT);

    expect(result.bias.percent).toBeCloseTo(truth.biasPercent, 0);
    expect(Math.abs(result.bias.percent! - truth.biasPercent)).toBeLessThan(BIAS_TOLERANCE);
    expect(result.alignment.clockOffsetSeconds).toBe(0);
    expect(result.agreement.concordance).toBeGreaterThan(0.95);
    expect(result.agreement.lowerLimitPercent).toBeLessThan(2.5);
    expect(result.agreement.upperLimitPercent).toBeGreaterThan(2.5);
    expect(result.flags.filter((flag) => flag.severity !== 'info')).toEqual([]);
  });

  it("when A's clock is 73 s fast and the devices start and stop at different times, then offset and overlap are recovered", () => {
    const { a, b, truth } = pair({
      a: { position: 'total', clockOffsetSeconds: 73, startOffsetSeconds: 400 },
      b: { position: 'total', endOffsetSeconds: 600 },
    });

    const result = compareFitFiles(a, b, DIRECT);

    expect(result.alignment.clockOffsetSeconds).toBe(truth.clockOffsetSeconds);
    expect(result.alignment.overlapSeconds).toBe(truth.overlapSeconds);
    expect(Math.abs(result.bias.percent! - truth.biasPercent)).toBeLessThan(BIAS_TOLERANCE);
  });

  it('when both devices drop out, then each side counts exactly the injected events', () => {
    const { a, b, truth } = pair({
      seed: 7,
      durationSeconds: 2 * HOUR,
      a: { position: 'total', powerDropoutsPerHour: 3, cadenceDropoutsPerHour: 2 },
      b: { position: 'total', powerDropoutsPerHour: 2, cadenceDropoutsPerHour: 1 },
    });
    expect(truth.dropouts.a.power + truth.dropouts.b.power).toBeGreaterThan(2);

    const result = compareFitFiles(a, b, DIRECT);

    expect(result.dropouts.a.power.count).toBe(truth.dropouts.a.power);
    expect(result.dropouts.b.power.count).toBe(truth.dropouts.b.power);
    expect(result.dropouts.a.cadence.count).toBe(truth.dropouts.a.cadence);
    expect(result.dropouts.b.cadence.count).toBe(truth.dropouts.b.cadence);
    expect(result.dropouts.pedallingSeconds).toBeCloseTo(truth.pedallingSeconds, -2);
    expect(Math.abs(result.bias.percent! - truth.biasPercent)).toBeLessThan(BIAS_TOLERANCE);
  });

  it('when a head unit records only on change, then its gaps are not dropouts', () => {
    const { a, b, truth } = pair({
      a: { position: 'total', recordingMode: 'change-only', scale: 0.98 },
      b: { position: 'total', recordingMode: 'change-only' },
    });

    const result = compareFitFiles(a, b, DIRECT);

    expect(result.dropouts.a.power.count).toBe(0);
    expect(result.dropouts.b.power.count).toBe(0);
    expect(result.dropouts.a.cadence.count).toBe(0);
    expect(Math.abs(result.bias.percent! - truth.biasPercent)).toBeLessThan(BIAS_TOLERANCE);
  });

  it("when A's cadence trails B's by 4 s, then the cadence lag is +4 s", () => {
    const { a, b, truth } = pair({ a: { position: 'total', cadenceLagSeconds: 4 }, b: { position: 'total' } });

    const result = compareFitFiles(a, b, DIRECT);

    expect(result.cadenceLagSeconds).toBe(truth.cadenceLagSeconds);
  });

  it('when a left-only meter rides with a dual meter that records balance, then like for like finds the instrument bias', () => {
    const { a, b, truth } = pair({ balanceRightPercent: 53, a: { position: 'left', scale: 1.015 }, b: { position: 'dual' } });

    const result = compareFitFiles(a, b, { aPosition: 'left', bPosition: 'dual' });

    expect(result.likeForLike.mode).toBe('via_balance');
    expect(Math.abs(result.likeForLike.percent! - truth.instrumentBiasPercent)).toBeLessThan(BIAS_TOLERANCE);
    // The naive total comparison carries the leg imbalance: 2 × 47 % reads about 6 % low.
    expect(Math.abs(result.likeForLike.naivePercent! - truth.biasPercent)).toBeLessThan(BIAS_TOLERANCE);
    expect(result.likeForLike.naivePercent!).toBeLessThan(result.likeForLike.percent! - 3);
  });

  it('when A is a hub after the drivetrain, then the bias shows the loss and the result notes it', () => {
    const { a, b, truth } = pair({ a: { position: 'total', drivetrainLossPercent: DRIVETRAIN_LOSS_PERCENT }, b: { position: 'total' } });

    const result = compareFitFiles(a, b, { ...DIRECT, aAfterDrivetrain: true });

    expect(Math.abs(result.bias.percent! - truth.biasPercent)).toBeLessThan(BIAS_TOLERANCE);
    expect(result.likeForLike.expectedDrivetrainPercent).toBeCloseTo(-DRIVETRAIN_LOSS_PERCENT, 6);
  });

  it("when A's head unit averages power over 10 s, then the smoothing mismatch is flagged", () => {
    const { a, b } = pair({ profile: 'intervals', a: { position: 'total', smoothingSeconds: 10 }, b: { position: 'total' } });

    const result = compareFitFiles(a, b, DIRECT);

    expect(result.smoothing.ratio!).toBeLessThan(0.5);
    expect(result.flags.map((flag) => flag.code)).toContain('smoothing_mismatch');
  });

  it('when the same file is uploaded as A and B, then identical files are flagged severe', () => {
    const { a } = pair({ a: { position: 'total' }, b: { position: 'total' } });

    const result = compareFitFiles(a, a.slice(), DIRECT);

    expect(result.flags).toContainEqual(expect.objectContaining({ code: 'identical_files', severity: 'severe' }));
    expect(result.flags.map((flag) => flag.code)).not.toContain('identical_streams');
  });
});

describe('synthetic pairs: errors', () => {
  const good = pair({ a: { position: 'total' }, b: { position: 'total' } });

  it('when A is not a FIT file, then the error is not_fit', () => {
    expect(codeOf(() => compareFitFiles(new TextEncoder().encode('not a ride'), good.b, DIRECT))).toBe('not_fit');
  });

  it('when B is truncated, then the error is ended_early', () => {
    expect(codeOf(() => compareFitFiles(good.a, good.b.subarray(0, good.b.length - 1), DIRECT))).toBe('ended_early');
  });

  it('when B has a flipped byte, then the CRC mismatch is damaged_file', () => {
    const damaged = good.b.slice();
    damaged[Math.floor(damaged.length / 3)] ^= 0x10;

    expect(codeOf(() => compareFitFiles(good.a, damaged, DIRECT))).toBe('damaged_file');
  });

  it('when the two rides happened on different days, then the error is no_overlap', () => {
    const otherDay = pair({ startTime: Date.UTC(2024, 5, 2, 7) / 1000, a: { position: 'total' }, b: { position: 'total' } });

    expect(codeOf(() => compareFitFiles(good.a, otherDay.b, DIRECT))).toBe('no_overlap');
  });

  it('when the recordings share 8 minutes, then the error is short_overlap', () => {
    const { a, b } = pair({
      durationSeconds: HOUR,
      a: { position: 'total', endOffsetSeconds: HOUR - 1200 },
      b: { position: 'total', startOffsetSeconds: 720 },
    });

    expect(codeOf(() => compareFitFiles(a, b, DIRECT))).toBe('short_overlap');
  });

  it('when a ride lasts 5 minutes, then the error is too_short', () => {
    const { a, b } = pair({ durationSeconds: 300, a: { position: 'total' }, b: { position: 'total' } });

    expect(codeOf(() => compareFitFiles(a, b, DIRECT))).toBe('too_short');
  });
});
