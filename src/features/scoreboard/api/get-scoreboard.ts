import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { ScoreboardPage, ScoreboardQuery } from '@shared/schemas/statistics';
import { api } from '@/lib/api-client';

export type ScoreboardFilters = Partial<ScoreboardQuery>;

export function scoreboardSearch(filters: ScoreboardFilters): string {
  const params = new URLSearchParams();
  for (const [key, value] of Object.entries(filters)) {
    if (value !== undefined && value !== '' && value !== null) params.set(key, String(value));
  }
  return params.toString();
}

export function getScoreboard(filters: ScoreboardFilters): Promise<ScoreboardPage> {
  return api.get<ScoreboardPage>(`/api/scoreboard?${scoreboardSearch(filters)}`);
}

export function getScoreboardQueryOptions(filters: ScoreboardFilters) {
  return queryOptions({ queryKey: ['scoreboard', filters], queryFn: () => getScoreboard(filters), placeholderData: keepPreviousData });
}

export function useScoreboard(filters: ScoreboardFilters) {
  return useQuery(getScoreboardQueryOptions(filters));
}
