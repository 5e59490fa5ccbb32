// One meter's view of a true ride, as its recording device writes it down: the
// meter's scale error and noise, what its position can measure, the head unit's
// smoothing, clock and recording habits, and injected dropouts.
import { planDropouts, type DropoutRates, type DropoutWindow } from './dropouts';
import { createRandom, deriveSeed } from './random';
import type { TrueRide } from './ride';

export type MeterPosition = 'left' | 'right' | 'dual' | 'total';
export type RecordingMode = 'every-second' | 'change-only';

/**
 * Crank-to-rear-wheel drivetrain loss, for meters that measure after the chain
 * (hubs, trainers): 2.1 % ± 1.5 % at 100–400 W (Smit et al., Sports Engineering 2023).
 */
export const DRIVETRAIN_LOSS_PERCENT = 2.1;

/** Change-only recording never leaves a gap longer than this (issue 3 carries ≤ 5 s). */
export const CHANGE_ONLY_MAX_GAP_SECONDS = 4;
const CHANGE_ONLY_POWER_STEP_WATTS = 8;
const CHANGE_ONLY_CADENCE_STEP_RPM = 3;

export interface MeterModelOptions extends DropoutRates {
  /** What the meter measures: one leg (reported doubled), both legs independently, or the total. */
  position: MeterPosition;
  /** Multiplies the true power: 1.02 reads 2 % high. */
  scale?: number;
  /** The scale creeps by this many percent per hour of the ride (a meter warming up unzeroed). */
  driftPercentPerHour?: number;
  /** The air around the meter (and the head unit's thermometer): °C at the ride's start, changing linearly by the hour. */
  temperature?: AmbientTemperature;
  /** A meter whose compensation fails in the cold: it reads low by this many percent per °C below `belowCelsius`. */
  coldResponse?: { belowCelsius: number; percentPerDegree: number };
  /** Noise SD in W, added in quadrature to noisePercent. */
  noiseWatts?: number;
  /** Noise SD in % of the true power. */
  noisePercent?: number;
  /** Loss between crank and meter in %; DRIVETRAIN_LOSS_PERCENT for hubs and trainers. */
  drivetrainLossPercent?: number;
  /** The recording device's trailing power average in s (1 = none); delays power by (n − 1) / 2 s. */
  smoothingSeconds?: number;
  /** The device stamps an event at T + offset when the true time is T (whole seconds). */
  clockOffsetSeconds?: number;
  /** The reported cadence trails the true cadence by this many whole seconds. */
  cadenceLagSeconds?: number;
  /** Explicit dropout events; when given, the per-hour rates are not used. */
  dropouts?: DropoutWindow[];
  recordingMode?: RecordingMode;
  /** The device starts recording this many seconds after the ride starts. */
  startOffsetSeconds?: number;
  /** The device stops recording this many seconds before the ride ends. */
  endOffsetSeconds?: number;
}

export interface AmbientTemperature {
  startCelsius: number;
  changePerHour?: number;
}

/** °C at one second of the ride. */
export function ambientCelsius(temperature: AmbientTemperature, second: number): number {
  return temperature.startCelsius + ((temperature.changePerHour ?? 0) * second) / 3600;
}

/** The meter's gain from the cold at one second of the ride: 1 when it has no cold response or it is warm enough. */
export function coldGain(meter: MeterModelOptions, second: number): number {
  if (!meter.coldResponse || !meter.temperature) return 1;
  const below = Math.max(0, meter.coldResponse.belowCelsius - ambientCelsius(meter.temperature, second));
  return 1 - (meter.coldResponse.percentPerDegree * below) / 100;
}

export interface DropoutEvent extends DropoutWindow {
  /** Unix seconds on the recording device's clock. */
  timestamp: number;
}

