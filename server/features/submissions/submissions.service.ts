import type { Knex } from 'knex';
import { DECODER_VERSION } from '@shared/analysis/decode-fit';
import { AnalysisError, formatDuration } from '@shared/analysis/errors';
import { MAX_CLOCK_OFFSET_SECONDS, MIN_OVERLAP_SECONDS } from '@shared/analysis/method';
import type { RecordingStatistics, Side } from '@shared/analysis/types';
import type { CreateSubmissionInput } from '@shared/schemas/submission';
import { findUsableFirmware, findUsableModel, findUsableRecordingDevice } from '../catalogue/catalogue.repository';
import { AppError, ConflictError, ValidationError } from '../../lib/errors';
import { isUniqueViolation } from '../../lib/pg-errors';
import type { Queue } from '../../jobs/queue';
import type { ObjectStore } from '../../lib/object-store';
import { keepOriginals } from '../originals/originals.service';
import { enqueueAnalysis } from './analyse-submission.job';
import { prepareRecording, RecordingTaskError } from './recording-tasks';
import type { PreparedRecording } from './recording-tasks.worker';
import * as submissions from './submissions.repository';

export interface UploadedFile {
  buffer: Buffer;
  originalName: string;
}

const FILE_FIELD: Record<Side, string> = { a: 'fileA', b: 'fileB' };
const SIDE_LABEL: Record<Side, string> = { a: 'first', b: 'second' };

/** An upload the engine cannot use: answered on the file's own field. */
class UnusableFileError extends AppError {
  constructor(side: Side | null, code: string, message: string) {
    super(400, code, message, { fields: { [side ? FILE_FIELD[side] : 'files']: message } });
  }
}

class DailySubmissionLimitError extends AppError {
  constructor(perDay: number) {
    super(
      429,
      'daily_submission_limit',
      `You have made ${perDay} submissions in the last 24 hours, the most Crosswatt takes from one rider in a day. Please try again tomorrow.`,
    );
  }
}

/**
 * SUBMISSIONS_PER_DAY: the rider's stored submissions of the last 24 hours are
 * counted, so the limit holds across processes and restarts, and refused uploads
 * (a bad file, a duplicate) do not count.
 */
async function checkDailyLimit(db: Knex | Knex.Transaction, riderId: number, perDay: number | undefined): Promise<void> {
  if (perDay === undefined) return;
  if ((await submissions.countSinceHoursAgo(db, riderId, 24)) >= perDay) throw new DailySubmissionLimitError(perDay);
}

/**
 * Checks the tags and both files, writes both files (location removed) to the
 * object store, then stores the submission and its two normalised streams in one
 * transaction and queues the analysis. Nothing is written when anything is wrong;
 * objects written for an upload that then fails are swept later. With
 * `submissionsPerDay`, a rider's uploads in 24 hours are limited (the routes set
 * it; the demo seed and tests need not).
 */
export async function createSubmission(
  deps: { db: Knex; queue?: Queue; store: ObjectStore; submissionsPerDay?: number },
  riderId: number,
  input: CreateSubmissionInput,
  files: Record<Side, UploadedFile>,
): Promise<{ id: number }> {
  const { db } = deps;
  // Checked before the files are read (no work for a refused upload), and again under a lock.
  await checkDailyLimit(db, riderId, deps.submissionsPerDay);
  await checkTags(db, riderId, input);
  // Both files are decoded and checked in worker threads, side by side.
  const [preparedA, preparedB] = await Promise.allSettled([prepare(files.a.buffer, 'a'), prepare(files.b.buffer, 'b')]);
  if (preparedA.status === 'rejected') throw preparedA.reason;
  if (preparedB.status === 'rejected') throw preparedB.reason;
  const streams = { a: preparedA.value, b: preparedB.value };
  const hashes = { a: streams.a.sha256, b: streams.b.sha256 };
  if (hashes.a === hashes.b) {
    throw new UnusableFileError('b', 'identical_files', 'Both files are the same recording. Choose the file from the other device for B.');
  }
  checkOverlap(streams.a, streams.b);
  // The same two files with A and B swapped are the same ride: refused like an exact re-upload.
  const existing = await submissions.findIdBySameFiles(db, hashes.a, hashes.b);
  if (existing) throw duplicate(existing);
  // Objects first, rows second: a row never names an object that is not there.
  const [keptA, keptB] = await keepOriginals(deps.store, [
    { sha256: streams.a.originalSha256, bytes: streams.a.original },
    { sha256: streams.b.originalSha256, bytes: streams.b.original },
  ]);
  const originals = { a: keptA, b: keptB };

  let id: number;
  try {
    id = await db.transaction(async (trx) => {
      // One rider's uploads are stored one at a time, so two processes cannot both take the last place of the day.
      await submissions.lockRiderSubmissions(trx, riderId);
      await checkDailyLimit(trx, riderId, deps.submissionsPerDay);
      return submissions.insertSubmission(
        trx,
        {
          riderId,
          indoor: input.indoor,
          surface: input.surface,
          notes: input.notes,
          aSha256: hashes.a,
          bSha256: hashes.b,
          rideStartedAt: new Date(Math.min(streams.a.recording.startTime, streams.b.recording.startTime) * 1000),
          rideEndedAt: new Date(Math.max(streams.a.recording.endTime, streams.b.recording.endTime) * 1000),
        },
        (['a', 'b'] as const).map((side) => ({
          side,
          tags: input[side],
          sha256: hashes[side],
          deviceInfo: streams[side].device,
          recordingStats: streams[side].recording,
          stream: streams[side].stored,
          original: originals[side],
          decoderVersion: DECODER_VERSION,
        })),
      );
    });
  } catch (err) {
    if (isUniqueViolation(err)) {
      const raced = await submissions.findIdBySameFiles(db, hashes.a, hashes.b);
      if (raced) throw duplicate(raced);
    }
    throw err;
  }
  if (deps.queue) await enqueueAnalysis(deps.queue, id);
  return { id };
}

