import { queryOptions, useQuery } from '@tanstack/react-query';
import type { LinkableSubmission } from '@shared/schemas/threads';
import { api } from '@/lib/api-client';

export function getLinkableSubmissions(slug: string): Promise<{ submissions: LinkableSubmission[] }> {
  return api.get(`/api/models/${encodeURIComponent(slug)}/linkable-submissions`);
}

export function getLinkableSubmissionsQueryOptions(slug: string) {
  return queryOptions({ queryKey: ['models', slug, 'linkable-submissions'], queryFn: () => getLinkableSubmissions(slug) });
}

export function useLinkableSubmissions(slug: string, enabled: boolean) {
  return useQuery({ ...getLinkableSubmissionsQueryOptions(slug), enabled });
}
