import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { AcceptInvitationInput } from '../../shared/schemas/auth';
import type { CreateInvitationInput } from '../../shared/schemas/invitation';
import { type Role } from '../../shared/terms/roles';
import { apiRequest, setCsrfToken } from './client';
import { sessionKeys } from './session';

export const labKeys = {
  all: ['labs'] as const,
  lab: (labId: string) => ['labs', labId] as const,
  members: (labId: string) => ['labs', labId, 'members'] as const,
  invitations: (labId: string) => ['labs', labId, 'invitations'] as const,
  audit: (labId: string, page: number) => ['labs', labId, 'audit', page] as const,
  invitation: (token: string) => ['invitation', token] as const,
};

export function useLabQuery(labId: string) {
  return useQuery({
    queryKey: labKeys.lab(labId),
    queryFn: ({ signal }) => apiRequest(`/api/labs/${labId}`, (k) => k.labSchema, { signal }),
  });
}

export function useMembersQuery(labId: string) {
  return useQuery(
    queryOptions({
      queryKey: labKeys.members(labId),
      queryFn: ({ signal }) =>
        apiRequest(`/api/labs/${labId}/members`, (k) => k.memberListSchema, { signal }),
    }),
  );
}

export function useInvitationsQuery(labId: string, enabled: boolean) {
  return useQuery({
    queryKey: labKeys.invitations(labId),
    queryFn: ({ signal }) =>
      apiRequest(`/api/labs/${labId}/invitations`, (k) => k.invitationListSchema, { signal }),
    enabled,
  });
}

export function useAuditQuery(labId: string, page: number, pageSize = 25) {
  return useQuery({
    queryKey: labKeys.audit(labId, page),
    queryFn: ({ signal }) =>
      apiRequest(
        `/api/labs/${labId}/audit?page=${page}&pageSize=${pageSize}`,
        (k) => k.auditPageSchema,
        {
          signal,
        },
      ),
    placeholderData: (previous) => previous,
  });
}

export function useChangeRoleMutation(labId: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: ({ userId, role }: { userId: string; role: Role }) =>
      apiRequest(`/api/labs/${labId}/members/${userId}`, (k) => k.memberSchema, {
        method: 'PATCH',
        body: { role },
      }),
    onSettled: () => {
      void client.invalidateQueries({ queryKey: labKeys.lab(labId) });
      void client.invalidateQueries({ queryKey: sessionKeys.me });
    },
  });
}

export function useRemoveMemberMutation(labId: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (userId: string) =>
      apiRequest(`/api/labs/${labId}/members/${userId}`, (k) => k.ignoredAnswerSchema, {
        method: 'DELETE',
      }),
    onSettled: () => client.invalidateQueries({ queryKey: labKeys.lab(labId) }),
  });
}

export function useInviteMutation(labId: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (input: CreateInvitationInput) =>
      apiRequest(`/api/labs/${labId}/invitations`, (k) => k.invitationSchema, {
        method: 'POST',
        body: input,
      }),
    onSuccess: () => client.invalidateQueries({ queryKey: labKeys.invitations(labId) }),
  });
}

export function useWithdrawInvitationMutation(labId: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (invitationId: string) =>
      apiRequest(`/api/labs/${labId}/invitations/${invitationId}`, (k) => k.ignoredAnswerSchema, {
        method: 'DELETE',
      }),
    onSettled: () => client.invalidateQueries({ queryKey: labKeys.invitations(labId) }),
  });
}

export function useCreateLabMutation() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (name: string) =>
      apiRequest('/api/labs', (k) => k.labSchema, { method: 'POST', body: { name } }),
    onSuccess: () => client.invalidateQueries({ queryKey: sessionKeys.me }),
  });
}

export function useInvitationPreviewQuery(token: string) {
  return useQuery({
    queryKey: labKeys.invitation(token),
    queryFn: ({ signal }) =>
      apiRequest(
        `/api/invitations/${encodeURIComponent(token)}`,
        (k) => k.invitationPreviewSchema,
        {
          signal,
        },
      ),
    retry: false,
  });
}

export function useAcceptInvitationMutation(token: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (input: AcceptInvitationInput) =>
      apiRequest(
        `/api/invitations/${encodeURIComponent(token)}/accept`,
        (k) => k.invitationAcceptedSchema,
        {
          method: 'POST',
          body: input,
        },
      ),
    onSuccess: async (res) => {
      if ('me' in res) {
        setCsrfToken(res.me.csrfToken);
        client.setQueryData(sessionKeys.me, res.me);
      } else {
        await client.invalidateQueries({ queryKey: sessionKeys.me });
      }
    },
  });
}