function duplicate(id: number) {
  return new ConflictError('These two files were uploaded before.', { submissionId: id, url: `/submissions/${id}` });
}

async function prepare(bytes: Buffer, side: Side): Promise<PreparedRecording> {
  try {
    return await prepareRecording(new Uint8Array(bytes.buffer, bytes.byteOffset, bytes.byteLength));
  } catch (err) {
    if (err instanceof AnalysisError) {
      throw new UnusableFileError(side, err.code, err.message.replace(/^This (file|recording)/, `The ${SIDE_LABEL[side]} file`));
    }
    if (err instanceof RecordingTaskError) {
      throw new UnusableFileError(
        side,
        'too_costly',
        `The ${SIDE_LABEL[side]} file takes more ${err.reason === 'time' ? 'time' : 'memory'} to read than any ride recording does, so it was not read to the end. Export the ride again from the device that recorded it.`,
      );
    }
    throw err;
  }
}

// A quick look at the two time ranges before anything is stored; the analysis job
// then finds the exact clock offset and overlap.
function checkOverlap(a: { recording: RecordingStatistics }, b: { recording: RecordingStatistics }) {
  const start = Math.max(a.recording.startTime, b.recording.startTime - MAX_CLOCK_OFFSET_SECONDS);
  const end = Math.min(a.recording.endTime, b.recording.endTime + MAX_CLOCK_OFFSET_SECONDS);
  const overlap = end - start;
  if (overlap <= 0) {
    throw new UnusableFileError(null, 'no_overlap', 'These recordings do not overlap in time. Were they recorded on the same ride?');
  }
  if (overlap < MIN_OVERLAP_SECONDS) {
    throw new UnusableFileError(
      null,
      'short_overlap',
      `These recordings overlap for only about ${formatDuration(overlap)}; a comparison needs at least ${formatDuration(MIN_OVERLAP_SECONDS)} recorded by both.`,
    );
  }
}

async function checkTags(db: Knex, riderId: number, input: CreateSubmissionInput) {
  const fields: Record<string, string> = {};
  for (const side of ['a', 'b'] as const) {
    const tags = input[side];
    const model = await findUsableModel(db, tags.modelId, riderId);
    if (!model) fields[`${side}.modelId`] = 'this model is not in the catalogue';
    else if (!(await findUsableFirmware(db, tags.firmwareId, tags.modelId, riderId))) {
      fields[`${side}.firmwareId`] = `this firmware version is not listed for ${model.name}`;
    }
    if (!(await findUsableRecordingDevice(db, tags.recordingDeviceId, riderId))) {
      fields[`${side}.recordingDeviceId`] = 'this recording device is not in the catalogue';
    }
  }
  if (Object.keys(fields).length > 0) {
    const message = Object.entries(fields)
      .map(([f, m]) => `${f}: ${m}`)
      .join('; ');
    throw new ValidationError(message, { fields });
  }
}
