import { signedPercent } from '@/lib/format-figures';
import { Link } from 'react-router-dom';
import type { ReviewQueueRow as QueueRow } from '@shared/schemas/moderation';
import { type QueueFilters, useReviewQueue } from '../api/get-review-queue';
import { SeverityBadge } from './severity-badge';

const waited = (iso: string) => {
  const days = Math.floor((Date.now() - new Date(iso).getTime()) / 86_400_000);
  return days === 0 ? 'today' : days === 1 ? '1 day' : `${days} days`;
};

/** Submissions awaiting review, worst flags first; the filters live in the page's URL. */
export function ReviewQueueTable({ filters, onFilters }: { filters: QueueFilters; onFilters: (next: QueueFilters) => void }) {
  const queue = useReviewQueue(filters);
  if (queue.isPending)
    return (
      <p className="text-ink-soft" role="status">
        Loading the queue…
      </p>
    );
  if (queue.isError)
    return (
      <p className="text-alert-800" role="alert">
        The queue could not be loaded: {queue.error.message}
      </p>
    );
  const { submissions, total, flagCounts, pageSize } = queue.data;
  const makers = new Map<number, string>();
  for (const row of submissions) for (const r of row.recordings ?? []) makers.set(r.makerId, r.makerName);
  const page = filters.page ?? 1;

  return (
    <div className="space-y-4">
      <form
        className="flex flex-wrap items-end gap-4 rounded-card border border-paper-line bg-white p-4 shadow-card"
        onSubmit={(e) => e.preventDefault()}
      >
        <label className="flex flex-col gap-1 text-caption font-medium">
          Flag
          <select
            className="rounded-lg border border-paper-line bg-paper px-3 py-2"
            value={filters.flag ?? ''}
            onChange={(e) => onFilters({ ...filters, flag: e.target.value || undefined, page: 1 })}
          >
            <option value="">Any flag</option>
            {flagCounts.map((f) => (
              <option key={f.code} value={f.code}>
                {f.code.replace(/_/g, ' ')} ({f.count})
              </option>
            ))}
          </select>
        </label>
        <label className="flex flex-col gap-1 text-caption font-medium">
          Maker
          <select
            className="rounded-lg border border-paper-line bg-paper px-3 py-2"
            value={filters.maker ?? ''}
            onChange={(e) => onFilters({ ...filters, maker: e.target.value ? Number(e.target.value) : undefined, page: 1 })}
          >
            <option value="">Any maker</option>
            {[...makers].map(([id, name]) => (
              <option key={id} value={id}>
                {name}
              </option>
            ))}
          </select>
        </label>
        <label className="flex flex-col gap-1 text-caption font-medium">
          Waiting at least
          <select
            className="rounded-lg border border-paper-line bg-paper px-3 py-2"
            value={filters.minAgeDays ?? ''}
            onChange={(e) => onFilters({ ...filters, minAgeDays: e.target.value ? Number(e.target.value) : undefined, page: 1 })}
          >
            <option value="">Any time</option>
            <option value="1">1 day</option>
            <option value="3">3 days</option>
            <option value="7">a week</option>
          </select>
        </label>
        {(filters.flag || filters.maker || filters.model || filters.minAgeDays !== undefined) && (
          <button
            type="button"
            className="text-caption font-semibold text-fjord-700 underline underline-offset-2"
            onClick={() => onFilters({})}
          >
            Clear filters
          </button>
        )}
        <p className="ml-auto text-caption text-ink-soft" aria-live="polite">
          {total} awaiting review
        </p>
      </form>

      {submissions.length === 0 ? (
        <p className="rounded-card border border-dashed border-paper-line p-8 text-center text-ink-soft">
          Nothing waits here. The queue is clear.
        </p>
      ) : (
        <div className="overflow-x-auto rounded-card border border-paper-line bg-white shadow-card">
          <table className="w-full text-left text-caption">
            <caption className="sr-only">Submissions awaiting review, most severe flags first</caption>
            <thead className="border-b border-paper-line bg-paper-deep text-ink-soft">
              <tr>
                <th scope="col" className="px-4 py-3">
                  Submission
                </th>
                <th scope="col" className="px-4 py-3">
                  Meters
                </th>
                <th scope="col" className="px-4 py-3 text-right">
                  Bias A vs B
                </th>
                <th scope="col" className="px-4 py-3 text-right">
                  Dropouts A / B
                </th>
                <th scope="col" className="px-4 py-3">
                  Flags
                </th>
                <th scope="col" className="px-4 py-3">
                  Waiting
                </th>
              </tr>
            </thead>
            <tbody>
              {submissions.map((row) => (
                <QueueTableRow key={row.id} row={row} />
              ))}
            </tbody>
          </table>
        </div>
      )}
      {total > pageSize && (
        <nav aria-label="Queue pages" className="flex items-center gap-3">
          <button
            type="button"
            disabled={page <= 1}
            className="rounded-lg border border-paper-line px-3 py-1.5 disabled:opacity-40"
            onClick={() => onFilters({ ...filters, page: page - 1 })}
          >
            Previous
          </button>
          <span className="text-caption text-ink-soft">
            Page {page} of {Math.ceil(total / pageSize)}
          </span>
          <button
            type="button"
            disabled={page * pageSize >= total}
            className="rounded-lg border border-paper-line px-3 py-1.5 disabled:opacity-40"
            onClick={() => onFilters({ ...filters, page: page + 1 })}
          >
            Next
          </button>
        </nav>
      )}
    </div>
  );
}

function QueueTableRow({ row }: { row: QueueRow }) {
  const [a, b] = row.recordings ?? [];
  return (
    <tr className="border-b border-paper-line last:border-0 hover:bg-paper/60">
      <td className="px-4 py-3">
        <Link to={`/moderation/submissions/${row.id}`} className="font-semibold text-fjord-700 underline underline-offset-2">
          #{row.id}
        </Link>
        <span className="block text-ink-faint">by {row.riderHandle ?? 'deleted rider'}</span>
      </td>
      <td className="px-4 py-3">
        <span className="block">
          <span className="mr-1 font-semibold text-ember-700">A</span>
          {a ? `${a.makerName} ${a.modelName} ${a.firmwareVersion}` : '–'}
        </span>
        <span className="block">
          <span className="mr-1 font-semibold text-moss-700">B</span>
          {b ? `${b.makerName} ${b.modelName} ${b.firmwareVersion}` : '–'}
        </span>
      </td>
      <td className="px-4 py-3 text-right tabular-nums">
        <span className="font-semibold">{signedPercent(row.biasPercent)}</span>
        {row.loaLowerPercent != null && row.loaUpperPercent != null && (
          <span className="block text-ink-faint">
            LoA {signedPercent(row.loaLowerPercent)} to {signedPercent(row.loaUpperPercent)}
          </span>
        )}
      </td>
      <td className="px-4 py-3 text-right tabular-nums">
        {row.aPowerDropouts ?? '–'} / {row.bPowerDropouts ?? '–'}
      </td>
      <td className="px-4 py-3">
        <SeverityBadge severity={row.flagSeverity} />
        <span className="mt-1 block text-ink-soft">{row.flags.map((f) => f.code.replace(/_/g, ' ')).join(', ')}</span>
      </td>
      <td className="px-4 py-3 text-ink-soft">{waited(row.createdAt)}</td>
    </tr>
  );
}
