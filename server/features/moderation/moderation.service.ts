import type { Knex } from 'knex';
import type { TagChangeResult } from '@shared/schemas/moderation';
import type { CorrectTagsInput, Decision, RejectReason } from '@shared/schemas/moderation';
import type { RecordingTagsInput, SubmissionStatus } from '@shared/schemas/submission';
import { assertIndependentOf } from '../../auth/require-user';
import { publicUrl } from '../../config/env';
import { ConflictError, NotFoundError, ValidationError } from '../../lib/errors';
import { recordAudit } from '../audit/audit.repository';
import { findUsableFirmware, findUsableModel, findUsableRecordingDevice } from '../catalogue/catalogue.repository';
import { decisionMail } from '../mail/decision-messages';
import { type MailDeps, queueMail } from '../mail/mail.service';
import { updateAggregatesForSubmission } from '../statistics/aggregates';
import * as moderation from './moderation.repository';

const TRANSITIONS: Record<Decision, { from: SubmissionStatus[]; to: SubmissionStatus; verb: string }> = {
  accept: { from: ['awaiting_review'], to: 'accepted', verb: 'accepted' },
  reject: { from: ['awaiting_review', 'sent_back'], to: 'rejected', verb: 'rejected' },
  send_back: { from: ['awaiting_review'], to: 'sent_back', verb: 'sent back' },
  withdraw: { from: ['accepted'], to: 'withdrawn', verb: 'withdrawn' },
};

const STATUS_WORDS: Record<SubmissionStatus, string> = {
  received: 'received',
  analysing: 'being analysed',
  awaiting_review: 'awaiting review',
  sent_back: 'sent back to the rider',
  accepted: 'accepted',
  rejected: 'rejected',
  withdrawn: 'withdrawn',
  failed: 'failed',
};

const MAIL_OF: Partial<Record<Decision, 'submission_accepted' | 'submission_rejected' | 'submission_sent_back'>> = {
  accept: 'submission_accepted',
  reject: 'submission_rejected',
  send_back: 'submission_sent_back',
};

export interface DecideSubmissionCommand {
  submissionId: number;
  moderatorId: number;
  decision: Decision;
  /** reject: one of REJECT_REASONS; withdraw: why it leaves the statistics. */
  reason?: string | null;
  note?: string | null;
  /** The version the moderator saw; a different current version is a conflict. */
  expectedVersion?: number;
}

export interface DecisionOutcome {
  id: number;
  status: SubmissionStatus;
  version: number;
  mailId: number | null;
}

/**
 * Applies one moderator's decision in one transaction: the status change, the
 * statistics (a submission entering or leaving `accepted`), the audit entry and
 * the e-mail to the rider (when `mail` is given; sent by the mail job after commit).
 */
export async function decideSubmission(db: Knex, command: DecideSubmissionCommand, mail?: MailDeps): Promise<DecisionOutcome> {
  const transition = TRANSITIONS[command.decision];
  return db.transaction(async (trx) => {
    const current = await lockedForChange(trx, command.submissionId, command.moderatorId, command.expectedVersion);
    if (!transition.from.includes(current.status)) {
      throw new ConflictError(`This submission is ${STATUS_WORDS[current.status]}, so it cannot be ${transition.verb}.`, {
        status: current.status,
        version: current.version,
      });
    }
    const reason = command.reason ?? null;
    const note = command.note ?? null;
    const version = await moderation.updateDecision(trx, current.id, {
      status: transition.to,
      reason,
      note,
      decidedBy: command.moderatorId,
    });
    if (transition.to === 'accepted') await updateAggregatesForSubmission(trx, current.id, 'add');
    if (current.status === 'accepted') await updateAggregatesForSubmission(trx, current.id, 'remove');

    await recordAudit(trx, {
      actorId: command.moderatorId,
      action: `submission.${transition.to}`,
      subjectType: 'submission',
      subjectId: current.id,
      reason: [reason, note].filter(Boolean).join(': ') || null,
      before: { status: current.status, version: current.version, reason: current.decisionReason, note: current.decisionNote },
      after: { status: transition.to, version, reason, note },
    });

    const kind = MAIL_OF[command.decision];
    const mailId =
      mail && kind && current.riderId !== null ? await mailRider(trx, mail, current.id, current.riderId, kind, reason, note) : null;
    return { id: current.id, status: transition.to, version, mailId };
  });
}