export interface MeterRecording {
  position: MeterPosition;
  /** Unix seconds on the device's clock, one per record; regular or change-only. */
  timestamps: Float64Array;
  /** Whole watts as written to the file. */
  power: Uint16Array;
  /** Whole rpm as written to the file. */
  cadence: Uint8Array;
  /** Dual meters only: FIT left_right_balance bytes, 0xFF where there is none (no power). */
  balance?: Uint8Array;
  events: DropoutEvent[];
}

export const INVALID_BALANCE = 0xff;
/** ANT+ Bicycle Power device profile, page 0x10: bit 7 set = the percentage is the right leg's. */
export const BALANCE_RIGHT_FLAG = 0x80;

export function encodeBalance(rightPercent: number): number {
  return BALANCE_RIGHT_FLAG | Math.min(100, Math.max(0, Math.round(rightPercent)));
}

/** Seconds of the true ride that the device records, both ends included. */
export function recordingWindow(ride: TrueRide, meter: MeterModelOptions): { firstSecond: number; lastSecond: number } {
  return {
    firstSecond: Math.max(0, Math.round(meter.startOffsetSeconds ?? 0)),
    lastSecond: ride.power.length - 1 - Math.max(0, Math.round(meter.endOffsetSeconds ?? 0)),
  };
}

export function recordWithMeter(ride: TrueRide, meter: MeterModelOptions, seed: number): MeterRecording {
  const { firstSecond, lastSecond } = recordingWindow(ride, meter);
  if (lastSecond < firstSecond) throw new RangeError('the start and end offsets leave nothing to record');
  const length = lastSecond - firstSecond + 1;
  const dropouts = meter.dropouts ?? planDropouts(ride, meter, firstSecond, lastSecond, createRandom(deriveSeed(seed, 'dropouts')));

  const measured = measurePower(ride, meter, firstSecond, length, createRandom(deriveSeed(seed, 'noise')).normal);
  const smoothing = Math.max(1, Math.round(meter.smoothingSeconds ?? 1));
  const left = trailingMean(measured.left, smoothing);
  const right = trailingMean(measured.right, smoothing);
  const cadence = measureCadence(ride, meter, firstSecond, length, createRandom(deriveSeed(seed, 'cadence')).normal);

  const power = new Uint16Array(length);
  const balance = meter.position === 'dual' ? new Uint8Array(length) : undefined;
  for (let i = 0; i < length; i += 1) {
    const total = left[i] + right[i];
    power[i] = Math.min(65534, Math.round(total));
    if (balance) balance[i] = power[i] > 0 ? encodeBalance((100 * right[i]) / total) : INVALID_BALANCE;
  }

  // Applied after smoothing: a head unit that hears nothing records nothing, whatever
  // its averaging, and the event keeps its exact duration.
  for (const dropout of dropouts) {
    const from = Math.max(0, dropout.startSecond - firstSecond);
    const to = Math.min(length, dropout.startSecond + dropout.durationSeconds - firstSecond);
    if (dropout.kind === 'cadence') {
      cadence.fill(0, from, to);
    } else {
      power.fill(0, from, to);
      balance?.fill(INVALID_BALANCE, from, to);
    }
  }

  const clockOffset = Math.round(meter.clockOffsetSeconds ?? 0);
  const firstTimestamp = ride.startTime + firstSecond + clockOffset;
  const kept = meter.recordingMode === 'change-only' ? changeOnlyIndices(power, cadence) : null;
  const pick = <T extends Uint8Array | Uint16Array>(values: T): T => (kept ? (values.filter((_, i) => kept[i]) as T) : values);
  const timestamps = new Float64Array(kept ? kept.reduce((n, k) => n + k, 0) : length);
  for (let i = 0, j = 0; i < length; i += 1) if (!kept || kept[i]) timestamps[j++] = firstTimestamp + i;

  return {
    position: meter.position,
    timestamps,
    power: pick(power),
    cadence: pick(cadence),
    balance: balance && pick(balance),
    events: dropouts.map((dropout) => ({ ...dropout, timestamp: ride.startTime + dropout.startSecond + clockOffset })),
  };
}

