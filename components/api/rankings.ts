import { keepPreviousData, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { CriteriaProfileInput } from '../../shared/criteria/types';
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

const filterKeys = [
  'substrate',
  'sort',
  'profile',
  'from',
  'to',
  'igniter',
  'orientation',
  'exposureS',
] as const;

/** The filters carried in a URL's search params (the inverse of rankingQueryString). */
export function rankingFiltersFrom(
  params: Record<string, string | string[] | undefined>,
): RankingFilters {
  const filters: RankingFilters = { sort: 'treated_char' };
  for (const key of filterKeys) {
    const raw = params[key];
    const value = Array.isArray(raw) ? raw[0] : raw;
    if (value) Object.assign(filters, { [key]: value });
  }
  if (filters.sort !== 'reduction') filters.sort = 'treated_char';
  if (params.unreviewed === 'true') filters.unreviewed = true;
  return filters;
}

export const rankingKeys = {
  ranking: (labId: string, qs: string) => ['labs', labId, 'rankings', qs] as const,
  treatment: (labId: string, key: string, qs: string) =>
    ['labs', labId, 'rankings', 'treatment', key, qs] as const,
  presets: (labId: string) => ['labs', labId, 'criteria-presets'] as const,
};

export function useRankingQuery(labId: string, filters: RankingFilters) {
  const qs = rankingQueryString(filters);
  return useQuery({
    queryKey: rankingKeys.ranking(labId, qs),
    queryFn: ({ signal }) =>
      apiRequest(`/api/labs/${labId}/rankings?${qs}`, (k) => k.rankingSchema, { signal }),
    placeholderData: keepPreviousData,
  });
}

/** One treatment of the ranking with its pairs, under the same filters as the ranking. */
export function useTreatmentQuery(labId: string, key: string, filters: RankingFilters) {
  const qs = rankingQueryString(filters);
  return useQuery({
    queryKey: rankingKeys.treatment(labId, key, qs),
    queryFn: ({ signal }) =>
      apiRequest(
        `/api/labs/${labId}/rankings/treatments/${encodeURIComponent(key)}?${qs}`,
        (k) => k.treatmentDetailSchema,
        { signal },
      ),
  });
}

export function usePresetsQuery(labId: string) {
  return useQuery({
    queryKey: rankingKeys.presets(labId),
    queryFn: ({ signal }) =>
      apiRequest(`/api/labs/${labId}/criteria-presets`, (k) => k.criteriaPresetListSchema, {
        signal,
      }),
    staleTime: Infinity,
  });
}

export const criteriaKeys = {
  profiles: (labId: string) => ['labs', labId, 'criteria-profiles'] as const,
};

export function useCriteriaProfilesQuery(labId: string) {
  return useQuery({
    queryKey: criteriaKeys.profiles(labId),
    queryFn: ({ signal }) =>
      apiRequest(`/api/labs/${labId}/criteria-profiles`, (k) => k.criteriaProfileListSchema, {
        signal,
      }),
  });
}

export function useCriteriaMutations(labId: string) {
  const client = useQueryClient();
  const done = () => {
    void client.invalidateQueries({ queryKey: criteriaKeys.profiles(labId) });
    void client.invalidateQueries({ queryKey: ['labs', labId, 'rankings'] });
  };
  return {
    copy: useMutation({
      mutationFn: (presetKey: string) =>
        apiRequest(
          `/api/labs/${labId}/criteria-profiles/copy-preset`,
          (k) => k.criteriaProfileOutputSchema,
          { method: 'POST', body: { presetKey } },
        ),
      onSuccess: done,
    }),
    save: useMutation({
      mutationFn: ({ id, input }: { id: string; input: CriteriaProfileInput }) =>
        apiRequest(
          `/api/labs/${labId}/criteria-profiles/${id}`,
          (k) => k.criteriaProfileOutputSchema,
          {
            method: 'PUT',
            body: input,
          },
        ),
      onSuccess: done,
    }),
    remove: useMutation({
      mutationFn: (id: string) =>
        apiRequest(`/api/labs/${labId}/criteria-profiles/${id}`, (k) => k.ignoredAnswerSchema, {
          method: 'DELETE',
        }),
      onSuccess: done,
    }),
  };
}
