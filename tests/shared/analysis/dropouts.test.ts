import { describe, expect, it } from 'vitest';
import { analyseDropouts, dropoutEvents, silentWhileOtherActive } from '@shared/analysis/dropouts';
import type { SharedTimeline } from '@shared/analysis/timeline';

function timeline(aPower: number[], bPower: number[], aCadence = aPower.map(() => 90), bCadence = bPower.map(() => 90)): SharedTimeline {
  const nan = aPower.map(() => NaN);
  return {
    start: 0,
    length: aPower.length,
    aPower: Float64Array.from(aPower),
    bPower: Float64Array.from(bPower),
    aCadence: Float64Array.from(aCadence),
    bCadence: Float64Array.from(bCadence),
    aRightBalance: Float64Array.from(nan),
    bRightBalance: Float64Array.from(nan),
    temperature: null,
  };
}

const mask = (pattern: string) => Uint8Array.from(pattern, (c) => (c === '#' ? 1 : 0));

describe('dropout events', () => {
  it('when a device is silent for 3 s while the other pedals, then that is one event', () => {
    expect(dropoutEvents(mask('..###..'))).toEqual([{ startSeconds: 2, endSeconds: 5, durationSeconds: 3 }]);
  });

  it('when a device is silent for only 2 s, then there is no event', () => {
    expect(dropoutEvents(mask('..##...'))).toEqual([]);
  });

  it('when two runs are 1 s apart, then they merge into one event', () => {
    expect(dropoutEvents(mask('##.##...'))).toEqual([{ startSeconds: 0, endSeconds: 5, durationSeconds: 5 }]);
  });

  it('when two runs are 2 s apart, then they stay separate events', () => {
    expect(dropoutEvents(mask('###..###'))).toHaveLength(2);
  });

  it('when the other device reports under 50 W, then a silent second is not a dropout', () => {
    const own = Float64Array.from([0, NaN, 0, 0]);
    const other = Float64Array.from([49, 49, 50, 300]);

    expect(Array.from(silentWhileOtherActive(own, other, 50))).toEqual([0, 0, 1, 1]);
  });

  it('when A drops out and B drops cadence, then each side reports its own events and a rate per pedalling hour', () => {
    const aPower = Array.from({ length: 3600 }, (_, i) => (i >= 100 && i < 110 ? 0 : 200));
    const bPower = Array.from({ length: 3600 }, () => 210);
    const bCadence = Array.from({ length: 3600 }, (_, i) => (i >= 500 && i < 505 ? NaN : 90));

    const { dropouts, aPowerDropout } = analyseDropouts(timeline(aPower, bPower, undefined, bCadence));

    expect(dropouts.a.power).toMatchObject({ count: 1, seconds: 10, ratePerHour: 1 });
    expect(dropouts.b.power.count).toBe(0);
    expect(dropouts.b.cadence.events).toEqual([{ startSeconds: 500, endSeconds: 505, durationSeconds: 5 }]);
    expect(dropouts.pedallingSeconds).toBe(3600);
    expect(aPowerDropout[105]).toBe(1);
  });

  it('when both devices coast, then nothing counts as pedalling or dropout', () => {
    const { dropouts } = analyseDropouts(timeline([0, 0, 0, 0, 0], [0, 0, 0, 0, 0]));

    expect(dropouts.pedallingSeconds).toBe(0);
    expect(dropouts.a.power.count).toBe(0);
    expect(dropouts.a.power.ratePerHour).toBeNull();
  });
});
