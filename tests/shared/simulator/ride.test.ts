import { describe, expect, it } from 'vitest';
import { simulateRide, type RideProfile } from '@shared/simulator/ride';

const START = Date.UTC(2024, 5, 1, 7) / 1000;

function mean(values: ArrayLike<number>, from = 0, to = values.length): number {
  let sum = 0;
  for (let i = from; i < to; i += 1) sum += values[i];
  return sum / (to - from);
}

describe('simulateRide', () => {
  it('when called twice with the same seed, then the ride is identical', () => {
    const first = simulateRide({ seed: 11, durationSeconds: 3600, startTime: START, profile: 'race' });
    const second = simulateRide({ seed: 11, durationSeconds: 3600, startTime: START, profile: 'race' });

    expect(second.power).toEqual(first.power);
    expect(second.cadence).toEqual(first.cadence);
    expect(second.rightShare).toEqual(first.rightShare);
  });

  it.each<RideProfile>(['endurance', 'intervals', 'race', 'indoor'])(
    'when the profile is %s, then every second has a value and power is zero exactly when cadence is',
    (profile) => {
      const ride = simulateRide({ seed: 3, durationSeconds: 5400, startTime: START, profile });

      expect(ride.power).toHaveLength(5400);
      for (let t = 0; t < ride.power.length; t += 1) {
        expect(ride.power[t] === 0).toBe(ride.cadence[t] === 0);
      }
    },
  );

  it('when a rider with a 250 W FTP rides endurance, then the average lands in the endurance range', () => {
    const ride = simulateRide({ seed: 5, durationSeconds: 7200, startTime: START, profile: 'endurance', riderFtpWatts: 250 });

    const average = mean(ride.power);

    expect(average).toBeGreaterThan(120);
    expect(average).toBeLessThan(210);
  });

  it('when the ride starts, then the warm-up is easier than the ride that follows', () => {
    const ride = simulateRide({ seed: 8, durationSeconds: 7200, startTime: START, profile: 'intervals' });

    expect(mean(ride.power, 0, 300)).toBeLessThan(mean(ride.power, 900, 6600));
  });

  it('when it is a race, then it holds sprints above twice the average and coasting stretches', () => {
    const ride = simulateRide({ seed: 2, durationSeconds: 3600, startTime: START, profile: 'race' });

    const peak = Math.max(...ride.power);
    const coastingSeconds = ride.power.filter((p) => p === 0).length;

    expect(peak).toBeGreaterThan(2 * mean(ride.power));
    expect(coastingSeconds).toBeGreaterThan(60);
  });

  it('when it is indoors, then the rider never coasts mid-ride', () => {
    const ride = simulateRide({ seed: 9, durationSeconds: 3600, startTime: START, profile: 'indoor' });

    expect(ride.power.filter((p) => p === 0)).toHaveLength(0);
  });

  it('when the rider pushes 53 % with the right leg, then the mean right share is near 0.53', () => {
    const ride = simulateRide({ seed: 4, durationSeconds: 3600, startTime: START, balanceRightPercent: 53 });

    expect(mean(ride.rightShare)).toBeCloseTo(0.53, 2);
  });
});