/** Locks the submission, checks the moderator's independence and the version they saw. */
async function lockedForChange(trx: Knex.Transaction, submissionId: number, actorId: number, expectedVersion: number | undefined) {
  const current = await moderation.lockSubmission(trx, submissionId);
  if (!current) throw new NotFoundError('No such submission.');
  assertIndependentOf(
    { makerIds: await moderation.staffMakerIdsOf(trx, actorId) },
    await moderation.makerIdsOfSubmission(trx, submissionId),
  );
  if (expectedVersion !== undefined && expectedVersion !== current.version) {
    throw new ConflictError(
      `Someone changed this submission while you were looking at it: it is now ${STATUS_WORDS[current.status]}. Reload it to see what changed, then decide again.`,
      { status: current.status, version: current.version },
    );
  }
  return current;
}

async function mailRider(
  trx: Knex.Transaction,
  mail: MailDeps,
  submissionId: number,
  riderId: number,
  kind: 'submission_accepted' | 'submission_rejected' | 'submission_sent_back',
  reason: string | null,
  note: string | null,
) {
  const facts = await trx('users').where({ id: riderId }).first('name');
  const comparison = await comparisonWords(trx, submissionId);
  const { subject, text } = decisionMail(kind, {
    submissionId,
    riderName: facts?.name ?? 'rider',
    comparison,
    submissionUrl: `${publicUrl(mail.config)}/submissions/${submissionId}`,
    reason: reason as RejectReason | null,
    note,
  });
  return queueMail(trx, mail, { userId: riderId, kind, subject, text });
}

async function comparisonWords(db: Knex | Knex.Transaction, submissionId: number): Promise<string> {
  const sides = await db('submission_recordings as r')
    .join('models as m', 'm.id', 'r.model_id')
    .join('firmware_versions as f', 'f.id', 'r.firmware_id')
    .where('r.submission_id', submissionId)
    .orderBy('r.side')
    .select('m.name', 'f.version');
  return sides.map((s) => `${s.name} ${s.version}`).join(' against ');
}

// Tags

export type TagChangeOutcome = TagChangeResult;

/** A moderator corrects a submission's tags; recorded as a correction, with before and after. */
export async function correctSubmissionTags(
  db: Knex,
  command: { submissionId: number; moderatorId: number } & CorrectTagsInput,
): Promise<TagChangeOutcome> {
  return db.transaction(async (trx) => {
    const current = await lockedForChange(trx, command.submissionId, command.moderatorId, command.expectedVersion);
    if (!['awaiting_review', 'sent_back', 'accepted'].includes(current.status)) {
      throw new ConflictError(
        `This submission is ${STATUS_WORDS[current.status]}; only submissions awaiting review, sent back or accepted can have their tags corrected.`,
      );
    }
    // The statistics lose the submission under its old tags and regain it under the new ones.
    if (current.status === 'accepted') await updateAggregatesForSubmission(trx, current.id, 'remove');
    const outcome = await changeTagsAndRecord(trx, current, {
      actorId: command.moderatorId,
      action: 'submission.tags_corrected',
      note: command.note,
      changes: { a: command.a, b: command.b },
      settledStatus: current.status,
    });
    // Independence covers the makers the submission is moved to, too.
    assertIndependentOf(
      { makerIds: await moderation.staffMakerIdsOf(trx, command.moderatorId) },
      await moderation.makerIdsOfSubmission(trx, current.id),
    );
    if (outcome.status === 'accepted') await updateAggregatesForSubmission(trx, current.id, 'add');
    return outcome;
  });
}

