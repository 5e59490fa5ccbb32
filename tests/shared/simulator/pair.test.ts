import { describe, expect, it } from 'vitest';
import { simulatePair, type PairOptions, type SimulatedPair } from '@shared/simulator/pair';
import { decodeWithSdk } from './decode-with-sdk';

const START = Date.UTC(2024, 5, 1, 7) / 1000;

/** ΣA / ΣB − 1 in % from the two files as the SDK decodes them, lined up on the true clock. */
function measuredBiasPercent(pair: SimulatedPair, options: PairOptions): number {
  const onTrueClock = (bytes: Uint8Array, clockOffset = 0) => {
    const decoded = decodeWithSdk(bytes);
    const bySecond = new Map<number, number>();
    for (const [i, t] of decoded.timestamps.entries()) bySecond.set(t - START - clockOffset, decoded.power[i] ?? 0);
    return bySecond;
  };
  const a = onTrueClock(pair.a, options.a.clockOffsetSeconds);
  const b = onTrueClock(pair.b, options.b.clockOffsetSeconds);
  const inDropout = (t: number) =>
    [...pair.recordings.a.events, ...pair.recordings.b.events].some(
      (event) => event.kind === 'power' && t >= event.startSecond && t < event.startSecond + event.durationSeconds,
    );
  let sumA = 0;
  let sumB = 0;
  for (const [t, powerA] of a) {
    const powerB = b.get(t) ?? 0;
    if (powerA > 0 && powerB > 0 && !inDropout(t)) {
      sumA += powerA;
      sumB += powerB;
    }
  }
  return 100 * (sumA / sumB - 1);
}

describe('simulatePair', () => {
  const cleanPair: PairOptions = {
    seed: 101,
    durationSeconds: 3600,
    startTime: START,
    a: { position: 'total', scale: 1.025 },
    b: { position: 'total' },
  };

  it('when simulated twice with the same seed, then both files are byte-for-byte identical', () => {
    const first = simulatePair(cleanPair);
    const second = simulatePair(cleanPair);

    expect(Buffer.from(second.a).equals(Buffer.from(first.a))).toBe(true);
    expect(Buffer.from(second.b).equals(Buffer.from(first.b))).toBe(true);
    expect(second.truth).toEqual(first.truth);
  });

  it('when the seed changes, then the files change', () => {
    const other = simulatePair({ ...cleanPair, seed: 102 });

    expect(Buffer.from(other.a).equals(Buffer.from(simulatePair(cleanPair).a))).toBe(false);
  });

  it('when A reads 2.5 % high, then the truth says +2.5 % and the files show it in ΣA/ΣB', () => {
    const pair = simulatePair(cleanPair);

    expect(pair.truth.biasPercent).toBeCloseTo(2.5, 6);
    expect(pair.truth.instrumentBiasPercent).toBeCloseTo(2.5, 6);
    expect(measuredBiasPercent(pair, cleanPair)).toBeCloseTo(2.5, 1);
  });

  it('when a left-only meter rides against a dual meter and the rider pushes 53 % right, then the naive truth shows the leg share', () => {
    const options: PairOptions = {
      seed: 7,
      durationSeconds: 2400,
      startTime: START,
      balanceRightPercent: 53,
      a: { position: 'left', scale: 1.01 },
      b: { position: 'dual' },
    };

    const pair = simulatePair(options);

    // 2 × 47 % × 1.01 ≈ 0.949: about −5 % naive, +1 % like for like.
    expect(pair.truth.biasPercent).toBeCloseTo(-5.1, 0);
    expect(pair.truth.instrumentBiasPercent).toBeCloseTo(1, 6);
    // The truth is the noise-free expectation; meter noise moves a 40-minute sum by a few hundredths of a %.
    expect(Math.abs(measuredBiasPercent(pair, options) - pair.truth.biasPercent)).toBeLessThan(0.2);
  });

  it('when clocks, lags, smoothing, start times and dropouts differ, then the truth reports each', () => {
    const options: PairOptions = {
      seed: 55,
      durationSeconds: 3600,
      startTime: START,
      profile: 'race',
      a: {
        position: 'total',
        clockOffsetSeconds: 14,
        cadenceLagSeconds: 3,
        smoothingSeconds: 3,
        startOffsetSeconds: 120,
        powerDropoutsPerHour: 5,
        cadenceDropoutsPerHour: 3,
      },
      b: {
        position: 'dual',
        clockOffsetSeconds: -2,
        cadenceLagSeconds: 1,
        endOffsetSeconds: 300,
        powerDropoutsPerHour: 3,
        recordingMode: 'change-only',
      },
    };

    const pair = simulatePair(options);

    expect(pair.truth.clockOffsetSeconds).toBe(16);
    expect(pair.truth.cadenceLagSeconds).toBe(2);
    expect(pair.truth.powerDelaySeconds).toEqual({ a: 1, b: 0 });
    // A's 3 s trailing average delays its power by 1 s: alignment by power sees 17 s, and cadence 1 s behind.
    expect(pair.truth.apparent).toEqual({ clockOffsetSeconds: 17, cadenceLagSeconds: 1 });
    expect(pair.truth.overlapSeconds).toBe(3600 - 120 - 300);
    expect(pair.truth.dropouts.a.power).toBe(pair.recordings.a.events.filter((e) => e.kind === 'power').length);
    expect(pair.truth.dropouts.a.power + pair.truth.dropouts.b.power).toBeGreaterThan(3);
    expect(measuredBiasPercent(pair, options)).toBeCloseTo(pair.truth.biasPercent, 0);
  });

  it('when both sides have dropouts, then no event of one side overlaps or touches an event of the other', () => {
    const pair = simulatePair({
      seed: 9,
      durationSeconds: 7200,
      startTime: START,
      a: { position: 'total', powerDropoutsPerHour: 8, cadenceDropoutsPerHour: 8 },
      b: { position: 'total', powerDropoutsPerHour: 8, cadenceDropoutsPerHour: 8 },
    });

    const events = [...pair.recordings.a.events, ...pair.recordings.b.events].sort((x, y) => x.startSecond - y.startSecond);
    for (let i = 1; i < events.length; i += 1) {
      expect(events[i].startSecond - (events[i - 1].startSecond + events[i - 1].durationSeconds)).toBeGreaterThanOrEqual(5);
    }
  });

  it('when the injected dropout rate is 6 per pedalling hour, then the planned counts average near it', () => {
    let events = 0;
    let hours = 0;
    for (let seed = 1; seed <= 20; seed += 1) {
      const pair = simulatePair({
        seed,
        durationSeconds: 3600,
        startTime: START,
        a: { position: 'total', powerDropoutsPerHour: 6 },
        b: { position: 'total' },
      });
      events += pair.truth.dropouts.a.power;
      hours += pair.truth.pedallingSeconds / 3600;
    }

    expect(events / hours).toBeGreaterThan(4.5);
    expect(events / hours).toBeLessThan(7.5);
  }, 60_000); // 40 hour-long files through the FIT SDK's Encoder
});
