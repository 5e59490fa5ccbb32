import { useSearchParams } from 'react-router-dom';
import { reviewQueueQuery } from '@shared/schemas/moderation';
import type { QueueFilters } from '@/features/moderation/api/get-review-queue';
import { ModerationPage } from '@/features/moderation/components/moderation-page';
import { ReviewQueueTable } from '@/features/moderation/components/review-queue-table';

export function ModerationQueueRoute() {
  const [params, setParams] = useSearchParams();
  // The filters live in the URL, so a filtered queue can be shared and survives a reload.
  const parsed = reviewQueueQuery.safeParse(Object.fromEntries(params));
  const filters: QueueFilters = parsed.success ? parsed.data : {};
  const onFilters = (next: QueueFilters) => {
    const search = new URLSearchParams();
    for (const [key, value] of Object.entries(next))
      if (value !== undefined && !(key === 'page' && value === 1)) search.set(key, String(value));
    setParams(search);
  };
  return (
    <ModerationPage
      title="Review queue"
      intro="Analysed submissions waiting for a decision. The most severe flags come first, then the longest waiting."
    >
      <ReviewQueueTable filters={filters} onFilters={onFilters} />
    </ModerationPage>
  );
}
