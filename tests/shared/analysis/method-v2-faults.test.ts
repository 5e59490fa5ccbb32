// Method version 2 (issue 14): each fault the sweep found in method 1, with its
// reproduction from the table written as a test on simulated FIT files.
import { describe, expect, it } from 'vitest';
import { compareFitFiles, compareRecordings } from '@shared/analysis/compare-recordings';
import { METHOD_VERSION } from '@shared/analysis/method';
import { simulatePair, type PairOptions } from '@shared/simulator/pair';
import { effort, rideStream, scaled } from './ride-streams';

const HOUR = 3600;
const DIRECT = { aPosition: 'total', bPosition: 'total' } as const;
/** The goal for the bias: within ±0.3 percentage points of the truth. */
const BIAS_GOAL_PP = 0.3;

function compare(options: Partial<PairOptions> & Pick<PairOptions, 'a' | 'b'>) {
  const pair = simulatePair({ seed: 1414, durationSeconds: 2 * HOUR, profile: 'endurance', ...options });
  return { ...pair, result: compareFitFiles(pair.a, pair.b, DIRECT) };
}

function dropoutCounts(result: ReturnType<typeof compareFitFiles>) {
  return {
    aPower: result.dropouts.a.power.count,
    bPower: result.dropouts.b.power.count,
    aCadence: result.dropouts.a.cadence.count,
    bCadence: result.dropouts.b.cadence.count,
  };
}

const NONE = { aPower: 0, bPower: 0, aCadence: 0, bCadence: 0 };

/** A ride-like effort with every third 45 s block spent coasting: about 28–40 % of seconds at zero. */
function coastingRide(seconds: number) {
  const { power, cadence } = effort(seconds, 28);
  for (let i = 0; i < seconds; i++) {
    if (Math.floor(i / 45) % 3 === 2) {
      power[i] = 0;
      cadence[i] = 0;
    }
  }
  return { power, cadence };
}

/** What a head unit averaging over `window` s records. */
function trailing(values: Float64Array, window: number): Float64Array {
  return Float64Array.from(values, (_, i) => {
    const from = Math.max(0, i - window + 1);
    let sum = 0;
    for (let j = from; j <= i; j++) sum += values[j];
    return sum / (i - from + 1);
  });
}

describe('method version 2', { timeout: 60_000 }, () => {
  it('when the engine runs, then it reports method version 2', () => {
    expect(METHOD_VERSION).toBe(2);
  });

  it("when B's head unit averages power over 10 s on a 2 h endurance ride with perfect meters, then no power dropout is found at coasts or stops", () => {
    // Method 1 found 2.95 false power dropouts per hour on A here.
    const { result } = compare({ a: { position: 'total' }, b: { position: 'total', smoothingSeconds: 10 } });

    expect(dropoutCounts(result)).toEqual(NONE);
  });

  it.each([3, 4, 5])(
    "when A's cadence is %i s late on a 2 h endurance ride recorded every second, then no cadence dropout is found at stops and starts",
    (lag) => {
      // Method 1 found 6 of 6 false cadence dropouts per ride at lags of 3 s and more.
      const { result, truth } = compare({ a: { position: 'total', cadenceLagSeconds: lag }, b: { position: 'total' } });

      expect(result.cadenceLagSeconds).toBe(truth.cadenceLagSeconds);
      expect(dropoutCounts(result)).toEqual(NONE);
    },
  );

  it.each([3, 5, 10])(
    'when A reads 2 percent high through a %i s trailing average of a ride with 28 percent of seconds at zero, then the bias is still +2 percent and the smoothing is flagged',
    (seconds) => {
      // Method 1 on a real ride like this: +0.04 % at 3 s, −1.97 % at 5 s, −5.70 % at 10 s, no smoothing flag at 3 s.
      const { power, cadence } = coastingRide(2 * HOUR);
      const zeroShare = power.filter((watts) => watts === 0).length / power.length;
      expect(zeroShare).toBeGreaterThan(0.25);
      const a = rideStream({ power: scaled(trailing(power, seconds), 1.02), cadence });
      const b = rideStream({ power, cadence });

      const result = compareRecordings(a, b, DIRECT);

      expect(Math.abs(result.bias.percent! - 2)).toBeLessThan(BIAS_GOAL_PP);
      expect(result.smoothing.windowSeconds).toEqual({ a: seconds, b: 1 });
      expect(result.flags.map((flag) => flag.code)).toContain('smoothing_mismatch');
    },
  );

  it('when a 32-min indoor ride recorded change-only on both sides has many dropouts, then the clock offset and bias are still right', () => {
    // Method 1: offset 84 s (truth 94), bias −4.34 % (truth −4.92), cadence lag −10 s on its bound, no flags.
    const both = { position: 'total', recordingMode: 'change-only', powerDropoutsPerHour: 11, cadenceDropoutsPerHour: 17 } as const;
    const { result, truth } = compare({
      seed: 94,
      profile: 'indoor',
      durationSeconds: 32 * 60,
      a: { ...both, scale: 0.9508, clockOffsetSeconds: 94 },
      b: both,
    });
    expect(truth.dropouts.a.power + truth.dropouts.b.power).toBeGreaterThan(6);

    expect(result.alignment.clockOffsetSeconds).toBe(94);
    expect(Math.abs(result.bias.percent! - truth.biasPercent)).toBeLessThan(BIAS_GOAL_PP);
    expect(result.cadenceLagSeconds).toBe(0);
    expect(dropoutCounts(result)).toEqual({
      aPower: truth.dropouts.a.power,
      bPower: truth.dropouts.b.power,
      aCadence: truth.dropouts.a.cadence,
      bCadence: truth.dropouts.b.cadence,
    });
  });

  it("when A's copy is shifted by +150 s, beyond the search window, then a severe estimate_on_bound flag says so", () => {
    // Method 1: offset +120 s (the window's edge), invented dropouts, cadence lag +10 s (its edge), no flag.
    const { result } = compare({ durationSeconds: HOUR, a: { position: 'total', clockOffsetSeconds: 150 }, b: { position: 'total' } });

    expect(result.alignment.outsideWindow).toBe(true);
    expect(result.flags).toContainEqual(expect.objectContaining({ code: 'estimate_on_bound', severity: 'severe' }));
  });

  it('when the true offset is 120 s, on the edge of the window but inside it, then it is found exactly and not flagged', () => {
    const { result } = compare({ durationSeconds: HOUR, a: { position: 'total', clockOffsetSeconds: -120 }, b: { position: 'total' } });

    expect(result.alignment.clockOffsetSeconds).toBe(-120);
    expect(result.flags.map((flag) => flag.code)).not.toContain('estimate_on_bound');
  });

  it("when B averages power over 10 s and A's cadence is 3 s late, then the cadence lag is 3 s, not the smoothing's delay added to it", () => {
    // Method 1: apparent cadence lag 9.5 s with B smoothed 10 s.
    const { result, truth } = compare({
      a: { position: 'total', cadenceLagSeconds: 3, clockOffsetSeconds: 40 },
      b: { position: 'total', smoothingSeconds: 10 },
    });

    expect(result.alignment.clockOffsetSeconds).toBe(truth.clockOffsetSeconds);
    expect(result.cadenceLagSeconds).toBe(3);
  });
});
