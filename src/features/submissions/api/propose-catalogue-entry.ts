import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ProposeCatalogueEntryInput, ProposedEntry } from '@shared/schemas/catalogue';
import { api } from '@/lib/api-client';
import { getCatalogueQueryOptions } from './get-catalogue';

export function proposeCatalogueEntry(input: ProposeCatalogueEntryInput): Promise<ProposedEntry> {
  return api.post<ProposedEntry>('/api/catalogue/proposals', input);
}

/** A proposal is usable by its proposer at once, so the catalogue is fetched again. */
export function useProposeCatalogueEntry() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: proposeCatalogueEntry,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: getCatalogueQueryOptions().queryKey }),
  });
}
