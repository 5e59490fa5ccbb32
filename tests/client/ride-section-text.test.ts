import { describe, expect, it } from 'vitest';
import { parseClock } from '@/features/submissions/lib/ride-clock';
import { sectionText } from '@/features/submissions/lib/section-text';

describe('typed ride times', () => {
  it('when a time is typed as h:mm:ss, m:ss, minutes or seconds, then it reads as seconds', () => {
    expect(parseClock('1:05:09')).toBe(3909);
    expect(parseClock('5:09')).toBe(309);
    expect(parseClock('12 min')).toBe(720);
    expect(parseClock(' 90 ')).toBe(90);
  });

  it('when the text is not a time, then it is null', () => {
    expect(parseClock('5:9')).toBeNull();
    expect(parseClock('1:75:00')).toBeNull();
    expect(parseClock('soon')).toBeNull();
  });
});

describe('the copied section line', () => {
  it('when a section has matched seconds, then the line names both meters, the difference and the peaks', () => {
    const text = sectionText(
      {
        fromSeconds: 0,
        toSeconds: 600,
        matchedSeconds: 598,
        aAverageWatts: 233.2,
        bAverageWatts: 232.1,
        differenceWatts: 1.1,
        differencePercent: 0.47,
        aPeakWatts: 612,
        bPeakWatts: 605,
        aRightBalancePercent: null,
        bRightBalancePercent: null,
      },
      { a: 'Spindle S2', b: 'Pedal P1' },
    );

    expect(text).toBe(
      '0:00–10:00 (598 s matched): Spindle S2 233 W against Pedal P1 232 W, difference +1.1 W (+0.5 %); peaks 612 W and 605 W.',
    );
  });
});
