import { keepPreviousData, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { rankingSchema } from '../../shared/schemas/ranking';
import { apiRequest } from './client';

export type RankingFilters = {
  substrate?: string;
  sort: 'treated_char' | 'reduction';
  profile?: string;
  from?: string;
  to?: string;
  igniter?: string;
  orientation?: string;
  exposureS?: string;
  unreviewed?: boolean;
};

export function rankingQueryString(f: RankingFilters): string {
  const params = new URLSearchParams();
  for (const [key, value] of Object.entries(f)) {
    if (value === undefined || value === '' || value === false) continue;
    params.set(key, String(value));
  }
  return params.toString();
}

export const rankingKeys = {
  ranking: (labId: string, qs: string) => ['labs', labId, 'rankings', qs] as const,
  presets: (labId: string) => ['labs', labId, 'criteria-presets'] as const,
};

export function useRankingQuery(labId: string, filters: RankingFilters) {
  const qs = rankingQueryString(filters);
  return useQuery({
    queryKey: rankingKeys.ranking(labId, qs),
    queryFn: ({ signal }) =>
      apiRequest(`/api/labs/${labId}/rankings?${qs}`, rankingSchema, { signal }),
    placeholderData: keepPreviousData,
  });
}

const presetsSchema = z.object({
  presets: z.array(
    z.object({
      key: z.string(),
      name: z.string(),
      source: z.string().nullable(),
      caution: z.string(),
      description: z.string().nullable(),
    }),
  ),
});

export function usePresetsQuery(labId: string) {
  return useQuery({
    queryKey: rankingKeys.presets(labId),
    queryFn: ({ signal }) =>
      apiRequest(`/api/labs/${labId}/criteria-presets`, presetsSchema, { signal }),
    staleTime: Infinity,
  });
}
