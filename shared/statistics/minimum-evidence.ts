// Issue 6: below 3 accepted submissions or 2 distinct riders a figure is shown as
// "not enough data yet": one rider's habits (or one rider's meter) are not a model's.
export const MINIMUM_SUBMISSIONS = 3;
export const MINIMUM_RIDERS = 2;

export interface Evidence {
  submissionCount: number;
  distinctRiders: number;
}

export function hasMinimumEvidence({ submissionCount, distinctRiders }: Evidence): boolean {
  return submissionCount >= MINIMUM_SUBMISSIONS && distinctRiders >= MINIMUM_RIDERS;
}
