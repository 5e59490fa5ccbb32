import { analyseDropouts } from './dropouts';
import { matchedSeconds } from './bias';
import { comparablePower } from './like-for-like';
import { sharedTimeline, toSecondGrid } from './timeline';
import type { CompareOptions, RideStream } from './types';

/**
 * Both meters second by second on the aligned span, for drawing and for section
 * figures: power as compared (like for like, the basis of the headline bias), cadence,
 * balance, and which seconds count as matched. Index 0 is the alignment start.
 * Values are rounded for the wire; null means the meter reported nothing that second.
 */
export interface RideTrace {
  length: number;
  aPower: (number | null)[];
  bPower: (number | null)[];
  aCadence: (number | null)[];
  bCadence: (number | null)[];
  /** Right leg's share in %, or empty when the meter's file carries no balance. */
  aRightBalance: (number | null)[];
  bRightBalance: (number | null)[];
  /** 1 where the second enters the bias: both report power, neither is inside a dropout event. */
  matched: (0 | 1)[];
}

/** Rebuilds the aligned span the engine compared, at the clock offset it found. */
export function rideTrace(a: RideStream, b: RideStream, options: CompareOptions, clockOffsetSeconds: number): RideTrace {
  const timeline = sharedTimeline(toSecondGrid(a), toSecondGrid(b), Math.round(clockOffsetSeconds));
  const { aPowerDropout, bPowerDropout } = analyseDropouts(timeline);
  const comparable = comparablePower(timeline, options);
  const matched = matchedSeconds(comparable.a, comparable.b, aPowerDropout, bPowerDropout);
  return {
    length: timeline.length,
    aPower: rounded(comparable.a, 1),
    bPower: rounded(comparable.b, 1),
    aCadence: rounded(timeline.aCadence, 1),
    bCadence: rounded(timeline.bCadence, 1),
    aRightBalance: anyValue(timeline.aRightBalance) ? rounded(timeline.aRightBalance, 10) : [],
    bRightBalance: anyValue(timeline.bRightBalance) ? rounded(timeline.bRightBalance, 10) : [],
    matched: Array.from(matched, (m) => (m === 1 ? 1 : 0)),
  };
}

function rounded(values: Float64Array, per: number): (number | null)[] {
  return Array.from(values, (v) => (v === v ? Math.round(v * per) / per : null));
}

function anyValue(values: Float64Array): boolean {
  for (let i = 0; i < values.length; i++) if (values[i] === values[i]) return true;
  return false;
}
