import { Link } from 'react-router-dom';
import type { ThreadSummary } from '@shared/schemas/threads';
import { formatDay } from '@/lib/format-date';
import { ThreadStatusBadge } from './thread-status-badge';

export function ThreadList({ threads }: { threads: ThreadSummary[] }) {
  if (threads.length === 0)
    return <p className="rounded-card bg-paper-deep p-6 text-ink-soft">No threads match. Quiet is good news for a power meter.</p>;
  return (
    <ul className="divide-y divide-paper-line rounded-card border border-paper-line bg-white" aria-label="Threads">
      {threads.map((t) => (
        <li key={t.id} className="flex flex-wrap items-center gap-x-4 gap-y-2 px-5 py-4">
          <div className="min-w-0 flex-1 space-y-1">
            <Link to={`/threads/${t.id}`} className="block font-semibold text-ink hover:text-fjord-700">
              {t.title}
            </Link>
            <p className="text-caption text-ink-faint">
              {t.author.name}
              {t.firmware && ` · firmware ${t.firmware.version}`} · {t.replyCount} {t.replyCount === 1 ? 'reply' : 'replies'} · active{' '}
              {formatDay(t.lastActivityOn)}
              {t.locked && ' · locked'}
            </p>
          </div>
          {t.makerResponded && (
            <span className="text-caption font-semibold text-fjord-700">
              {t.hasOfficialResponse ? 'Official response' : 'Maker replied'}
            </span>
          )}
          <ThreadStatusBadge status={t.status} fixedIn={t.fixedIn} />
        </li>
      ))}
    </ul>
  );
}
