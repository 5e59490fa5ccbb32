import type { DropoutEvent, DropoutSummary, Dropouts } from './types';
import type { SharedTimeline } from './timeline';

const POWER_THRESHOLD_WATTS = 50;
const CADENCE_THRESHOLD_RPM = 30;
const MIN_EVENT_SECONDS = 3;
/** Runs separated by fewer seconds than this are one event. */
const MERGE_GAP_SECONDS = 2;

export interface DropoutAnalysis {
  dropouts: Dropouts;
  /** 1 for every second inside a power dropout event of that device. */
  aPowerDropout: Uint8Array;
  bPowerDropout: Uint8Array;
}

export interface DropoutContext {
  /** Both cadences on one clock (the cadence lag removed); the timeline's own when absent. */
  cadence?: { a: Float64Array; b: Float64Array };
  /** Each recording's trailing power average in s (1 = none), as the alignment found it. */
  smoothingWindowSeconds?: { a: number; b: number };
}

/**
 * Method version 2. A power dropout is a run of a device's silence while the partner
 * pedals of its own: the partner reads riding power and, where it records cadence, a
 * cadence of at least CADENCE_THRESHOLD_RPM (lag removed); without cadence, its power
 * must still read riding power one smoothing window later, so an average spilling into a
 * coast is not taken for pedalling. Cadence dropouts are looked for after the lag is removed.
 */
export function analyseDropouts(timeline: SharedTimeline, context: DropoutContext = {}): DropoutAnalysis {
  const cadence = context.cadence ?? { a: timeline.aCadence, b: timeline.bCadence };
  const windows = context.smoothingWindowSeconds ?? { a: 1, b: 1 };
  const pedallingSeconds = countPedallingSeconds(timeline.aPower, timeline.bPower);
  const aPedals = pedallingOfItsOwn(timeline.aPower, cadence.a, windows.a);
  const bPedals = pedallingOfItsOwn(timeline.bPower, cadence.b, windows.b);
  const aPower = dropoutEvents(silentWhile(timeline.aPower, bPedals));
  const bPower = dropoutEvents(silentWhile(timeline.bPower, aPedals));
  const aCadence = dropoutEvents(silentWhileOtherActive(cadence.a, cadence.b, CADENCE_THRESHOLD_RPM));
  const bCadence = dropoutEvents(silentWhileOtherActive(cadence.b, cadence.a, CADENCE_THRESHOLD_RPM));
  return {
    dropouts: {
      a: { power: summarise(aPower, pedallingSeconds), cadence: summarise(aCadence, pedallingSeconds) },
      b: { power: summarise(bPower, pedallingSeconds), cadence: summarise(bCadence, pedallingSeconds) },
      pedallingSeconds,
    },
    aPowerDropout: eventMask(aPower, timeline.length),
    bPowerDropout: eventMask(bPower, timeline.length),
  };
}

/** 1 where a device shows pedalling of its own: riding power, and cadence where it records cadence. */
export function pedallingOfItsOwn(power: Float64Array, cadence: Float64Array, smoothingWindowSeconds: number): Uint8Array {
  const mask = new Uint8Array(power.length);
  const later = Math.max(0, smoothingWindowSeconds - 1);
  for (let i = 0; i < power.length; i++) {
    if (!(power[i] >= POWER_THRESHOLD_WATTS)) continue;
    const c = cadence[i];
    if (c === c) {
      if (c >= CADENCE_THRESHOLD_RPM) mask[i] = 1;
    } else if (later === 0 || power[Math.min(power.length - 1, i + later)] >= POWER_THRESHOLD_WATTS) {
      mask[i] = 1;
    }
  }
  return mask;
}

/** 1 where the device reports nothing or zero while `active` is set. */
function silentWhile(own: Float64Array, active: Uint8Array): Uint8Array {
  const mask = new Uint8Array(own.length);
  for (let i = 0; i < own.length; i++) {
    const value = own[i];
    if ((value !== value || value === 0) && active[i] === 1) mask[i] = 1;
  }
  return mask;
}

/** Pedalling: either device reports power above zero. */
export function countPedallingSeconds(aPower: Float64Array, bPower: Float64Array): number {
  let count = 0;
  for (let i = 0; i < aPower.length; i++) if (aPower[i] > 0 || bPower[i] > 0) count++;
  return count;
}

/** 1 where the device reports nothing or zero while the other reports at least `threshold`. */
export function silentWhileOtherActive(own: Float64Array, other: Float64Array, threshold: number): Uint8Array {
  const mask = new Uint8Array(own.length);
  for (let i = 0; i < own.length; i++) {
    const value = own[i];
    if ((value !== value || value === 0) && other[i] >= threshold) mask[i] = 1;
  }
  return mask;
}

export function dropoutEvents(mask: Uint8Array): DropoutEvent[] {
  const runs: { start: number; end: number }[] = [];
  for (let i = 0; i < mask.length; i++) {
    if (mask[i] === 0) continue;
    let end = i;
    while (end < mask.length && mask[end] === 1) end++;
    const previous = runs[runs.length - 1];
    if (previous !== undefined && i - previous.end < MERGE_GAP_SECONDS) previous.end = end;
    else runs.push({ start: i, end });
    i = end;
  }
  return runs
    .filter((run) => run.end - run.start >= MIN_EVENT_SECONDS)
    .map((run) => ({ startSeconds: run.start, endSeconds: run.end, durationSeconds: run.end - run.start }));
}

function summarise(events: DropoutEvent[], pedallingSeconds: number): DropoutSummary {
  const seconds = events.reduce((total, event) => total + event.durationSeconds, 0);
  return {
    count: events.length,
    seconds,
    ratePerHour: pedallingSeconds > 0 ? events.length / (pedallingSeconds / 3600) : null,
    events,
  };
}

function eventMask(events: DropoutEvent[], length: number): Uint8Array {
  const mask = new Uint8Array(length);
  for (const event of events) mask.fill(1, event.startSeconds, event.endSeconds);
  return mask;
}
