// Runs in a worker thread (see recording-tasks.ts): the CPU-heavy steps of an upload
// and of its analysis, so that no request waits behind another rider's file.
import { createHash } from 'node:crypto';
import { compareRecordings } from '@shared/analysis/compare-recordings';
import { decodeFit } from '@shared/analysis/decode-fit';
import { AnalysisError } from '@shared/analysis/errors';
import type { ComparisonResult, CompareOptions, DeviceInfo, PowerMeterReport, RecordingStatistics } from '@shared/analysis/types';
import { FitStructureError, stripFitLocation } from '@shared/fit/strip-location';
import { decodeStream, encodeStream } from './stream-codec';

export type RecordingTask =
  | { kind: 'prepare'; bytes: Uint8Array }
  | { kind: 'compare'; a: Uint8Array; b: Uint8Array; options: CompareOptions };

export interface PreparedRecording {
  /** Of the file as uploaded: the same file is refused a second time. */
  sha256: string;
  /** The uploaded file with every coordinate overwritten (shared/fit/strip-location), kept in the object store. */
  original: Uint8Array;
  /** Of `original`: its key in the object store. */
  originalSha256: string;
  device: DeviceInfo;
  recording: RecordingStatistics;
  powerMeterReports: PowerMeterReport[];
  /** The normalised stream as stored (stream-codec). */
  stored: Buffer;
}

export type TaskOutcome<T> = { ok: true; value: T } | { ok: false; error: { code: AnalysisError['code']; message: string } };

export default function runRecordingTask(task: RecordingTask): TaskOutcome<PreparedRecording | ComparisonResult> {
  try {
    if (task.kind === 'prepare') {
      const bytes = task.bytes;
      const stream = decodeFit(bytes);
      const original = stripOriginal(bytes);
      const value: PreparedRecording = {
        sha256: createHash('sha256').update(bytes).digest('hex'),
        original,
        originalSha256: createHash('sha256').update(original).digest('hex'),
        device: stream.device,
        recording: stream.recording,
        powerMeterReports: stream.powerMeterReports ?? [],
        stored: encodeStream(stream),
      };
      return { ok: true, value };
    }
    const value = compareRecordings(decodeStream(Buffer.from(task.a)), decodeStream(Buffer.from(task.b)), task.options);
    return { ok: true, value };
  } catch (err) {
    if (err instanceof AnalysisError) return { ok: false, error: { code: err.code, message: err.message } };
    throw err;
  }
}

/** The file minus location. The decoder has read it already, so a structure the stripper cannot follow is damage. */
function stripOriginal(bytes: Uint8Array): Uint8Array {
  try {
    return stripFitLocation(bytes).bytes;
  } catch (err) {
    if (err instanceof FitStructureError) {
      throw new AnalysisError(
        'damaged_file',
        `This file is damaged: ${err.message} Export the ride again from the device that recorded it.`,
      );
    }
    throw err;
  }
}
