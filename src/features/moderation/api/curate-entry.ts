import { type QueryKey, useMutation, useQueryClient } from '@tanstack/react-query';
import type { CatalogueEntryType, CurateEntryInput, CurationResult, MergeEntriesInput } from '@shared/schemas/moderation';
import { api } from '@/lib/api-client';
import { getCurationCatalogueQueryOptions } from './get-curation-catalogue';
import { getPendingEntriesQueryOptions } from './get-pending-entries';

export type CurationAction =
  | { kind: 'curate'; type: CatalogueEntryType; id: number; input: CurateEntryInput }
  | { kind: 'merge'; type: CatalogueEntryType; id: number; input: MergeEntriesInput };

export function curateEntry(action: CurationAction) {
  const path = `/api/moderation/catalogue/${action.type}/${action.id}${action.kind === 'merge' ? '/merge' : ''}`;
  return api.post<CurationResult>(path, action.input);
}

/**
 * Approve, reject, rename or merge a catalogue entry; the pending list and the
 * moderators' catalogue refresh afterwards, and so do the pages in `affects`
 * (their own query keys, passed by the page that composes this).
 */
export function useCurateEntry({ affects = [] }: { affects?: QueryKey[] } = {}) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: curateEntry,
    onSuccess: (_result, action) => {
      for (const queryKey of [getPendingEntriesQueryOptions().queryKey, getCurationCatalogueQueryOptions().queryKey])
        void queryClient.invalidateQueries({ queryKey });
      // After a merge the merged entry's page is gone (the page moves on to the kept
      // one): mark the pages stale without refetching the one still on screen.
      for (const queryKey of affects)
        void queryClient.invalidateQueries({ queryKey, refetchType: action.kind === 'merge' ? 'none' : 'active' });
    },
  });
}
