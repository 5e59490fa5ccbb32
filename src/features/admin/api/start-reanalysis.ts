import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ReanalysisRunView, ReanalysisSource } from '@shared/schemas/reanalysis';
import { api } from '@/lib/api-client';
import { getReanalysisQueryOptions } from './get-reanalysis';

export function startReanalysis(source: ReanalysisSource = 'streams'): Promise<{ run: ReanalysisRunView }> {
  return api.post<{ run: ReanalysisRunView }>('/api/admin/reanalysis', { source });
}

export function useStartReanalysis() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: startReanalysis,
    onSettled: () => queryClient.invalidateQueries({ queryKey: getReanalysisQueryOptions().queryKey }),
  });
}
