import { describe, expect, it } from 'vitest';
import {
  BALANCE_RIGHT_FLAG,
  CHANGE_ONLY_MAX_GAP_SECONDS,
  DRIVETRAIN_LOSS_PERCENT,
  encodeBalance,
  INVALID_BALANCE,
  recordWithMeter,
  type MeterModelOptions,
} from '@shared/simulator/meter';
import { simulateRide } from '@shared/simulator/ride';

const START = Date.UTC(2024, 5, 1, 7) / 1000;
const ride = simulateRide({ seed: 21, durationSeconds: 3600, startTime: START, profile: 'endurance', balanceRightPercent: 52 });

function sum(values: ArrayLike<number>): number {
  let total = 0;
  for (let i = 0; i < values.length; i += 1) total += values[i];
  return total;
}

function record(options: Partial<MeterModelOptions>, seed = 1) {
  return recordWithMeter(ride, { position: 'total', ...options }, seed);
}

describe('recordWithMeter', () => {
  it('when a meter reads 3 % high, then its power sum is 3 % above a true meter', () => {
    const trueMeter = record({});
    const highMeter = record({ scale: 1.03 });

    const ratio = sum(highMeter.power) / sum(trueMeter.power);

    expect(ratio).toBeCloseTo(1.03, 3);
  });

  it('when a meter has no error, then its sum matches the true ride within rounding', () => {
    const recording = record({});

    expect(sum(recording.power) / sum(ride.power)).toBeCloseTo(1, 2);
  });

  it('when a hub measures after the drivetrain, then it reads about 2.1 % low', () => {
    // Smit et al., Sports Engineering 2023: crank to rear wheel loses 2.1 % ± 1.5 %.
    const hub = record({ drivetrainLossPercent: DRIVETRAIN_LOSS_PERCENT });

    expect(sum(hub.power) / sum(record({}).power)).toBeCloseTo(1 - 0.021, 3);
  });

  it('when a left-only meter rides with a rider pushing 52 % right, then it reports twice the left leg: about 4 % low', () => {
    const left = record({ position: 'left', noiseWatts: 0, noisePercent: 0 });

    expect(sum(left.power) / sum(ride.power)).toBeCloseTo(0.96, 2);
  });

  it('when a dual meter records, then each pedalling second carries balance with the right flag', () => {
    const dual = record({ position: 'dual' });

    const rightPercents: number[] = [];
    for (const [i, watts] of dual.power.entries()) {
      const balance = dual.balance![i];
      if (watts === 0) {
        expect(balance).toBe(INVALID_BALANCE);
        continue;
      }
      expect(balance & BALANCE_RIGHT_FLAG).toBe(BALANCE_RIGHT_FLAG);
      rightPercents.push(balance & 0x7f);
    }

    expect(sum(rightPercents) / rightPercents.length).toBeCloseTo(52, 0);
  });

  it('when a balance of 52 % right is encoded, then the byte is 0x80 | 52 (ANT+ Bicycle Power profile, page 0x10)', () => {
    expect(encodeBalance(52)).toBe(0x80 + 52);
  });

  it('when a single-sided meter records, then it carries no balance', () => {
    expect(record({ position: 'left' }).balance).toBeUndefined();
  });

  it('when the clock runs 7 s ahead, then every timestamp is 7 s after the true time', () => {
    const recording = record({ clockOffsetSeconds: 7 });

    expect(recording.timestamps[0]).toBe(START + 7);
    expect(recording.timestamps.at(-1)).toBe(START + 3599 + 7);
  });

  it('when the device starts 60 s late and stops 90 s early, then it records only that window', () => {
    const recording = record({ startOffsetSeconds: 60, endOffsetSeconds: 90 });

    expect(recording.timestamps[0]).toBe(START + 60);
    expect(recording.timestamps.at(-1)).toBe(START + 3599 - 90);
    expect(recording.timestamps).toHaveLength(3600 - 150);
  });

  it('when cadence lags by 3 s, then the reported cadence is the true cadence 3 s earlier', () => {
    const recording = record({ cadenceLagSeconds: 3 });

    let matches = 0;
    for (let t = 3; t < 3600; t += 1) if (Math.abs(recording.cadence[t] - ride.cadence[t - 3]) <= 2) matches += 1;

    expect(matches / 3597).toBeGreaterThan(0.99);
  });

  it('when explicit dropouts are given, then power or cadence is zero for exactly those seconds', () => {
    const recording = record({
      dropouts: [
        { kind: 'power', startSecond: 1000, durationSeconds: 5 },
        { kind: 'cadence', startSecond: 2000, durationSeconds: 4 },
      ],
    });

    expect(Array.from(recording.power.subarray(1000, 1005))).toEqual([0, 0, 0, 0, 0]);
    expect(Array.from(recording.cadence.subarray(2000, 2004))).toEqual([0, 0, 0, 0]);
    expect(recording.events.map((event) => event.timestamp)).toEqual([START + 1000, START + 2000]);
  });

  it('when dropout rates are set, then events last at least 3 s and fall where the rider pedals hard', () => {
    const recording = record({ powerDropoutsPerHour: 6, cadenceDropoutsPerHour: 6 });

    expect(recording.events.length).toBeGreaterThan(4);
    for (const event of recording.events) {
      expect(event.durationSeconds).toBeGreaterThanOrEqual(3);
      for (let t = event.startSecond; t < event.startSecond + event.durationSeconds; t += 1) {
        if (event.kind === 'power') expect(ride.power[t]).toBeGreaterThanOrEqual(100);
        else expect(ride.cadence[t]).toBeGreaterThanOrEqual(45);
      }
    }
  });

  it('when recording change-only, then records are fewer, gaps stay within the limit and sums stay close', () => {
    const everySecond = record({ smoothingSeconds: 3 });
    const changeOnly = record({ smoothingSeconds: 3, recordingMode: 'change-only' });

    const gaps = changeOnly.timestamps.slice(1).map((t, i) => t - changeOnly.timestamps[i]);
    const carried = carryToEverySecond(changeOnly.timestamps, changeOnly.power);

    expect(changeOnly.timestamps.length).toBeLessThan(everySecond.timestamps.length * 0.9);
    expect(Math.max(...gaps)).toBeLessThanOrEqual(CHANGE_ONLY_MAX_GAP_SECONDS);
    expect(Math.min(...gaps)).toBe(1);
    expect(sum(carried) / sum(everySecond.power)).toBeCloseTo(1, 2);
  });

  it('when the recording device smooths over 5 s, then second-to-second variation drops', () => {
    const raw = record({});
    const smoothed = record({ smoothingSeconds: 5 });

    expect(meanAbsoluteStep(smoothed.power)).toBeLessThan(meanAbsoluteStep(raw.power) * 0.6);
  });

  it('when the seed is the same, then the recording is identical', () => {
    const options = { position: 'dual', powerDropoutsPerHour: 3, recordingMode: 'change-only' } as const;

    expect(recordWithMeter(ride, options, 9)).toEqual(recordWithMeter(ride, options, 9));
  });
});

function carryToEverySecond(timestamps: Float64Array, values: Uint16Array): number[] {
  const carried: number[] = [];
  for (let i = 0; i < timestamps.length; i += 1) {
    const until = i + 1 < timestamps.length ? timestamps[i + 1] : timestamps[i] + 1;
    for (let t = timestamps[i]; t < until; t += 1) carried.push(values[i]);
  }
  return carried;
}

function meanAbsoluteStep(values: Uint16Array): number {
  let total = 0;
  for (let i = 1; i < values.length; i += 1) total += Math.abs(values[i] - values[i - 1]);
  return total / (values.length - 1);
}
