import { describe, expect, it } from 'vitest';
import { clusteredRate, clusteredRateRatio, type ClusteredRateSums } from '../../../shared/statistics/clustered-rate';
import { poissonRate } from '../../../shared/statistics/poisson';

// The rides of tests/shared/statistics/reference/rider-clustered.R: [rider, hours, dropouts].
const firmwareA: [number, number, number][] = [
  [1, 2, 3],
  [1, 1.5, 1],
  [2, 3, 0],
  [3, 1, 2],
  [3, 2, 6],
  [3, 1, 1],
  [4, 2.5, 1],
  [5, 1, 0],
  [5, 2, 2],
];
const firmwareB: [number, number, number][] = [
  [6, 2, 0],
  [6, 2, 1],
  [7, 3, 1],
  [8, 1.5, 0],
  [9, 2, 2],
  [9, 1, 0],
];

/** The running sums a scope keeps, from the rides grouped by rider. */
function sumsOf(rides: [number, number, number][]): ClusteredRateSums {
  const riders = new Map<number, { hours: number; events: number }>();
  for (const [rider, hours, events] of rides) {
    const r = riders.get(rider) ?? { hours: 0, events: 0 };
    r.hours += hours;
    r.events += events;
    riders.set(rider, r);
  }
  const sums = {
    events: 0,
    exposure: 0,
    clusters: riders.size,
    sumEventsSquared: 0,
    sumEventsExposure: 0,
    sumExposureSquared: 0,
    sumEventsSquaredPerExposure: 0,
  };
  for (const { hours, events } of riders.values()) {
    sums.events += events;
    sums.exposure += hours;
    sums.sumEventsSquared += events * events;
    sums.sumEventsExposure += events * hours;
    sums.sumExposureSquared += hours * hours;
    sums.sumEventsSquaredPerExposure += (events * events) / hours;
  }
  return sums;
}

describe('rider-clustered dropout rates', () => {
  it('when riders differ more than chance allows, then the interval is the clustered one that R computes', () => {
    // Act
    const rate = clusteredRate(sumsOf(firmwareA));
    // Assert: R glm + sandwich::vcovCL(type "HC0", cadjust) — var(log) 0.183105468745 beats the
    // quasi-Poisson 0.164918154762 — with qt(0.975, 4): 0.304810879854 to 3.280722789495 (rider-clustered.R).
    expect(rate).toMatchObject({ rate: 1, method: 'rider_clustered' });
    expect(rate.lower).toBeCloseTo(0.304810879854, 8);
    expect(rate.upper).toBeCloseTo(3.280722789495, 8);
  });

  it('when the clustered interval is narrower on one side, then that side keeps the exact Poisson bound', () => {
    // Act
    const rate = clusteredRate(sumsOf(firmwareB));
    // Assert: here the quasi-Poisson variance 0.125868055556 is the larger; R's clustered interval
    // 0.112464527469 to 1.075743521008, the exact one 0.094770902054 to 0.890572928296 (rider-clustered.R).
    expect(rate.method).toBe('rider_clustered');
    expect(rate.lower).toBeCloseTo(0.094770902054, 8);
    expect(rate.upper).toBeCloseTo(1.075743521008, 8);
  });

  it('when every rider has the same rate, then the exact Poisson interval is shown and says so', () => {
    // Arrange: 2 dropouts per hour for each of three riders: no residuals at all.
    const sums = sumsOf([
      [1, 1, 2],
      [2, 2, 4],
      [3, 1.5, 3],
    ]);
    // Act
    const rate = clusteredRate(sums);
    // Assert
    const exact = poissonRate(9, 4.5);
    expect(rate).toEqual({ rate: 2, lower: exact.lower, upper: exact.upper, method: 'poisson_exact' });
  });

  it('when there are no dropouts or one rider, then the exact interval is shown', () => {
    expect(
      clusteredRate(
        sumsOf([
          [1, 2, 0],
          [2, 3, 0],
        ]),
      ).method,
    ).toBe('poisson_exact');
    expect(
      clusteredRate(
        sumsOf([
          [1, 2, 5],
          [1, 3, 0],
        ]),
      ).method,
    ).toBe('poisson_exact');
  });

  it('when two firmware versions are compared, then the ratio takes the wider of the clustered and exact intervals and the larger p-value', () => {
    // Act
    const ratio = clusteredRateRatio(sumsOf(firmwareA), sumsOf(firmwareB));
    // Assert: R (rider-clustered.R): clustered 0.771960530759 to 10.707315556667 on Welch's
    // 6.987181219176 df, p 0.099301106692; poisson.test 0.927440903331 to 11.817442084651, p 0.067339882903.
    expect(ratio.ratio).toBeCloseTo(2.875, 10);
    expect(ratio.method).toBe('rider_clustered');
    expect(ratio.lower).toBeCloseTo(0.771960530759, 8);
    expect(ratio.upper).toBeCloseTo(11.817442084651, 6);
    expect(ratio.pValue).toBeCloseTo(0.099301106692, 8);
  });
});
