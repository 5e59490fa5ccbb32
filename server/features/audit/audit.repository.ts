import type { Knex } from 'knex';
import type { AuditEntry, AuditLogQuery } from '../../../shared/schemas/auth';

export interface AuditRecord {
  actorId: number | null;
  /** What happened, as `subject.verb`: `role.granted`, `submission.rejected`, … */
  action: string;
  subjectType: string;
  subjectId: string | number;
  reason?: string | null;
  before?: unknown;
  after?: unknown;
}

/**
 * Records one change. Pass the transaction that makes the change, so the change
 * and its record are written together or not at all.
 */
export async function recordAudit(dbOrTrx: Knex | Knex.Transaction, record: AuditRecord): Promise<void> {
  await dbOrTrx('audit_log').insert({
    actor_id: record.actorId,
    action: record.action,
    subject_type: record.subjectType,
    subject_id: String(record.subjectId),
    reason: record.reason ?? null,
    before: record.before === undefined ? null : JSON.stringify(record.before),
    after: record.after === undefined ? null : JSON.stringify(record.after),
  });
}

export const AUDIT_PAGE_SIZE = 50;

/** An audit_log row joined with its actor's handle and name. */
interface AuditLogRecord {
  id: number | string;
  actor_id: number | null;
  actor_handle: string | null;
  actor_name: string;
  action: string;
  subject_type: string;
  subject_id: string;
  reason: string | null;
  before: unknown;
  after: unknown;
  created_at: Date;
}

export async function listAuditLog(db: Knex, query: AuditLogQuery): Promise<{ entries: AuditEntry[]; total: number }> {
  const filtered = db('audit_log as a').modify((q) => {
    if (query.subjectType) q.where('a.subject_type', query.subjectType);
    if (query.action) q.where('a.action', query.action);
  });
  const [{ count }] = await filtered.clone().count<{ count: string }[]>({ count: '*' });
  const rows = await filtered
    .clone()
    .leftJoin('users as u', 'u.id', 'a.actor_id')
    .select('a.*', 'u.handle as actor_handle', 'u.name as actor_name')
    .orderBy('a.id', 'desc')
    .limit(AUDIT_PAGE_SIZE)
    .offset((query.page - 1) * AUDIT_PAGE_SIZE);
  return {
    total: Number(count),
    entries: rows.map((r: AuditLogRecord) => ({
      id: Number(r.id),
      actor: r.actor_id ? { id: r.actor_id, handle: r.actor_handle ?? '', name: r.actor_name } : null,
      action: r.action,
      subjectType: r.subject_type,
      subjectId: r.subject_id,
      reason: r.reason,
      before: r.before,
      after: r.after,
      createdAt: new Date(r.created_at).toISOString(),
    })),
  };
}
