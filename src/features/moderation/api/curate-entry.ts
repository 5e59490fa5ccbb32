import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CatalogueEntryType, CurateEntryInput, MergeEntriesInput } from '@shared/schemas/moderation';
import { api } from '@/lib/api-client';
import { getPendingEntriesQueryOptions } from './get-pending-entries';

export type CurationAction =
  | { kind: 'curate'; type: CatalogueEntryType; id: number; input: CurateEntryInput }
  | { kind: 'merge'; type: CatalogueEntryType; id: number; input: MergeEntriesInput };

export function curateEntry(action: CurationAction) {
  const path = `/api/moderation/catalogue/${action.type}/${action.id}${action.kind === 'merge' ? '/merge' : ''}`;
  return api.post<unknown>(path, action.input);
}

/** Approve, reject, rename or merge a catalogue entry; the pending list refreshes afterwards. */
export function useCurateEntry() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: curateEntry,
    onSuccess: () => void queryClient.invalidateQueries({ queryKey: getPendingEntriesQueryOptions().queryKey }),
  });
}
