import { formatDayAndTime } from '@/lib/format-date';
import { useState } from 'react';
import { useOutbox } from '../api/get-outbox';

/** What the local fake SMTP service captured, newest first; each message opens to its full text. */
export function OutboxList() {
  const [page, setPage] = useState(1);
  const outbox = useOutbox(page);
  if (outbox.isPending)
    return (
      <p className="text-ink-soft" role="status">
        Loading the outbox…
      </p>
    );
  if (outbox.isError)
    return (
      <p className="text-alert-800" role="alert">
        The outbox could not be loaded: {outbox.error.message}
      </p>
    );
  const { messages, total, pageSize } = outbox.data;
  if (messages.length === 0)
    return (
      <p className="rounded-card border border-dashed border-paper-line p-8 text-center text-ink-soft">No e-mail has been sent yet.</p>
    );
  return (
    <div className="space-y-3">
      <p className="text-caption text-ink-soft">{total} captured messages</p>
      <ul className="space-y-3">
        {messages.map((m) => (
          <li key={m.id}>
            <details className="group rounded-card border border-paper-line bg-white shadow-card" data-testid="outbox-message">
              <summary className="flex cursor-pointer flex-wrap items-baseline gap-x-4 gap-y-1 p-4">
                <span className="font-semibold text-ink">{m.subject || '(no subject)'}</span>
                <span className="text-caption text-ink-soft">to {m.recipients.join(', ')}</span>
                <span className="ml-auto text-caption text-ink-faint">{formatDayAndTime(m.receivedAt)}</span>
              </summary>
              <pre className="overflow-x-auto whitespace-pre-wrap border-t border-paper-line p-4 font-sans text-caption text-ink">
                {m.text}
              </pre>
            </details>
          </li>
        ))}
      </ul>
      {total > pageSize && (
        <nav aria-label="Outbox pages" className="flex items-center gap-3">
          <button
            type="button"
            disabled={page <= 1}
            className="rounded-lg border border-paper-line px-3 py-1.5 disabled:opacity-40"
            onClick={() => setPage(page - 1)}
          >
            Newer
          </button>
          <button
            type="button"
            disabled={page * pageSize >= total}
            className="rounded-lg border border-paper-line px-3 py-1.5 disabled:opacity-40"
            onClick={() => setPage(page + 1)}
          >
            Older
          </button>
        </nav>
      )}
    </div>
  );
}
