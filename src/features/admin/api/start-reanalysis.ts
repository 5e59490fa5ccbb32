import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ReanalysisRunView } from '@shared/schemas/reanalysis';
import { api } from '@/lib/api-client';
import { getReanalysisQueryOptions } from './get-reanalysis';

export function startReanalysis(): Promise<{ run: ReanalysisRunView }> {
  return api.post<{ run: ReanalysisRunView }>('/api/admin/reanalysis', { source: 'streams' });
}

export function useStartReanalysis() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: startReanalysis,
    onSettled: () => queryClient.invalidateQueries({ queryKey: getReanalysisQueryOptions().queryKey }),
  });
}
