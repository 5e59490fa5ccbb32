import { formatDayAndTime } from '@/lib/format-date';
import { useState } from 'react';
import type { AuditEntry } from '@shared/schemas/auth';
import { useAuditLog } from '../api/get-audit-log';

function describeChange(entry: AuditEntry): string {
  const show = (value: unknown) => (value == null ? '—' : JSON.stringify(value));
  if (entry.before == null && entry.after == null) return '';
  return `${show(entry.before)} → ${show(entry.after)}`;
}

/** Who changed what, newest first. */
export function AuditLogTable() {
  const [page, setPage] = useState(1);
  const log = useAuditLog(page);
  if (log.isPending)
    return (
      <p role="status" className="text-ink-soft">
        Loading the audit log…
      </p>
    );
  if (log.isError)
    return (
      <p role="alert" className="text-alert-800">
        Could not load the audit log: {log.error.message}
      </p>
    );
  const pages = Math.max(1, Math.ceil(log.data.total / log.data.pageSize));
  return (
    <div className="space-y-4">
      <div className="overflow-x-auto rounded-card border border-paper-line bg-white shadow-card">
        <table className="w-full text-left text-caption">
          <thead className="bg-paper-deep text-ink-soft">
            <tr>
              <th scope="col" className="px-4 py-2 font-semibold">
                When
              </th>
              <th scope="col" className="px-4 py-2 font-semibold">
                Who
              </th>
              <th scope="col" className="px-4 py-2 font-semibold">
                What
              </th>
              <th scope="col" className="px-4 py-2 font-semibold">
                Subject
              </th>
              <th scope="col" className="px-4 py-2 font-semibold">
                Change
              </th>
              <th scope="col" className="px-4 py-2 font-semibold">
                Reason
              </th>
            </tr>
          </thead>
          <tbody>
            {log.data.entries.map((entry) => (
              <tr key={entry.id} className="border-t border-paper-line align-top">
                <td className="whitespace-nowrap px-4 py-2 text-ink-soft">{formatDayAndTime(entry.createdAt)}</td>
                <td className="px-4 py-2">{entry.actor ? `@${entry.actor.handle || 'deleted'}` : 'system'}</td>
                <td className="px-4 py-2 font-medium">{entry.action}</td>
                <td className="px-4 py-2">
                  {entry.subjectType} #{entry.subjectId}
                </td>
                <td className="max-w-md px-4 py-2 font-mono text-[0.75rem] text-ink-soft">{describeChange(entry)}</td>
                <td className="px-4 py-2 text-ink-soft">{entry.reason ?? ''}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <nav aria-label="Pages of the audit log" className="flex items-center gap-3">
        <button
          type="button"
          disabled={page <= 1}
          onClick={() => setPage(page - 1)}
          className="rounded-full border border-paper-line px-3 py-1 disabled:opacity-40"
        >
          Newer
        </button>
        <span className="text-caption text-ink-soft">
          Page {page} of {pages}
        </span>
        <button
          type="button"
          disabled={page >= pages}
          onClick={() => setPage(page + 1)}
          className="rounded-full border border-paper-line px-3 py-1 disabled:opacity-40"
        >
          Older
        </button>
      </nav>
    </div>
  );
}
