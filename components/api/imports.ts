import { useMutation, useQueryClient } from '@tanstack/react-query';
import { burnKeys } from './burn';
import { apiRequest } from './client';

export const importKeys = {
  all: (labId: string) => ['labs', labId, 'pair-imports'] as const,
};

/** Sends a pairs file to be checked; nothing is written until the preview is accepted. */
export function usePreviewImportMutation(labId: string) {
  return useMutation({
    mutationKey: importKeys.all(labId),
    mutationFn: ({ fileName, text }: { fileName: string; text: string }) =>
      apiRequest(
        `/api/labs/${labId}/pair-imports/preview?${new URLSearchParams({ fileName }).toString()}`,
        (k) => k.pairImportPreviewSchema,
        { method: 'POST', rawBody: { contentType: 'text/csv', text } },
      ),
  });
}

export function useAcceptImportMutation(labId: string) {
  const client = useQueryClient();
  return useMutation({
    mutationKey: importKeys.all(labId),
    mutationFn: (importId: string) =>
      apiRequest(
        `/api/labs/${labId}/pair-imports/${importId}/accept`,
        (k) => k.pairImportResultSchema,
        {
          method: 'POST',
        },
      ),
    onSuccess: () => {
      void client.invalidateQueries({ queryKey: burnKeys.sessions(labId) });
      void client.invalidateQueries({ queryKey: burnKeys.queue(labId) });
      void client.invalidateQueries({ queryKey: ['labs', labId, 'rankings'] });
    },
  });
}

export function useDiscardImportMutation(labId: string) {
  return useMutation({
    mutationKey: importKeys.all(labId),
    mutationFn: (importId: string) =>
      apiRequest(`/api/labs/${labId}/pair-imports/${importId}`, (k) => k.ignoredAnswerSchema, {
        method: 'DELETE',
      }),
  });
}
