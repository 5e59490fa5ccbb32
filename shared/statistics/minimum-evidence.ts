// Below 3 riders (and 3 accepted rides) a figure is shown as "not enough riders yet":
// the rider's unit is the unit of evidence (issue 15), and one or two riders' units,
// installations and partner meters are not a model's. Three riders give a rider-level
// t interval two degrees of freedom.
export const MINIMUM_SUBMISSIONS = 3;
export const MINIMUM_RIDERS = 3;

export interface Evidence {
  submissionCount: number;
  distinctRiders: number;
}

export function hasMinimumEvidence({ submissionCount, distinctRiders }: Evidence): boolean {
  return submissionCount >= MINIMUM_SUBMISSIONS && distinctRiders >= MINIMUM_RIDERS;
}
