import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { type BatchStatus } from '../../shared/terms/batch';
import type { CreateBatchInput, SpecimenInput } from '../../shared/schemas/batch';
import { apiRequest } from './client';
import { recipeKeys } from './recipes';

export const batchKeys = {
  all: (labId: string) => ['labs', labId, 'batches'] as const,
  list: (labId: string, status: string) => ['labs', labId, 'batches', 'list', status] as const,
  batch: (labId: string, id: string) => ['labs', labId, 'batches', id] as const,
};

export function useBatchesQuery(labId: string, status: BatchStatus | '' = '') {
  return useQuery({
    queryKey: batchKeys.list(labId, status),
    queryFn: ({ signal }) =>
      apiRequest(
        `/api/labs/${labId}/batches${status ? `?status=${status}` : ''}`,
        (k) => k.batchListSchema,
        { signal },
      ),
    refetchInterval: 60_000,
  });
}

export function useBatchQuery(labId: string, batchId: string) {
  return useQuery({
    queryKey: batchKeys.batch(labId, batchId),
    queryFn: ({ signal }) =>
      apiRequest(`/api/labs/${labId}/batches/${batchId}`, (k) => k.batchSchema, { signal }),
  });
}

export function useCreateBatchMutation(labId: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (input: CreateBatchInput) =>
      apiRequest(`/api/labs/${labId}/batches`, (k) => k.batchSchema, {
        method: 'POST',
        body: input,
      }),
    onSuccess: () => {
      void client.invalidateQueries({ queryKey: batchKeys.all(labId) });
      // A used revision is frozen: the recipe screens must learn it.
      void client.invalidateQueries({ queryKey: recipeKeys.recipes(labId) });
    },
  });
}

export function useUpdateBatchMutation(labId: string, batchId: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (input: {
      status?: BatchStatus;
      discardReason?: string;
      startSoak?: true;
      notes?: string;
    }) =>
      apiRequest(`/api/labs/${labId}/batches/${batchId}`, (k) => k.batchSchema, {
        method: 'PATCH',
        body: input,
      }),
    onSuccess: (batch) => {
      client.setQueryData(batchKeys.batch(labId, batchId), batch);
      void client.invalidateQueries({ queryKey: batchKeys.all(labId) });
    },
  });
}

export function useAddSpecimenMutation(labId: string, batchId: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (input: SpecimenInput) =>
      apiRequest(`/api/labs/${labId}/batches/${batchId}/specimens`, (k) => k.specimenSchema, {
        method: 'POST',
        body: input,
      }),
    onSuccess: () => client.invalidateQueries({ queryKey: batchKeys.batch(labId, batchId) }),
  });
}

export function useUpdateSpecimenMutation(labId: string, batchId: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: ({
      specimenId,
      ...input
    }: {
      specimenId: string;
      wetMassG?: number;
      dryMassAfterG?: number;
    }) =>
      apiRequest(
        `/api/labs/${labId}/batches/${batchId}/specimens/${specimenId}`,
        (k) => k.specimenSchema,
        {
          method: 'PATCH',
          body: input,
        },
      ),
    onSuccess: () => client.invalidateQueries({ queryKey: batchKeys.batch(labId, batchId) }),
  });
}
