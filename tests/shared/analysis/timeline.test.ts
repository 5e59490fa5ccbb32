import { describe, expect, it } from 'vitest';
import { resample, sharedTimeline, toSecondGrid } from '@shared/analysis/timeline';
import { rideStream, RIDE_START } from './ride-streams';

describe('1 Hz timeline', () => {
  it('when a device records only on change with gaps up to 5 s, then the last value carries across', () => {
    const times = Float64Array.from([0, 5, 6]);
    const values = Float64Array.from([200, 250, 300]);

    const grid = resample(times, values, 0, 7);

    expect(Array.from(grid)).toEqual([200, 200, 200, 200, 200, 250, 300]);
  });

  it('when a gap is longer than 5 s, then the seconds inside it are no data', () => {
    const times = Float64Array.from([0, 6]);
    const values = Float64Array.from([200, 250]);

    const grid = resample(times, values, 0, 7);

    expect(grid[0]).toBe(200);
    expect(Array.from(grid.subarray(1, 6)).every(Number.isNaN)).toBe(true);
    expect(grid[6]).toBe(250);
  });

  it('when a device records several samples in one second, then the second holds their mean', () => {
    const times = Float64Array.from([10, 10.25, 10.5, 10.75]);
    const values = Float64Array.from([100, 200, 300, 400]);

    const grid = resample(times, values, 10, 1);

    expect(grid[0]).toBe(250);
  });

  it('when A runs 30 s ahead, then the shared timeline puts A one second at a time beside B on B’s clock', () => {
    const a = toSecondGrid(rideStream({ power: [1, 2, 3, 4, 5, 6], start: RIDE_START + 30 }));
    const b = toSecondGrid(rideStream({ power: [10, 20, 30, 40, 50, 60], start: RIDE_START + 2 }));

    const timeline = sharedTimeline(a, b, 30);

    expect(timeline.start).toBe(RIDE_START + 2);
    expect(Array.from(timeline.aPower)).toEqual([3, 4, 5, 6]);
    expect(Array.from(timeline.bPower)).toEqual([10, 20, 30, 40]);
  });
});
