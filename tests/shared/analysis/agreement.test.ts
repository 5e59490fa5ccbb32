import { linearRegression, mean as ssMean, sampleCorrelation, sampleStandardDeviation } from 'simple-statistics';
import { describe, expect, it } from 'vitest';
import { agreementOf, blandAltman, demingRegression, linConcordance, mean, pearson, sampleSd } from '@shared/analysis/agreement';

// Bland & Altman, Lancet 1986;327(8476):307–310, Table 1: peak expiratory flow (l/min),
// first reading of each of 17 subjects with the Wright and the mini Wright meter.
const WRIGHT = [494, 395, 516, 434, 476, 557, 413, 442, 650, 433, 417, 656, 267, 478, 178, 423, 427];
const MINI_WRIGHT = [512, 430, 520, 428, 500, 600, 364, 380, 658, 445, 432, 626, 260, 477, 259, 350, 451];
const DIFFERENCES = WRIGHT.map((value, i) => value - MINI_WRIGHT[i]);

describe('Bland–Altman agreement on the 1986 peak-flow data', () => {
  it('when the Wright and mini Wright readings are compared, then the mean difference and SD match the paper', () => {
    const result = blandAltman(DIFFERENCES);

    // Bland & Altman 1986: mean difference −2.1 l/min, SD 38.8 l/min.
    expect(result?.mean).toBeCloseTo(-2.1, 1);
    expect(result?.sd).toBeCloseTo(38.8, 1);
  });

  it('when limits are taken at ±2 SD as in the paper, then they are −79.7 to 75.5', () => {
    const result = blandAltman(DIFFERENCES)!;

    // Bland & Altman 1986 used mean ± 2 SD: −79.7 to 75.5 l/min.
    expect(result.mean - 2 * result.sd).toBeCloseTo(-79.7, 0);
    expect(result.mean + 2 * result.sd).toBeCloseTo(75.5, 0);
  });

  it('when limits of agreement are reported, then they are mean ± 1.96 SD', () => {
    const result = blandAltman(DIFFERENCES)!;

    expect(result.lower).toBeCloseTo(result.mean - 1.96 * result.sd, 10);
    expect(result.upper).toBeCloseTo(result.mean + 1.96 * result.sd, 10);
  });

  it('when the correlation of the two meters is computed, then r = 0.94', () => {
    // Bland & Altman 1986: r = 0.94 for these readings.
    expect(pearson(WRIGHT, MINI_WRIGHT)).toBeCloseTo(0.94, 2);
  });

  it("when Lin's concordance is computed, then it is about 0.9427", () => {
    // Lin, Biometrics 1989 (definition, moments over n); value computed independently, not published.
    expect(linConcordance(WRIGHT, MINI_WRIGHT)).toBeCloseTo(0.9427, 4);
  });

  it('when blocks are summarised, then agreement reports the same statistics in watts', () => {
    const blocks = WRIGHT.map((a, i) => ({ startSeconds: 30 * i, aWatts: a, bWatts: MINI_WRIGHT[i] }));

    const agreement = agreementOf(blocks);

    expect(agreement.blockCount).toBe(17);
    expect(agreement.meanDifferenceWatts).toBeCloseTo(-2.1, 1);
    expect(agreement.sdWatts).toBeCloseTo(38.8, 1);
    expect(agreement.concordance).toBeCloseTo(0.9427, 4);
  });
});

describe('statistics against simple-statistics', () => {
  const x = [212.5, 180.1, 305.7, 250.2, 199.9, 410.3, 160.4, 275.8, 330.0, 222.2];
  const y = [220.1, 176.4, 318.2, 249.9, 210.5, 425.0, 158.8, 290.1, 335.7, 230.0];

  it('when mean, SD and correlation are computed, then they equal the reference library', () => {
    expect(mean(x)).toBeCloseTo(ssMean(x), 10);
    expect(sampleSd(x)).toBeCloseTo(sampleStandardDeviation(x), 10);
    expect(pearson(x, y)).toBeCloseTo(sampleCorrelation(x, y), 10);
  });

  it('when Deming regression is fitted, then its slope lies between the two least-squares slopes', () => {
    const yOnX = linearRegression(x.map((v, i) => [v, y[i]])).m;
    const xOnY = linearRegression(y.map((v, i) => [v, x[i]])).m;

    const deming = demingRegression(x, y)!;

    expect(deming.slope).toBeGreaterThan(yOnX);
    expect(deming.slope).toBeLessThan(1 / xOnY);
  });

  it('when the axes are swapped, then the Deming slope (ratio 1) is the reciprocal', () => {
    const forward = demingRegression(x, y)!;
    const backward = demingRegression(y, x)!;

    expect(forward.slope * backward.slope).toBeCloseTo(1, 10);
  });

  it('when the points lie on a line, then Deming regression returns that line', () => {
    const onLine = x.map((v) => 1.03 * v - 4);

    const deming = demingRegression(x, onLine)!;

    expect(deming.slope).toBeCloseTo(1.03, 10);
    expect(deming.intercept).toBeCloseTo(-4, 8);
  });

  it('when there is only one block, then agreement statistics are null rather than NaN', () => {
    const agreement = agreementOf([{ startSeconds: 0, aWatts: 200, bWatts: 198 }]);

    expect(agreement.sdWatts).toBeNull();
    expect(agreement.pearsonR).toBeNull();
    expect(agreement.deming).toBeNull();
  });
});
