// Section figures, dropout rows and cadence steps: the pure pieces of the ride inspection page.
import { describe, expect, it } from 'vitest';
import { findCadenceSteps, medianStepLag } from '@shared/analysis/cadence-steps';
import { compareFitFiles, compareRecordings } from '@shared/analysis/compare-recordings';
import { decodeFit } from '@shared/analysis/decode-fit';
import { dropoutRows } from '@shared/analysis/dropout-rows';
import { rideTrace } from '@shared/analysis/ride-trace';
import { sectionFigures } from '@shared/analysis/section-figures';
import { simulatePair } from '@shared/simulator/pair';
import { effort, rideStream } from './ride-streams';

const DIRECT = { aPosition: 'total', bPosition: 'total' } as const;

/** A ten-minute ride of two known steady halves, with one 5-s hole in A's power at 400–404 s. */
function shortRide() {
  const seconds = 600;
  const aPower = Array.from<unknown, number>({ length: seconds }, (_, i) => (i < 300 ? 200 : 240));
  const bPower = Array.from<unknown, number>({ length: seconds }, (_, i) => (i < 300 ? 198 : 236));
  // A little wobble, the same on both, so the alignment has something to lock onto.
  for (let i = 0; i < seconds; i++) {
    const wobble = i % 7 === 0 ? 30 : i % 11 === 0 ? -20 : 0;
    aPower[i] += wobble;
    bPower[i] += wobble;
  }
  for (let i = 400; i < 405; i++) aPower[i] = 0;
  const cadence = Array.from({ length: seconds }, () => 90);
  return { a: rideStream({ power: aPower, cadence }), b: rideStream({ power: bPower, cadence }), aPower, bPower };
}

describe('section figures on a short simulated ride', () => {
  it('when the first half is chosen, then averages, difference and peaks match a hand computation', () => {
    const { a, b, aPower, bPower } = shortRide();
    const trace = rideTrace(a, b, DIRECT, 0);

    const figures = sectionFigures(trace, 0, 300);

    // By hand: over 0–299 A = 200 + w, B = 198 + w, with the same wobble w on both.
    const wobbleSum = aPower.slice(0, 300).reduce((s, v) => s + v, 0) - 300 * 200;
    const sumA = 300 * 200 + wobbleSum;
    const sumB = 300 * 198 + wobbleSum;
    expect(figures.matchedSeconds).toBe(300);
    expect(figures.aAverageWatts).toBeCloseTo(sumA / 300, 6);
    expect(figures.bAverageWatts).toBeCloseTo(sumB / 300, 6);
    expect(figures.differenceWatts).toBeCloseTo(2, 6);
    expect(figures.differencePercent).toBeCloseTo(100 * (sumA / sumB - 1), 6);
    expect(figures.aPeakWatts).toBe(230);
    expect(figures.bPeakWatts).toBe(228);
    expect(bPower[0]).toBe(228);
  });

  it("when the section holds A's dropout, then those seconds leave the averages but the count says so", () => {
    const { a, b } = shortRide();
    const trace = rideTrace(a, b, DIRECT, 0);

    const figures = sectionFigures(trace, 300, 600);

    // 300 s minus A's 5-s dropout.
    expect(figures.matchedSeconds).toBe(295);
    expect(figures.differenceWatts).toBeCloseTo(4, 6);
    expect(figures.toSeconds).toBe(600);
  });

  it('when the range is given backwards or beyond the ride, then it is put in order and clamped', () => {
    const { a, b } = shortRide();
    const trace = rideTrace(a, b, DIRECT, 0);

    const figures = sectionFigures(trace, 900, 500);

    expect(figures.fromSeconds).toBe(500);
    expect(figures.toSeconds).toBe(600);
  });

  it('when the section has no matched second, then the figures are null, not zero', () => {
    const figures = sectionFigures({ aPower: [null, null], bPower: [100, 120], matched: [0, 0] }, 0, 2);

    expect(figures.matchedSeconds).toBe(0);
    expect(figures.aAverageWatts).toBeNull();
    expect(figures.differencePercent).toBeNull();
    expect(figures.bPeakWatts).toBe(120);
  });

  it('when the whole ride is chosen, then the section difference is the engine’s bias', () => {
    const { power, cadence } = effort(3600, 5);
    const a = rideStream({ power: power.map((p) => p * 1.02), cadence });
    const b = rideStream({ power, cadence });
    const result = compareRecordings(a, b, DIRECT);
    const trace = rideTrace(a, b, DIRECT, result.alignment.clockOffsetSeconds);

    const figures = sectionFigures(trace, 0, trace.length);

    expect(figures.matchedSeconds).toBe(result.bias.matchedSeconds);
    expect(figures.differencePercent!).toBeCloseTo(result.bias.percent!, 1);
  });
});

