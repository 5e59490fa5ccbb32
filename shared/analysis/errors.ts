import type { Side } from './types';

export type AnalysisErrorCode =
  | 'not_fit'
  | 'not_activity'
  | 'damaged_file'
  | 'ended_early'
  | 'implausible_timestamps'
  | 'too_many_records'
  | 'no_power'
  | 'too_short'
  | 'no_overlap'
  | 'short_overlap';

/** A recording or pair the method cannot judge; `message` is written for the rider who uploaded it. */
export class AnalysisError extends Error {
  readonly code: AnalysisErrorCode;
  readonly side: Side | null;

  constructor(code: AnalysisErrorCode, message: string, side: Side | null = null) {
    super(message);
    this.name = 'AnalysisError';
    this.code = code;
    this.side = side;
  }
}

const SIDE_NAMES: Record<Side, string> = { a: 'The first file (A)', b: 'The second file (B)' };

/** Names the file in a message raised before we knew which of the two it was. */
export function attributeToSide(error: unknown, side: Side): unknown {
  if (!(error instanceof AnalysisError) || error.side !== null) return error;
  const message = error.message.replace(/^This (file|recording)/, SIDE_NAMES[side]);
  return new AnalysisError(error.code, message, side);
}

export function formatDuration(seconds: number): string {
  const minutes = Math.floor(seconds / 60);
  const rest = Math.round(seconds % 60);
  if (minutes === 0) return `${rest} s`;
  return rest === 0 ? `${minutes} min` : `${minutes} min ${rest} s`;
}
