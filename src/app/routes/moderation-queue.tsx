import { Link, useSearchParams } from 'react-router-dom';
import { reviewQueueQuery } from '@shared/schemas/moderation';
import { RequireAccess } from '@/features/auth/components/require-access';
import type { QueueFilters } from '@/features/moderation/api/get-review-queue';
import { ReviewQueueTable } from '@/features/moderation/components/review-queue-table';

export function ModerationQueueRoute() {
  const [params, setParams] = useSearchParams();
  // The filters live in the URL, so a filtered queue can be shared and survives a reload.
  const parsed = reviewQueueQuery.safeParse(Object.fromEntries(params));
  const filters: QueueFilters = parsed.success ? parsed.data : {};
  const onFilters = (next: QueueFilters) => {
    const search = new URLSearchParams();
    for (const [key, value] of Object.entries(next)) if (value !== undefined && !(key === 'page' && value === 1)) search.set(key, String(value));
    setParams(search);
  };
  return (
    <RequireAccess roles={['moderator']}>
      {() => (
        <div className="space-y-6">
          <header className="flex flex-wrap items-end justify-between gap-3">
            <div>
              <p className="text-caption font-semibold uppercase tracking-widest text-ember-700">Moderation</p>
              <h1 className="text-title font-semibold">Review queue</h1>
              <p className="max-w-2xl text-ink-soft">Analysed submissions waiting for a decision. The most severe flags come first, then the longest waiting.</p>
            </div>
            <Link to="/moderation/catalogue" className="text-fjord-700 underline underline-offset-4">
              Catalogue proposals
            </Link>
          </header>
          <ReviewQueueTable filters={filters} onFilters={onFilters} />
        </div>
      )}
    </RequireAccess>
  );
}
