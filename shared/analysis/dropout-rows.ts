import { meanOver } from './section-figures';
import type { DropoutEvent, Dropouts, Side } from './types';

/** One power dropout as the inspection table lists it. */
export interface DropoutRow {
  side: Side;
  startSeconds: number;
  durationSeconds: number;
  /** The same meter's cadence vanished too at some point of the event. */
  cadenceLostToo: boolean;
  /** The partner's mean power over the event: what the meter missed. */
  partnerWatts: number | null;
}

/** Every power dropout of both meters in ride order, with what the partner read meanwhile. */
export function dropoutRows(dropouts: Dropouts, partnerPower: { a: (number | null)[]; b: (number | null)[] }): DropoutRow[] {
  const rows: DropoutRow[] = [];
  for (const side of ['a', 'b'] as const) {
    const partner = side === 'a' ? partnerPower.b : partnerPower.a;
    for (const event of dropouts[side].power.events) {
      rows.push({
        side,
        startSeconds: event.startSeconds,
        durationSeconds: event.durationSeconds,
        cadenceLostToo: dropouts[side].cadence.events.some((c) => overlaps(c, event)),
        partnerWatts: meanOver(partner, event.startSeconds, event.endSeconds),
      });
    }
  }
  return rows.sort((x, y) => x.startSeconds - y.startSeconds || x.side.localeCompare(y.side));
}

function overlaps(x: DropoutEvent, y: DropoutEvent): boolean {
  return x.startSeconds < y.endSeconds && y.startSeconds < x.endSeconds;
}
