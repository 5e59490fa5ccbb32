import { describe, expect, it } from 'vitest';
import { medianOfHistogram } from '../../../server/features/statistics/cadence-median';
import { emptySums } from '../../../server/features/statistics/contributions';
import { emptyRiderTerms } from '../../../server/features/statistics/rider-sums';
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
    expect(medianOfHistogram([{ value: 2, count: 1 }, { value: -1, count: 2 }])).toBe(-1);
    expect(medianOfHistogram([{ value: 1, count: 2 }, { value: 3, count: 2 }])).toBe(2);
    expect(medianOfHistogram([{ value: 0, count: 0 }, { value: 4, count: 1 }])).toBe(4);
  });
});
