import { createHash } from 'node:crypto';
import type { Knex } from 'knex';
import { decodeFit } from '@shared/analysis/decode-fit';
import { AnalysisError, formatDuration } from '@shared/analysis/errors';
import { MAX_CLOCK_OFFSET_SECONDS, MIN_OVERLAP_SECONDS } from '@shared/analysis/method';
import type { RideStream, Side } from '@shared/analysis/types';
import type { CreateSubmissionInput } from '@shared/schemas/submission';
import { findUsableFirmware, findUsableModel, findUsableRecordingDevice } from '../catalogue/catalogue.repository';
import { AppError, ConflictError, ValidationError } from '../../lib/errors';
import { isUniqueViolation } from '../../lib/pg-errors';
import type { Queue } from '../../jobs/queue';
import { enqueueAnalysis } from './analyse-submission.job';
import { encodeStream } from './stream-codec';
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

/**
 * Checks the tags and both files, then stores the submission and its two
 * normalised streams in one transaction and queues the analysis. Nothing is
 * written when anything is wrong.
 */
export async function createSubmission(
  deps: { db: Knex; queue?: Queue },
  riderId: number,
  input: CreateSubmissionInput,
  files: Record<Side, UploadedFile>,
): Promise<{ id: number }> {
  const { db } = deps;
  await checkTags(db, riderId, input);
  const streams = { a: decode(files.a.buffer, 'a'), b: decode(files.b.buffer, 'b') };
  const hashes = { a: sha256(files.a.buffer), b: sha256(files.b.buffer) };
  if (hashes.a === hashes.b) {
    throw new UnusableFileError('b', 'identical_files', 'Both files are the same recording. Choose the file from the other device for B.');
  }
  checkOverlap(streams.a, streams.b);
  const existing = await submissions.findIdByFileHashes(db, hashes.a, hashes.b);
  if (existing) throw duplicate(existing);

  let id: number;
  try {
    id = await db.transaction((trx) =>
      submissions.insertSubmission(
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
          stream: encodeStream(streams[side]),
        })),
      ),
    );
  } catch (err) {
    if (isUniqueViolation(err)) {
      const raced = await submissions.findIdByFileHashes(db, hashes.a, hashes.b);
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

function sha256(bytes: Buffer) {
  return createHash('sha256').update(bytes).digest('hex');
}

function decode(bytes: Buffer, side: Side): RideStream {
  try {
    return decodeFit(new Uint8Array(bytes.buffer, bytes.byteOffset, bytes.byteLength));
  } catch (err) {
    if (err instanceof AnalysisError) {
      throw new UnusableFileError(side, err.code, err.message.replace(/^This (file|recording)/, `The ${SIDE_LABEL[side]} file`));
    }
    throw new UnusableFileError(side, 'damaged_file', `The ${SIDE_LABEL[side]} file cannot be read as a FIT activity file.`);
  }
}

// A quick look at the two time ranges before anything is stored; the analysis job
// then finds the exact clock offset and overlap.
function checkOverlap(a: RideStream, b: RideStream) {
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
    const message = Object.entries(fields).map(([f, m]) => `${f}: ${m}`).join('; ');
    throw new ValidationError(message, { fields });
  }
}
