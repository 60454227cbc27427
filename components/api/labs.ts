import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { auditPageSchema } from '../../shared/schemas/audit';
import type { AcceptInvitationInput } from '../../shared/schemas/auth';
import { signedInSchema } from '../../shared/schemas/auth';
import {
  invitationListSchema,
  invitationPreviewSchema,
  invitationSchema,
  type CreateInvitationInput,
} from '../../shared/schemas/invitation';
import { labSchema, memberListSchema, memberSchema } from '../../shared/schemas/lab';
import type { Role } from '../../shared/schemas/roles';
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

const nothing = z.unknown();

export function useLabQuery(labId: string) {
  return useQuery({
    queryKey: labKeys.lab(labId),
    queryFn: ({ signal }) => apiRequest(`/api/labs/${labId}`, labSchema, { signal }),
  });
}

export function useMembersQuery(labId: string) {
  return useQuery(
    queryOptions({
      queryKey: labKeys.members(labId),
      queryFn: ({ signal }) =>
        apiRequest(`/api/labs/${labId}/members`, memberListSchema, { signal }),
    }),
  );
}

export function useInvitationsQuery(labId: string, enabled: boolean) {
  return useQuery({
    queryKey: labKeys.invitations(labId),
    queryFn: ({ signal }) =>
      apiRequest(`/api/labs/${labId}/invitations`, invitationListSchema, { signal }),
    enabled,
  });
}

export function useAuditQuery(labId: string, page: number, pageSize = 25) {
  return useQuery({
    queryKey: labKeys.audit(labId, page),
    queryFn: ({ signal }) =>
      apiRequest(`/api/labs/${labId}/audit?page=${page}&pageSize=${pageSize}`, auditPageSchema, {
        signal,
      }),
    placeholderData: (previous) => previous,
  });
}

export function useChangeRoleMutation(labId: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: ({ userId, role }: { userId: string; role: Role }) =>
      apiRequest(`/api/labs/${labId}/members/${userId}`, memberSchema, {
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
      apiRequest(`/api/labs/${labId}/members/${userId}`, nothing, { method: 'DELETE' }),
    onSettled: () => client.invalidateQueries({ queryKey: labKeys.lab(labId) }),
  });
}

export function useInviteMutation(labId: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (input: CreateInvitationInput) =>
      apiRequest(`/api/labs/${labId}/invitations`, invitationSchema, {
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
      apiRequest(`/api/labs/${labId}/invitations/${invitationId}`, nothing, { method: 'DELETE' }),
    onSettled: () => client.invalidateQueries({ queryKey: labKeys.invitations(labId) }),
  });
}

export function useCreateLabMutation() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (name: string) =>
      apiRequest('/api/labs', labSchema, { method: 'POST', body: { name } }),
    onSuccess: () => client.invalidateQueries({ queryKey: sessionKeys.me }),
  });
}

export function useInvitationPreviewQuery(token: string) {
  return useQuery({
    queryKey: labKeys.invitation(token),
    queryFn: ({ signal }) =>
      apiRequest(`/api/invitations/${encodeURIComponent(token)}`, invitationPreviewSchema, {
        signal,
      }),
    retry: false,
  });
}

const acceptedSchema = z.union([signedInSchema, z.object({ labId: z.uuid() })]);

export function useAcceptInvitationMutation(token: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (input: AcceptInvitationInput) =>
      apiRequest(`/api/invitations/${encodeURIComponent(token)}/accept`, acceptedSchema, {
        method: 'POST',
        body: input,
      }),
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
