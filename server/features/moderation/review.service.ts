import type { Knex } from 'knex';
import type { DeviceInfo } from '@shared/analysis/types';
import { FLAG_GUIDANCE } from '@shared/moderation/flag-guidance';
import { dayOf } from '@shared/schemas/day';
import { type DecisionView, type PossibleDuplicate, REJECT_REASON_LABELS, type Review, type ReviewFlag } from '@shared/schemas/moderation';
import type { SubmissionView } from '@shared/schemas/submission-view';
import { NotFoundError } from '../../lib/errors';
import { decodeStream } from '../submissions/stream-codec';
import { presentSubmission } from '../submissions/submission.presenter';
import { findSubmission } from '../submissions/submissions.repository';
import * as moderation from './moderation.repository';

/** Share of common seconds on which two power streams agree within this, to call them the same recording. */
const SAME_WATTS = 2;
const SAME_FRACTION = 0.01;
const NEAR_IDENTICAL_SHARE = 0.8;

interface Viewer {
  id: number;
  roles: string[];
}

/**
 * Everything a moderator needs to decide: what the rider sees, the flags with
 * what to check, the rider's record, possible duplicates and whether the files'
 * own device info agrees with the tags.
 */
export async function getReview(db: Knex, submissionId: number, viewer: Viewer): Promise<Review<SubmissionView>> {
  const submission = await findSubmission(db, submissionId);
  if (!submission) throw new NotFoundError('No such submission.');
  const flags: ReviewFlag[] = (submission.flags as Omit<ReviewFlag, 'check' | 'likelyReason'>[]).map((flag) => ({
    ...flag,
    check: FLAG_GUIDANCE[flag.code]?.check ?? null,
    likelyReason: FLAG_GUIDANCE[flag.code]?.likelyReason ?? null,
  }));
  const [decision, riderHistory, duplicates, history] = await Promise.all([
    moderation.findDecision(db, submission.id),
    moderation.riderHistory(db, submission.riderId, submission.id),
    possibleDuplicates(db, submission.id),
    moderation.decisionHistory(db, submission.id),
  ]);
  return {
    submission: presentSubmission(submission, viewer),
    decision: decision ? decisionOf(decision) : null,
    flags,
    riderHistory,
    duplicates,
    deviceChecks: submission.recordings.flatMap((r) => deviceChecks(r)),
    // Whether each file is kept (location removed) for decoding again; older recordings have their streams only.
    originals: submission.recordings.map((r) => ({ side: r.side, kept: r.originalBytes !== null, decoderVersion: r.decoderVersion })),
    history: history.map((h) => ({ ...h, id: Number(h.id), createdAt: new Date(h.createdAt).toISOString() })),
  };
}

/** The last decision, with its day only: riders and the public read it too. */
export function decisionOf(row: {
  decisionReason?: string | null;
  decisionNote?: string | null;
  decidedAt?: Date | string | null;
}): DecisionView | null {
  if (!row.decidedAt) return null;
  return {
    reason: row.decisionReason ?? null,
    reasonLabel: row.decisionReason ? ((REJECT_REASON_LABELS as Record<string, string>)[row.decisionReason] ?? row.decisionReason) : null,
    note: row.decisionNote ?? null,
    decidedOn: dayOf(row.decidedAt),
  };
}

/**
 * Submissions of the same time range whose power streams are nearly the same as
 * one of this submission's: the same ride uploaded again with other files.
 */
async function possibleDuplicates(db: Knex, submissionId: number): Promise<PossibleDuplicate[]> {
  const candidates = await moderation.overlappingSubmissions(db, submissionId);
  if (candidates.length === 0) return [];
  const streams = await moderation.streamsOf(db, [submissionId, ...candidates.map((c) => c.id)]);
  const decoded = new Map<number, Array<Map<number, number>>>();
  for (const s of streams) {
    const list = decoded.get(s.submissionId) ?? [];
    list.push(powerBySecond(s.stream));
    decoded.set(s.submissionId, list);
  }
  const own = decoded.get(submissionId) ?? [];
  return candidates.map((c) => {
    let best = 0;
    for (const mine of own) for (const theirs of decoded.get(c.id) ?? []) best = Math.max(best, sameShare(mine, theirs));
    return {
      id: c.id,
      status: c.status,
      riderHandle: c.riderHandle,
      createdAt: new Date(c.createdAt).toISOString(),
      overlapSeconds: c.overlapSeconds,
      overlapShare: c.rideSeconds > 0 ? Math.min(1, c.overlapSeconds / c.rideSeconds) : 0,
      sameStreamShare: Math.round(best * 1000) / 1000,
      nearIdentical: best >= NEAR_IDENTICAL_SHARE,
    };
  });
}