/** The rider corrects the tags of a submission that was sent back; it returns to the queue. */
export async function resubmitTags(
  db: Knex,
  command: {
    submissionId: number;
    riderId: number;
    a?: Partial<RecordingTagsInput>;
    b?: Partial<RecordingTagsInput>;
    note?: string;
    expectedVersion: number;
  },
): Promise<TagChangeOutcome> {
  return db.transaction(async (trx) => {
    const current = await moderation.lockSubmission(trx, command.submissionId);
    if (!current || current.riderId !== command.riderId) throw new NotFoundError('No such submission among yours.');
    if (current.version !== command.expectedVersion) {
      throw new ConflictError('This submission changed since you opened it. Reload it to see what changed.', {
        status: current.status,
        version: current.version,
      });
    }
    if (current.status !== 'sent_back') {
      throw new ConflictError(
        `This submission is ${STATUS_WORDS[current.status]}; you can change its tags only when a moderator sends it back.`,
      );
    }
    return changeTagsAndRecord(trx, current, {
      actorId: command.riderId,
      action: 'submission.tags_edited',
      note: command.note,
      changes: { a: command.a, b: command.b },
      settledStatus: 'awaiting_review',
    });
  });
}

/** Changes the tags, moves the submission on (through a new analysis if needed) and records it. */
async function changeTagsAndRecord(
  trx: Knex.Transaction,
  current: moderation.LockedSubmission,
  options: { actorId: number; action: string; note?: string; changes: TagChanges; settledStatus: SubmissionStatus },
): Promise<TagChangeOutcome> {
  const change = await changeTags(trx, current.id, current.riderId, options.changes);
  const status: SubmissionStatus = change.reanalyse ? 'received' : options.settledStatus;
  const version = await moderation.bumpAfterTagChange(trx, current.id, status, change.reanalyse);
  await recordAudit(trx, {
    actorId: options.actorId,
    action: options.action,
    subjectType: 'submission',
    subjectId: current.id,
    reason: options.note ?? null,
    before: { status: current.status, version: current.version, tags: change.before },
    after: { status, version, tags: change.after },
  });
  return { id: current.id, status, version, reanalyse: change.reanalyse };
}

type TagChanges = { a?: Partial<RecordingTagsInput>; b?: Partial<RecordingTagsInput> };

/** Writes the changed tags after checking them against the catalogue (the rider's own proposals count). */
async function changeTags(trx: Knex.Transaction, submissionId: number, riderId: number | null, changes: TagChanges) {
  const before = await moderation.tagsOf(trx, submissionId);
  const after: moderation.StoredTags[] = [];
  const fields: Record<string, string> = {};
  let reanalyse = false;
  for (const stored of before) {
    const change = changes[stored.side] ?? {};
    const next = { ...stored, ...change };
    const viewer = riderId ?? 0;
    const model = await findUsableModel(trx, next.modelId, viewer);
    if (!model) fields[`${stored.side}.modelId`] = 'this model is not in the catalogue';
    else if (!(await findUsableFirmware(trx, next.firmwareId, next.modelId, viewer))) {
      fields[`${stored.side}.firmwareId`] = `this firmware version is not listed for ${model.name}`;
    }
    if (!(await findUsableRecordingDevice(trx, next.recordingDeviceId, viewer))) {
      fields[`${stored.side}.recordingDeviceId`] = 'this recording device is not in the catalogue';
    }
    // Position and the model's kind (before or after the drivetrain) shape the analysis itself.
    if (next.position !== stored.position) reanalyse = true;
    if (model && next.modelId !== stored.modelId) {
      const old = await findUsableModel(trx, stored.modelId, viewer);
      if (!old || old.kind !== model.kind) reanalyse = true;
    }
    after.push(next);
  }
  if (Object.keys(fields).length > 0) {
    throw new ValidationError(
      Object.entries(fields)
        .map(([f, m]) => `${f}: ${m}`)
        .join('; '),
      { fields },
    );
  }
  for (const tags of after) await moderation.updateTags(trx, submissionId, tags.side, tags);
  return { before, after, reanalyse };
}
