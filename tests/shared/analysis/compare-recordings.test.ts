import { describe, expect, it } from 'vitest';
import { compareRecordings, METHOD_VERSION } from '@shared/analysis/compare-recordings';
import { AnalysisError } from '@shared/analysis/errors';
import { effort, rideStream, RIDE_START, scaled } from './ride-streams';

const HOUR = 3600;
const DIRECT = { aPosition: 'total', bPosition: 'total' } as const;

function expectAnalysisError(run: () => unknown, code: string): AnalysisError {
  try {
    run();
  } catch (error) {
    expect(error).toBeInstanceOf(AnalysisError);
    expect((error as AnalysisError).code).toBe(code);
    return error as AnalysisError;
  }
  throw new Error(`expected an AnalysisError with code ${code}`);
}

describe('compareRecordings on per-second arrays', () => {
  it('when A reads 3 % high, then bias and the like-for-like percent are +3 %', () => {
    const ride = effort(HOUR);
    const a = rideStream({ power: scaled(ride.power, 1.03), cadence: ride.cadence });
    const b = rideStream({ power: ride.power, cadence: ride.cadence });

    const result = compareRecordings(a, b, DIRECT);

    expect(result.methodVersion).toBe(METHOD_VERSION);
    expect(result.bias.percent).toBeCloseTo(3, 6);
    expect(result.likeForLike).toMatchObject({ mode: 'direct', naivePercent: result.bias.percent });
    expect(result.sums.a / result.sums.b).toBeCloseTo(1.03, 9);
    expect(result.alignment.clockOffsetSeconds).toBe(0);
    expect(result.agreement.meanDifferencePercent).toBeCloseTo(3, 0);
  });

  it("when A's clock runs 47 s ahead and the recordings start and stop apart, then the offset is recovered", () => {
    const ride = effort(2 * HOUR, 7);
    // A starts recording 5 min into the ride and stops 10 min early; its clock is 47 s fast.
    const aSlice = ride.power.subarray(300, 2 * HOUR - 600);
    const a = rideStream({ power: aSlice, start: RIDE_START + 300 + 47 });
    const b = rideStream({ power: ride.power, start: RIDE_START });

    const result = compareRecordings(a, b, DIRECT);

    expect(result.alignment.clockOffsetSeconds).toBe(47);
    expect(result.alignment.overlapSeconds).toBe(aSlice.length);
    expect(result.alignment.startTime).toBe(RIDE_START + 300);
    expect(result.alignment.correlation).toBeGreaterThan(0.99);
    expect(result.bias.percent).toBeCloseTo(0, 9);
  });

  it("when A's cadence trails B's by 3 s, then the cadence lag is +3 s", () => {
    const ride = effort(HOUR, 3);
    const lagged = Float64Array.from(ride.cadence, (_, i) => ride.cadence[Math.max(0, i - 3)]);
    const a = rideStream({ power: ride.power, cadence: lagged });
    const b = rideStream({ power: ride.power, cadence: ride.cadence });

    const result = compareRecordings(a, b, DIRECT);

    expect(result.cadenceLagSeconds).toBe(3);
  });

  it('when a left-only meter is judged against a dual meter with balance, then the comparison goes via the left leg', () => {
    const ride = effort(HOUR, 5);
    const rightBalance = ride.power.map(() => 52);
    // A true left-only meter doubles the left leg: 2 × 48 % of the total = 0.96 × total.
    const a = rideStream({ power: scaled(ride.power, 0.96 * 1.02) });
    const b = rideStream({ power: ride.power, rightBalance });

    const result = compareRecordings(a, b, { aPosition: 'left', bPosition: 'dual' });

    expect(result.likeForLike.mode).toBe('via_balance');
    expect(result.likeForLike.leg).toBe('left');
    expect(result.likeForLike.percent).toBeCloseTo(2, 6);
    expect(result.likeForLike.naivePercent).toBeCloseTo(100 * (0.96 * 1.02 - 1), 6);
    expect(result.flags.map((flag) => flag.code)).not.toContain('mixed_comparison');
  });

  it('when a left-only meter meets a dual meter without balance, then the comparison is mixed and flagged', () => {
    const ride = effort(HOUR, 5);

    const result = compareRecordings(rideStream({ power: ride.power }), rideStream({ power: ride.power }), {
      aPosition: 'left',
      bPosition: 'dual',
    });

    expect(result.likeForLike.mode).toBe('mixed');
    expect(result.flags).toContainEqual(expect.objectContaining({ code: 'mixed_comparison', severity: 'warning' }));
  });

  it('when A is a hub against a crank meter, then the bias is reported as is with the expected drivetrain loss', () => {
    const ride = effort(HOUR, 9);
    const a = rideStream({ power: scaled(ride.power, 0.979) });
    const b = rideStream({ power: ride.power });

    const result = compareRecordings(a, b, { ...DIRECT, aAfterDrivetrain: true });

    expect(result.bias.percent).toBeCloseTo(-2.1, 6);
    // Smit et al., Sports Engineering 2023: crank to rear wheel about 2.1 % ± 1.5 %.
    expect(result.likeForLike.expectedDrivetrainPercent).toBeCloseTo(-2.1, 6);
    expect(result.flags).toContainEqual(expect.objectContaining({ code: 'drivetrain_loss', severity: 'info' }));
  });

  it('when both streams are the same, then identical streams are flagged severe', () => {
    const ride = effort(HOUR);

    const result = compareRecordings(rideStream({ power: ride.power }), rideStream({ power: ride.power }), DIRECT);

    expect(result.flags).toContainEqual(expect.objectContaining({ code: 'identical_streams', severity: 'severe' }));
  });

  it('when A reads 20 % high, then a large bias is flagged', () => {
    const ride = effort(HOUR);

    const result = compareRecordings(rideStream({ power: scaled(ride.power, 1.2) }), rideStream({ power: ride.power }), DIRECT);

    expect(result.flags.map((flag) => flag.code)).toContain('large_bias');
  });

  it('when the two recordings are of different rides, then low correlation is flagged', () => {
    const result = compareRecordings(rideStream({ power: effort(HOUR, 11).power }), rideStream({ power: effort(HOUR, 12).power }), DIRECT);

    expect(result.flags).toContainEqual(expect.objectContaining({ code: 'low_correlation', severity: 'severe' }));
  });

  it('when A reports 3500 W for 8 s, then implausible power is flagged', () => {
    const ride = effort(HOUR);
    const spiky = Float64Array.from(ride.power, (watts, i) => (i >= 1000 && i < 1008 ? 3500 : watts));

    const result = compareRecordings(rideStream({ power: spiky }), rideStream({ power: ride.power }), DIRECT);

    expect(result.flags.map((flag) => flag.code)).toContain('implausible_power');
  });

  it('when a steady block is ridden, then a steady segment covers it with both averages', () => {
    const steady = Float64Array.from({ length: HOUR }, (_, i) => (i >= 600 && i < 1200 ? 250 + (i % 2) : 100 + (i % 97) * 3));

    const result = compareRecordings(rideStream({ power: scaled(steady, 1.05) }), rideStream({ power: steady }), DIRECT);

    const segment = result.steadySegments.find((s) => s.startSeconds <= 630 && s.startSeconds + s.durationSeconds >= 1170);
    expect(segment).toBeDefined();
    // Streams hold power in single precision, so 1.05 × whole watts is rounded a little.
    expect(segment!.percent).toBeCloseTo(5, 4);
  });

  it('when the result is serialised, then the contract keys are all there and nothing is NaN', () => {
    const ride = effort(HOUR);

    const result = compareRecordings(
      rideStream({ power: scaled(ride.power, 1.01), cadence: ride.cadence }),
      rideStream({ power: ride.power, cadence: ride.cadence }),
      DIRECT,
    );
    const json = JSON.parse(JSON.stringify(result));

    for (const key of [
      'methodVersion',
      'alignment',
      'bias',
      'agreement',
      'dropouts',
      'cadenceLagSeconds',
      'peaks',
      'powerBands',
      'cadenceBands',
      'steadySegments',
      'likeForLike',
      'smoothing',
      'flags',
      'sums',
      'pedallingSeconds',
      'series',
    ]) {
      expect(json).toHaveProperty(key);
    }
    expect(JSON.stringify(result)).not.toContain('NaN');
    expect(json.series.differenceWatts).toHaveLength(HOUR / 10);
  });
});

