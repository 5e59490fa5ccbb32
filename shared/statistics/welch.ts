import { mean, sampleStandardDeviation } from 'simple-statistics';
import { studentTQuantile, studentTTwoSidedP } from './distributions';

export interface GroupSummary {
  n: number;
  mean: number;
  sd: number;
}

export interface WelchTest {
  /** mean1 − mean2 */
  difference: number;
  standardError: number;
  t: number;
  degreesOfFreedom: number;
  pValue: number;
  /** Confidence interval of the difference. */
  lower: number;
  upper: number;
}

/**
 * Welch's unequal-variance t-test from summary statistics: t = (m1 − m2) / √(s1²/n1 + s2²/n2)
 * with the Welch–Satterthwaite degrees of freedom (Welch, Biometrika 1947;34:28–35;
 * NIST/SEMATECH e-Handbook of Statistical Methods §1.3.5.3). Null when a group has
 * fewer than two members or both are without spread.
 */
export function welchTest(group1: GroupSummary, group2: GroupSummary, confidence = 0.95): WelchTest | null {
  if (group1.n < 2 || group2.n < 2) return null;
  const v1 = (group1.sd * group1.sd) / group1.n;
  const v2 = (group2.sd * group2.sd) / group2.n;
  const variance = v1 + v2;
  if (!(variance > 0)) return null;
  const standardError = Math.sqrt(variance);
  const difference = group1.mean - group2.mean;
  const degreesOfFreedom = (variance * variance) / ((v1 * v1) / (group1.n - 1) + (v2 * v2) / (group2.n - 1));
  const t = difference / standardError;
  const halfWidth = studentTQuantile(1 - (1 - confidence) / 2, degreesOfFreedom) * standardError;
  return {
    difference,
    standardError,
    t,
    degreesOfFreedom,
    pValue: studentTTwoSidedP(t, degreesOfFreedom),
    lower: difference - halfWidth,
    upper: difference + halfWidth,
  };
}

/** Welch's t-test from the raw values of the two groups. */
export function welchTestFromSamples(sample1: number[], sample2: number[], confidence = 0.95): WelchTest | null {
  if (sample1.length < 2 || sample2.length < 2) return null;
  return welchTest(summarise(sample1), summarise(sample2), confidence);
}

function summarise(sample: number[]): GroupSummary {
  return { n: sample.length, mean: mean(sample), sd: sampleStandardDeviation(sample) };
}