function powerBySecond(stored: Buffer): Map<number, number> {
  const stream = decodeStream(stored);
  const bySecond = new Map<number, number>();
  for (let i = 0; i < stream.timestamps.length; i++) {
    const watts = stream.powerWatts[i]!;
    if (Number.isFinite(watts)) bySecond.set(Math.round(stream.timestamps[i]!), watts);
  }
  return bySecond;
}

/** Of the seconds both streams record with some power, the share where they read the same. */
function sameShare(a: Map<number, number>, b: Map<number, number>): number {
  let common = 0;
  let same = 0;
  for (const [second, watts] of a) {
    const other = b.get(second);
    if (other === undefined || (watts === 0 && other === 0)) continue;
    common++;
    if (Math.abs(watts - other) <= Math.max(SAME_WATTS, SAME_FRACTION * Math.max(watts, other))) same++;
  }
  return common === 0 ? 0 : same / common;
}

interface RecordingForCheck {
  side: 'a' | 'b';
  firmwareVersion: string;
  modelName: string;
  recordingDeviceName: string;
  recordingDeviceFirmware: string;
  deviceInfo: DeviceInfo | null;
}

/** FIT software versions are stored ×100 and read as 3.1 for 310; a tag "3.1.0" or "3.10" means the same. */
export function versionsAgree(tagged: string, inFile: number): boolean {
  const [major, minor = '0'] = tagged.split(/[-+]/)[0]!.split('.');
  const taggedNumber = Number(`${major}.${minor}`);
  return Number.isFinite(taggedNumber) && Math.abs(taggedNumber - inFile) < 0.005;
}

function deviceChecks(recording: RecordingForCheck) {
  const side = recording.side.toUpperCase();
  const checks = [];
  const meter = recording.deviceInfo?.powerMeter;
  if (meter?.softwareVersion != null) {
    const agrees = versionsAgree(recording.firmwareVersion, meter.softwareVersion);
    checks.push({
      side: recording.side,
      what: 'power_meter_firmware',
      tagged: recording.firmwareVersion,
      inFile: String(meter.softwareVersion),
      agrees,
      message: agrees
        ? `${side}: the file's power meter reports firmware ${meter.softwareVersion}, as tagged.`
        : `${side}: the file's power meter reports firmware ${meter.softwareVersion}, but ${recording.modelName} is tagged ${recording.firmwareVersion}.`,
    });
  } else {
    checks.push({
      side: recording.side,
      what: 'power_meter_firmware',
      tagged: recording.firmwareVersion,
      inFile: null,
      agrees: null,
      message: `${side}: the file does not name the power meter's firmware, so the tag ${recording.firmwareVersion} cannot be checked.`,
    });
  }
  const creator = recording.deviceInfo?.creator;
  if (creator?.softwareVersion != null && recording.recordingDeviceFirmware) {
    const agrees = versionsAgree(recording.recordingDeviceFirmware, creator.softwareVersion);
    checks.push({
      side: recording.side,
      what: 'recording_device_firmware',
      tagged: recording.recordingDeviceFirmware,
      inFile: String(creator.softwareVersion),
      agrees,
      message: agrees
        ? `${side}: ${recording.recordingDeviceName} wrote the file with software ${creator.softwareVersion}, as tagged.`
        : `${side}: the file was written by software ${creator.softwareVersion}, but ${recording.recordingDeviceName} is tagged ${recording.recordingDeviceFirmware}.`,
    });
  }
  return checks;
}