describe('compareRecordings errors', () => {
  it('when B has no power values, then the error is no_power and names file B', () => {
    const ride = effort(HOUR);
    const b = rideStream({ power: ride.power.map(() => NaN) });

    const error = expectAnalysisError(() => compareRecordings(rideStream({ power: ride.power }), b, DIRECT), 'no_power');

    expect(error.side).toBe('b');
    expect(error.message).toMatch(/second file \(B\)/);
  });

  it('when a recording lasts 5 minutes, then the error is too_short', () => {
    const ride = effort(HOUR);

    expectAnalysisError(
      () => compareRecordings(rideStream({ power: ride.power.subarray(0, 300) }), rideStream({ power: ride.power }), DIRECT),
      'too_short',
    );
  });

  it('when the recordings are hours apart, then the error is no_overlap', () => {
    const ride = effort(HOUR);

    const error = expectAnalysisError(
      () => compareRecordings(rideStream({ power: ride.power, start: RIDE_START + 3 * HOUR }), rideStream({ power: ride.power }), DIRECT),
      'no_overlap',
    );
    expect(error.message).toMatch(/do not overlap in time/);
  });

  it('when the recordings share 8 minutes, then the error is short_overlap and names the overlap', () => {
    const ride = effort(2 * HOUR);
    const a = rideStream({ power: ride.power.subarray(0, HOUR) });
    const b = rideStream({ power: ride.power.subarray(HOUR - 480), start: RIDE_START + HOUR - 480 });

    const error = expectAnalysisError(() => compareRecordings(a, b, DIRECT), 'short_overlap');

    expect(error.message).toMatch(/8 min/);
  });
});

describe('compareRecordings recording-quality flags', () => {
  it('when A has twelve 10 s gaps, then many long gaps are flagged for A', () => {
    const ride = effort(HOUR);
    const gappy = rideStream({ power: ride.power, skip: (i) => i % 300 > 290 });

    const result = compareRecordings(gappy, rideStream({ power: ride.power }), DIRECT);

    expect(result.flags).toContainEqual(expect.objectContaining({ code: 'many_gaps', message: expect.stringMatching(/^Device A/) }));
  });

  it('when B reports a cadence of 255 rpm, then implausible cadence is flagged', () => {
    const ride = effort(HOUR);
    const cadence = Float64Array.from(ride.cadence, (rpm, i) => (i === 2000 ? 255 : rpm));

    const result = compareRecordings(
      rideStream({ power: ride.power, cadence: ride.cadence }),
      rideStream({ power: ride.power, cadence }),
      DIRECT,
    );

    expect(result.flags).toContainEqual(
      expect.objectContaining({ code: 'implausible_cadence', message: expect.stringMatching(/^Device B/) }),
    );
  });
});
