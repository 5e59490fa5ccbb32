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

export function analyseDropouts(timeline: SharedTimeline): DropoutAnalysis {
  const pedallingSeconds = countPedallingSeconds(timeline.aPower, timeline.bPower);
  const aPower = dropoutEvents(silentWhileOtherActive(timeline.aPower, timeline.bPower, POWER_THRESHOLD_WATTS));
  const bPower = dropoutEvents(silentWhileOtherActive(timeline.bPower, timeline.aPower, POWER_THRESHOLD_WATTS));
  const aCadence = dropoutEvents(silentWhileOtherActive(timeline.aCadence, timeline.bCadence, CADENCE_THRESHOLD_RPM));
  const bCadence = dropoutEvents(silentWhileOtherActive(timeline.bCadence, timeline.aCadence, CADENCE_THRESHOLD_RPM));
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
