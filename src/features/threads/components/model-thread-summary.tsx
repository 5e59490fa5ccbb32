import { Link } from 'react-router-dom';
import { useModelThreadSummary } from '../api/get-model-thread-summary';
import { ThreadStatusBadge } from './thread-status-badge';

/**
 * For the model page: how many reports are open and where the maker stands on
 * each thread they have answered. Links to the model's threads.
 */
export function ModelThreadSummary({ modelSlug }: { modelSlug: string }) {
  const summary = useModelThreadSummary(modelSlug);
  if (summary.isPending) return <p className="text-caption text-ink-faint">Loading discussions…</p>;
  if (summary.isError) return null;
  const { openCount, totalCount, threads } = summary.data;
  return (
    <section
      aria-labelledby="model-discussions"
      className="space-y-3 rounded-card border border-paper-line bg-white p-5"
      data-testid="model-thread-summary"
    >
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <h2 id="model-discussions" className="text-lead font-semibold text-ink">
          Discussions
        </h2>
        <Link to={`/models/${modelSlug}/threads`} className="text-caption font-semibold text-fjord-700 underline underline-offset-2">
          {totalCount === 0 ? 'Report something' : `All ${totalCount} threads`}
        </Link>
      </div>
      <p className="text-ink-soft">
        <span className="font-semibold tabular-nums text-ink">{openCount}</span> open {openCount === 1 ? 'report' : 'reports'}
      </p>
      {threads.length > 0 && (
        <ul className="space-y-2">
          {threads.map((t) => (
            <li key={t.id} className="flex flex-wrap items-center justify-between gap-2">
              <Link to={`/threads/${t.id}`} className="min-w-0 flex-1 truncate text-body text-ink hover:text-fjord-700">
                {t.title}
              </Link>
              <ThreadStatusBadge status={t.status} fixedIn={t.fixedIn} />
            </li>
          ))}
        </ul>
      )}
    </section>
  );
}
