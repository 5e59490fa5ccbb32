import { describe, expect, it } from 'vitest';
import { kaplanMeier, logRankTest, type SurvivalObservation } from '@shared/statistics/survival';

// The 6-MP leukaemia remission data (Freireich et al., Blood 1963;21:699–716) as R's
// MASS::gehan holds them, in weeks; "+" marks a remission still going (censored).
// Every check value below comes from tests/shared/statistics/reference/survival-gehan.R
// (R 4.2 with survival and MASS from Debian's packages).
const parse = (text: string): SurvivalObservation[] =>
  text.split(' ').map((entry) => ({ time: Number.parseFloat(entry), event: !entry.endsWith('+') }));
const sixMp = parse('10 7 32+ 23 22 6 16 34+ 32+ 25+ 11+ 20+ 19+ 6 17+ 35+ 6 13 9+ 6+ 10+');
const control = parse('1 22 3 12 8 17 2 11 8 12 2 5 4 15 8 23 5 11 4 1 8');

describe('Kaplan–Meier with the log-log interval', () => {
  it('when the 6-MP group is estimated, then every step matches survfit(conf.type = "log-log")', () => {
    const curve = kaplanMeier(sixMp);

    const steps = curve.steps.filter((step) => step.events > 0);
    // survival-gehan.R: time, n.risk, n.event, surv, lower, upper of treat=6-MP
    const expected = [
      [6, 21, 3, 0.8571428571429, 0.61971795526598, 0.951551747647],
      [7, 17, 1, 0.8067226890756, 0.56314656462223, 0.922809019203],
      [10, 15, 1, 0.7529411764706, 0.50319951079996, 0.889361835169],
      [13, 12, 1, 0.6901960784314, 0.43161022248618, 0.849065963349],
      [16, 11, 1, 0.6274509803922, 0.3675108559875, 0.804912189472],
      [22, 7, 1, 0.5378151260504, 0.26777893676713, 0.746790717635],
      [23, 6, 1, 0.4481792717087, 0.18805200595923, 0.680142628495],
    ];
    expect(steps.map((s) => [s.time, s.atRisk, s.events])).toEqual(expected.map(([t, n, d]) => [t, n, d]));
    for (const [i, [, , , surv, lower, upper]] of expected.entries()) {
      expect(steps[i]!.survival).toBeCloseTo(surv!, 10);
      expect(steps[i]!.lower).toBeCloseTo(lower!, 10);
      expect(steps[i]!.upper).toBeCloseTo(upper!, 10);
    }
  });

  it('when the medians are read, then they match survfit: 23 weeks (13 to not reached) and 8 weeks (4 to 11)', () => {
    // survival-gehan.R: median, 0.95LCL, 0.95UCL per group
    expect(kaplanMeier(sixMp).median).toEqual({ estimate: 23, lower: 13, upper: null });
    expect(kaplanMeier(control).median).toEqual({ estimate: 8, lower: 4, upper: 11 });
    expect(kaplanMeier(control)).toMatchObject({ count: 21, events: 21 });
  });

  it('when the control group is estimated, then the tail before the last event matches survfit', () => {
    const steps = kaplanMeier(control).steps;
    // survival-gehan.R: treat=control at 17 and 22 weeks
    expect(steps.find((s) => s.time === 17)).toMatchObject({ atRisk: 3 });
    expect(steps.find((s) => s.time === 17)!.lower).toBeCloseTo(0.01625926021225, 10);
    expect(steps.find((s) => s.time === 22)!.upper).toBeCloseTo(0.197044905699, 10);
    expect(steps.at(-1)!.survival).toBe(0);
  });

  it('when nothing has happened yet, then the curve stays at one and no median exists', () => {
    const curve = kaplanMeier([
      { time: 100, event: false },
      { time: 250, event: false },
    ]);
    expect(curve.steps.every((s) => s.survival === 1)).toBe(true);
    expect(curve.median).toEqual({ estimate: null, lower: null, upper: null });
  });

  it('when a time is negative, then it is refused', () => {
    expect(() => kaplanMeier([{ time: -1, event: true }])).toThrow(RangeError);
  });
});

describe('log-rank test', () => {
  it('when 6-MP is compared with control, then observed, expected and χ² match survdiff', () => {
    const test = logRankTest(sixMp, control);
    // survival-gehan.R: observed 9 21, expected 19.250500948 10.749499052, chisq 16.7929409892, p 4.16880910934e-05
    expect(test.observed).toEqual([9, 21]);
    expect(test.expected[0]).toBeCloseTo(19.250500948, 8);
    expect(test.expected[1]).toBeCloseTo(10.749499052, 8);
    expect(test.chiSquare).toBeCloseTo(16.7929409892, 8);
    expect(test.pValue).toBeCloseTo(4.16880910934e-5, 12);
  });

  it('when both groups are the same batteries, then there is nothing to tell apart', () => {
    const test = logRankTest(sixMp, sixMp);
    expect(test.chiSquare).toBeCloseTo(0, 12);
    expect(test.pValue).toBeCloseTo(1, 12);
  });
});
