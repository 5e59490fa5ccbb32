import { describe, expect, it } from 'vitest';
import { medianOfHistogram } from '../../../server/features/statistics/cadence-median';
import { emptySums } from '../../../server/features/statistics/contributions';
import { addRiderTerms, emptyRiderTerms, riderTerms } from '../../../server/features/statistics/rider-sums';
import { biasWeight, summariseBiasSums } from '../../../shared/statistics/weighted-bias';
import { pooledAgreementFromSums, type StatisticsRow } from '../../../server/features/statistics/figures';
import { pooledAgreement } from '../../../shared/statistics/pooled-agreement';

describe('figures from running sums', () => {
  it('when pooled limits of agreement come from sums, then they equal the list-based Bland–Altman computation', () => {
    // Arrange
    const submissions = [
      { meanDifference: 1.2, sd: 2.5, blockCount: 40 },
      { meanDifference: -0.4, sd: 3.1, blockCount: 12 },
      { meanDifference: 2.9, sd: 1.7, blockCount: 75 },
      { meanDifference: 0.3, sd: null, blockCount: 1 },
    ];
    const row: StatisticsRow = { ...emptySums(), ...emptyRiderTerms(), distinct_riders: 3, median_cadence_lag_seconds: null };
    for (const s of submissions) {
      row.agreement_submissions += 1;
      row.agreement_blocks += s.blockCount;
      row.agreement_blocks_squared += s.blockCount ** 2;
      row.agreement_within_ss += (s.blockCount - 1) * (s.sd ?? 0) ** 2;
      row.agreement_sum_difference += s.blockCount * s.meanDifference;
      row.agreement_sum_difference_squared += s.blockCount * s.meanDifference ** 2;
    }
    // Act
    const fromSums = pooledAgreementFromSums(row)!;
    const fromList = pooledAgreement(submissions)!;
    // Assert
    expect(fromSums.meanDifferencePercent).toBeCloseTo(fromList.meanDifference, 10);
    expect(fromSums.sdPercent).toBeCloseTo(fromList.sd, 10);
    expect(fromSums.lowerPercent).toBeCloseTo(fromList.lower, 10);
    expect(fromSums.upperPercent).toBeCloseTo(fromList.upper, 10);
  });

  it('when a histogram of cadence lags is given, then its median is the ordinary median of the values', () => {
    expect(medianOfHistogram([])).toBeNull();
    expect(
      medianOfHistogram([
        { value: 2, count: 1 },
        { value: -1, count: 2 },
      ]),
    ).toBe(-1);
    expect(
      medianOfHistogram([
        { value: 1, count: 2 },
        { value: 3, count: 2 },
      ]),
    ).toBe(2);
    expect(
      medianOfHistogram([
        { value: 0, count: 0 },
        { value: 4, count: 1 },
      ]),
    ).toBe(4);
  });

  it('when riders have several rides, then the bias is the two-stage rider-level mean with the t interval R gives', () => {
    // Arrange: the rides of tests/shared/statistics/reference/rider-clustered.R, [rider, hours, bias %];
    // every rider has at least 4 capped hours, so the riders weigh the same.
    const rides: [number, number, number][] = [
      [1, 2, 1.2],
      [1, 3, 2.0],
      [2, 2, -0.4],
      [2, 2, 0.3],
      [2, 1, 0.9],
      [3, 4.5, 1.6],
      [3, 1, 2.4],
      [4, 2, 0.1],
      [4, 2.5, 0.7],
    ];
    const scope = emptyRiderTerms();
    for (const rider of [1, 2, 3, 4]) {
      const own = rides.filter(([r]) => r === rider);
      const hours = own.reduce((sum, [, h]) => sum + h, 0);
      addRiderTerms(
        scope,
        riderTerms({
          contribution_count: own.length,
          bias_count: own.length,
          sum_weight: own.reduce((sum, [, h]) => sum + biasWeight(h), 0),
          sum_weighted_bias: own.reduce((sum, [, h, b]) => sum + biasWeight(h) * b, 0),
          pedalling_hours: hours,
          power_dropouts: 0,
          cadence_dropouts: 0,
        }),
        1,
      );
    }
    // Act
    const summary = summariseBiasSums(
      {
        submissionCount: scope.rider_bias_count,
        pedallingHours: 0,
        sumWeight: scope.rider_sum_weight,
        sumWeightSquared: scope.rider_sum_weight_squared,
        sumWeightCubed: scope.rider_sum_weight_cubed,
        sumWeightedBias: scope.rider_sum_weighted_bias,
        sumWeightedBiasSquared: scope.rider_sum_weighted_bias_squared,
      },
      { distinctRiders: scope.rider_bias_count },
    );
    // Assert: R t.test of the rider means 1.68, 0.14, 1.76, 0.4333: mean 1.003333333333,
    // −0.328190774502 to 2.334857441168 on 3 df (rider-clustered.R).
    if (!summary.enough) throw new Error('expected enough riders');
    expect(summary.meanBiasPercent).toBeCloseTo(1.003333333333, 10);
    expect(summary.degreesOfFreedom).toBeCloseTo(3, 10);
    expect(summary.lowerPercent).toBeCloseTo(-0.328190774502, 9);
    expect(summary.upperPercent).toBeCloseTo(2.334857441168, 9);
  });
});
