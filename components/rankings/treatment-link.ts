import { rankingQueryString, type RankingFilters } from '../api/rankings';

/**
 * The detail screen of a treatment, carrying the ranking's filters and criteria profile. The key
 * holds free substrate text (spaces, commas, slashes, %), so it is encoded as one path segment.
 */
export function treatmentHref(labId: string, key: string, filters: RankingFilters): string {
  const qs = rankingQueryString(filters);
  return `/labs/${labId}/rankings/${encodeURIComponent(key)}${qs ? `?${qs}` : ''}`;
}