/** What the meter reads for each leg before the head unit smooths it; single-sided meters double their leg. */
function measurePower(ride: TrueRide, meter: MeterModelOptions, firstSecond: number, length: number, normal: () => number) {
  const baseGain = (meter.scale ?? 1) * (1 - (meter.drivetrainLossPercent ?? 0) / 100);
  const driftPerSecond = (meter.driftPercentPerHour ?? 0) / 100 / 3600;
  const noiseWatts = meter.noiseWatts ?? 2;
  const noiseFraction = (meter.noisePercent ?? 1) / 100;
  const left = new Float64Array(length);
  const right = new Float64Array(length);
  for (let i = 0; i < length; i += 1) {
    const truePower = ride.power[firstSecond + i];
    // Drawn every second so that options do not shift the stream of deviates.
    const noise = normal();
    const secondNoise = normal();
    if (truePower <= 0) continue; // a meter reads zero while nobody pedals
    const share = ride.rightShare[firstSecond + i];
    const gain = baseGain * (1 + driftPerSecond * (firstSecond + i)) * coldGain(meter, firstSecond + i);
    const sd = Math.hypot(noiseWatts, noiseFraction * truePower);
    const reading = gain * truePower + sd * noise;
    switch (meter.position) {
      case 'left':
        left[i] = Math.max(0, 2 * (1 - share) * reading);
        break;
      case 'right':
        right[i] = Math.max(0, 2 * share * reading);
        break;
      case 'dual':
        // Independent gauges per leg: the noise splits between them.
        left[i] = Math.max(0, (1 - share) * gain * truePower + (sd / Math.SQRT2) * noise);
        right[i] = Math.max(0, share * gain * truePower + (sd / Math.SQRT2) * secondNoise);
        break;
      case 'total':
        left[i] = Math.max(0, reading);
        break;
    }
  }
  return { left, right };
}

function measureCadence(ride: TrueRide, meter: MeterModelOptions, firstSecond: number, length: number, normal: () => number): Uint8Array {
  const lag = Math.round(meter.cadenceLagSeconds ?? 0);
  const last = ride.cadence.length - 1;
  const cadence = new Uint8Array(length);
  for (let i = 0; i < length; i += 1) {
    const source = Math.min(last, Math.max(0, firstSecond + i - lag));
    const jitter = 0.5 * normal();
    const trueCadence = ride.cadence[source];
    cadence[i] = trueCadence > 0 ? Math.min(254, Math.max(1, Math.round(trueCadence + jitter))) : 0;
  }
  return cadence;
}

function trailingMean(values: Float64Array, window: number): Float64Array {
  if (window <= 1) return values;
  const result = new Float64Array(values.length);
  let sum = 0;
  for (let i = 0; i < values.length; i += 1) {
    sum += values[i];
    if (i >= window) sum -= values[i - window];
    result[i] = sum / Math.min(i + 1, window);
  }
  return result;
}

/**
 * "Smart" recording as some head units do it (common practice, from memory): write a
 * record when a value moves noticeably, when pedalling starts or stops, and at least
 * every few seconds. The gaps are ordinary, not dropouts.
 */
function changeOnlyIndices(power: Uint16Array, cadence: Uint8Array): Uint8Array {
  const kept = new Uint8Array(power.length);
  let lastIndex = 0;
  kept[0] = 1;
  for (let i = 1; i < power.length; i += 1) {
    const p = power[i];
    const c = cadence[i];
    const lastP = power[lastIndex];
    const lastC = cadence[lastIndex];
    const keep =
      i === power.length - 1 ||
      i - lastIndex >= CHANGE_ONLY_MAX_GAP_SECONDS ||
      (p === 0) !== (lastP === 0) ||
      (c === 0) !== (lastC === 0) ||
      Math.abs(p - lastP) >= CHANGE_ONLY_POWER_STEP_WATTS ||
      Math.abs(c - lastC) >= CHANGE_ONLY_CADENCE_STEP_RPM;
    if (keep) {
      kept[i] = 1;
      lastIndex = i;
    }
  }
  return kept;
}