describe('dropout rows against injected events', () => {
  it('when the simulator injects power dropouts, then each one is a row with the partner’s power at the time', () => {
    const { a, b, truth } = simulatePair({
      seed: 7,
      durationSeconds: 3600,
      a: {
        position: 'total',
        dropouts: [
          { kind: 'power', startSecond: 900, durationSeconds: 6 },
          { kind: 'power', startSecond: 2000, durationSeconds: 4 },
          { kind: 'cadence', startSecond: 2000, durationSeconds: 4 },
        ],
      },
      b: { position: 'total', dropouts: [{ kind: 'power', startSecond: 1200, durationSeconds: 8 }] },
    });
    const result = compareFitFiles(a, b, DIRECT);
    const trace = rideTrace(decodeFit(a), decodeFit(b), DIRECT, result.alignment.clockOffsetSeconds);

    const rows = dropoutRows(result.dropouts, { a: trace.aPower, b: trace.bPower });

    expect(rows).toHaveLength(truth.dropouts.a.power + truth.dropouts.b.power);
    expect(rows.map((r) => r.side)).toEqual(['a', 'b', 'a']);
    expect(rows.map((r) => r.startSeconds)).toEqual([900, 1200, 2000]);
    expect(rows.map((r) => r.durationSeconds)).toEqual([6, 8, 4]);
    expect(rows.map((r) => r.cadenceLostToo)).toEqual([false, false, true]);
    // The simulator places dropouts where the partner reads at least 100 W.
    for (const row of rows) expect(row.partnerWatts!).toBeGreaterThan(100);
  });
});

describe('cadence steps', () => {
  /** 5-s on, 5-s off efforts after a warm-up; A's cadence trails B's by `lag` seconds. */
  function onOff(lag: number) {
    const seconds = 400;
    const truth = Array.from({ length: seconds }, (_, i) => (i < 100 ? 70 : Math.floor((i - 100) / 20) % 2 === 0 ? 110 : 60));
    const b = truth.slice();
    const a = truth.map((_, i) => truth[Math.max(0, i - lag)]);
    return { a, b };
  }

  it('when A trails B by 2 s on every step, then each step shows a 2-s lag, up and down', () => {
    const { a, b } = onOff(2);

    const steps = findCadenceSteps(a, b);

    expect(steps.length).toBe(15);
    expect(steps[0].direction).toBe('up');
    expect(steps[1].direction).toBe('down');
    for (const step of steps) expect(step.lagSeconds).toBeCloseTo(2, 6);
    expect(medianStepLag(steps, 'up')).toBeCloseTo(2, 6);
    expect(medianStepLag(steps, 'down')).toBeCloseTo(2, 6);
  });

  it('when the cadence is steady, then no step is found', () => {
    const steady = Array.from({ length: 300 }, (_, i) => 88 + (i % 3));

    expect(findCadenceSteps(steady, steady)).toEqual([]);
  });

  it("when the simulator lags A's cadence by 3 s, then the steps' median lag is the lag the engine should find", () => {
    const { a, b, truth } = simulatePair({
      seed: 41,
      durationSeconds: 5400,
      profile: 'intervals',
      a: { position: 'total', cadenceLagSeconds: 3 },
      b: { position: 'total' },
    });
    const result = compareFitFiles(a, b, DIRECT);
    const trace = rideTrace(decodeFit(a), decodeFit(b), DIRECT, result.alignment.clockOffsetSeconds);

    const steps = findCadenceSteps(trace.aCadence, trace.bCadence);

    expect(steps.length).toBeGreaterThan(3);
    expect(medianStepLag(steps)!).toBeCloseTo(truth.apparent.cadenceLagSeconds, 0);
  });
});
