import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type {
  CreatePairInput,
  CreateSessionInput,
  MeasurementInput,
  Pair,
} from '../../shared/schemas/burn';
import { apiRequest } from './client';

export const burnKeys = {
  sessions: (labId: string) => ['labs', labId, 'burn-sessions'] as const,
  session: (labId: string, id: string) => ['labs', labId, 'burn-sessions', id] as const,
  pair: (labId: string, id: string) => ['labs', labId, 'pairs', id] as const,
  unburned: (labId: string) => ['labs', labId, 'unburned'] as const,
  queue: (labId: string) => ['labs', labId, 'review-queue'] as const,
};

export function useSessionsQuery(labId: string) {
  return useQuery({
    queryKey: burnKeys.sessions(labId),
    queryFn: ({ signal }) =>
      apiRequest(`/api/labs/${labId}/burn-sessions`, (k) => k.sessionListSchema, { signal }),
  });
}

export function useSessionQuery(labId: string, sessionId: string) {
  return useQuery({
    queryKey: burnKeys.session(labId, sessionId),
    queryFn: ({ signal }) =>
      apiRequest(`/api/labs/${labId}/burn-sessions/${sessionId}`, (k) => k.sessionSchema, {
        signal,
      }),
  });
}

export function useCreateSessionMutation(labId: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (input: CreateSessionInput) =>
      apiRequest(`/api/labs/${labId}/burn-sessions`, (k) => k.sessionSchema, {
        method: 'POST',
        body: input,
      }),
    onSuccess: () => client.invalidateQueries({ queryKey: burnKeys.sessions(labId) }),
  });
}

export function useUpdateSessionMutation(labId: string, sessionId: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (input: { checklist?: Record<string, boolean>; notes?: string }) =>
      apiRequest(`/api/labs/${labId}/burn-sessions/${sessionId}`, (k) => k.sessionSchema, {
        method: 'PATCH',
        body: input,
      }),
    onSuccess: (session) => client.setQueryData(burnKeys.session(labId, sessionId), session),
  });
}

export function useUnburnedQuery(labId: string) {
  return useQuery({
    queryKey: burnKeys.unburned(labId),
    queryFn: ({ signal }) =>
      apiRequest(`/api/labs/${labId}/specimens/unburned`, (k) => k.unburnedSchema, { signal }),
  });
}

export function useCreatePairMutation(labId: string, sessionId: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (input: CreatePairInput) =>
      apiRequest(`/api/labs/${labId}/burn-sessions/${sessionId}/pairs`, (k) => k.pairSchema, {
        method: 'POST',
        body: input,
      }),
    onSuccess: () => {
      void client.invalidateQueries({ queryKey: burnKeys.session(labId, sessionId) });
      void client.invalidateQueries({ queryKey: burnKeys.unburned(labId) });
    },
  });
}

export function fetchPair(labId: string, pairId: string, signal?: AbortSignal): Promise<Pair> {
  return apiRequest(`/api/labs/${labId}/pairs/${pairId}`, (k) => k.pairSchema, { signal });
}

export function usePairQuery(labId: string, pairId: string) {
  return useQuery({
    queryKey: burnKeys.pair(labId, pairId),
    queryFn: ({ signal }) => fetchPair(labId, pairId, signal),
  });
}

function usePairAction<T>(labId: string, pairId: string, run: (input: T) => Promise<Pair>) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: run,
    onSuccess: (pair) => {
      client.setQueryData(burnKeys.pair(labId, pairId), pair);
      void client.invalidateQueries({ queryKey: burnKeys.queue(labId) });
      void client.invalidateQueries({ queryKey: burnKeys.session(labId, pair.sessionId) });
    },
  });
}

export function useSubmitPairMutation(labId: string, pairId: string) {
  return usePairAction(labId, pairId, () =>
    apiRequest(`/api/labs/${labId}/pairs/${pairId}/submit`, (k) => k.pairSchema, {
      method: 'POST',
    }),
  );
}

export function useSignOffMutation(labId: string, pairId: string) {
  return usePairAction(labId, pairId, () =>
    apiRequest(`/api/labs/${labId}/pairs/${pairId}/sign-off`, (k) => k.pairSchema, {
      method: 'POST',
    }),
  );
}

export function useReturnPairMutation(labId: string, pairId: string) {
  return usePairAction(labId, pairId, (comment: string) =>
    apiRequest(`/api/labs/${labId}/pairs/${pairId}/return`, (k) => k.pairSchema, {
      method: 'POST',
      body: { comment },
    }),
  );
}

export function useCorrectionMutation(labId: string, pairId: string) {
  return usePairAction(
    labId,
    pairId,
    (input: { specimenId: string; changes: MeasurementInput; reason: string }) =>
      apiRequest(`/api/labs/${labId}/pairs/${pairId}/corrections`, (k) => k.pairSchema, {
        method: 'POST',
        body: input,
      }),
  );
}

export function useReviewQueueQuery(labId: string) {
  return useQuery({
    queryKey: burnKeys.queue(labId),
    queryFn: ({ signal }) =>
      apiRequest(`/api/labs/${labId}/review-queue`, (k) => k.reviewQueueSchema, { signal }),
  });
}
