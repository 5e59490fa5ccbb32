import { describe, expect, it } from 'vitest';
import { cadenceBands, powerBands } from '@shared/analysis/bands';
import { analysePeaks, bestMeanPower, normalisedPower } from '@shared/analysis/peaks';
import { smoothingSignature } from '@shared/analysis/smoothing';

const all = (length: number) => new Uint8Array(length).fill(1);

describe('peaks', () => {
  it('when the best 5 s is searched, then it equals the brute-force maximum of all 5 s windows', () => {
    const power = Float64Array.from({ length: 600 }, (_, i) => 200 + 150 * Math.sin(i / 7) + (i % 13) * 4);
    let expected = 0;
    for (let i = 0; i + 5 <= power.length; i++) expected = Math.max(expected, power.subarray(i, i + 5).reduce((s, v) => s + v, 0) / 5);

    expect(bestMeanPower(power, 5)).toBeCloseTo(expected, 9);
  });

  it('when power is constant, then normalised power equals it; when it alternates by minute, then it is higher than the average', () => {
    const steady = new Float64Array(1200).fill(230);
    const surging = Float64Array.from({ length: 1200 }, (_, i) => (Math.floor(i / 60) % 2 === 0 ? 100 : 360));

    expect(normalisedPower(steady)).toBeCloseTo(230, 9);
    expect(normalisedPower(surging)!).toBeGreaterThan(250);
  });

  it("when A's sprint rises 2 s later than B's, then the sprint lists both peaks and A's response is 2 s slower", () => {
    const b = Float64Array.from({ length: 1200 }, (_, i) => (i >= 600 && i < 612 ? 900 : 150));
    const a = Float64Array.from({ length: 1200 }, (_, i) => (i >= 602 && i < 614 ? 918 : 150));

    const { sprints, best } = analysePeaks(a, b);

    expect(sprints).toHaveLength(1);
    expect(sprints[0]).toMatchObject({ startSeconds: 600, durationSeconds: 12, aPeakWatts: 918, bPeakWatts: 900 });
    expect(sprints[0].aSecondsTo80Percent! - sprints[0].bSecondsTo80Percent!).toBe(2);
    expect(best.find((peak) => peak.durationSeconds === 1)!.percent).toBeCloseTo(2, 9);
  });
});

describe('bias by band', () => {
  it('when A reads 5 % high below 150 W and true above, then only the lowest power band shows +5 %', () => {
    const b = Float64Array.from({ length: 400 }, (_, i) => (i < 200 ? 100 : 300));
    const a = Float64Array.from(b, (watts) => (watts < 150 ? watts * 1.05 : watts));

    const bands = powerBands(a, b, all(400));

    expect(bands[0]).toMatchObject({ from: 0, to: 150, matchedSeconds: 200 });
    expect(bands[0].percent).toBeCloseTo(5, 9);
    expect(bands[2]).toMatchObject({ from: 250, to: 400, matchedSeconds: 200, percent: 0 });
    expect(bands[4]).toMatchObject({ from: 700, to: null, matchedSeconds: 0, percent: null });
  });

  it('when A reads 3 % low at high cadence, then the ≥ 110 rpm band shows −3 %', () => {
    const b = new Float64Array(300).fill(250);
    const cadence = Float64Array.from({ length: 300 }, (_, i) => (i < 100 ? 60 : i < 200 ? 95 : 115));
    const a = Float64Array.from(b, (watts, i) => (cadence[i] >= 110 ? watts * 0.97 : watts));

    const bands = cadenceBands(a, b, all(300), cadence, cadence);

    expect(bands.map((band) => band.matchedSeconds)).toEqual([100, 0, 100, 100]);
    expect(bands[3].percent).toBeCloseTo(-3, 9);
    expect(bands[0].percent).toBeCloseTo(0, 9);
  });
});

describe('smoothing signature', () => {
  it('when A is a 5 s average of B, then A looks several times smoother', () => {
    const b = Float64Array.from({ length: 1000 }, (_, i) => 200 + (i % 2 === 0 ? 40 : -40));
    const a = Float64Array.from(b, (_, i) => {
      const window = b.subarray(Math.max(0, i - 4), i + 1);
      return window.reduce((s, v) => s + v, 0) / window.length;
    });

    const smoothing = smoothingSignature(a, b, all(1000));

    expect(smoothing.ratio!).toBeLessThan(0.5);
  });
});
