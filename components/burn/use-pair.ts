import { useQueryClient } from '@tanstack/react-query';
import { useEffect } from 'react';
import type { Pair } from '../../shared/schemas/burn';
import { burnKeys, usePairQuery } from '../api/burn';
import { cachedPair, cachePair, onSynced } from './outbox';

/** The test from the server, or the last copy kept on this device when there is no connection. */
export function usePairWithCache(
  labId: string,
  pairId: string,
): { pair: Pair | undefined; offlineCopy: boolean; error: unknown } {
  const query = usePairQuery(labId, pairId);
  const client = useQueryClient();
  useEffect(() => {
    if (query.data) cachePair(query.data);
  }, [query.data]);
  useEffect(
    () =>
      onSynced((pair) => {
        if (pair.id === pairId) client.setQueryData(burnKeys.pair(labId, pairId), pair);
      }),
    [client, labId, pairId],
  );
  if (query.data) return { pair: query.data, offlineCopy: false, error: undefined };
  const copy = cachedPair(pairId);
  return { pair: copy, offlineCopy: Boolean(copy), error: query.error };
}
