import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import {
  sessionStateSchema,
  signedInSchema,
  userSchema,
  type ChangePasswordInput,
  type Me,
  type ResetConfirmInput,
  type ResetRequestInput,
  type SignInInput,
  type SignUpInput,
  type UpdateMeInput,
} from '../../shared/schemas/auth';
import { readLocal, writeLocal } from '../local-store';
import { ApiError, apiRequest, setCsrfToken } from './client';

const ME_KEY = 'quenchbook.me';

export const sessionKeys = {
  me: ['me'] as const,
};

const nothing = z.unknown();

export const meQueryOptions = queryOptions({
  queryKey: sessionKeys.me,
  queryFn: async ({ signal }): Promise<Me | null> => {
    try {
      const { me } = await apiRequest('/api/auth/session', sessionStateSchema, { signal });
      setCsrfToken(me?.csrfToken);
      writeLocal(ME_KEY, me);
      return me;
    } catch (err) {
      // Without a connection, the lab screens still open from the last answer on this device,
      // so a burn in progress survives a reload in the field.
      const copy = readLocal<Me | null>(ME_KEY);
      if (err instanceof ApiError && err.code === 'network' && copy) {
        setCsrfToken(copy.csrfToken);
        return copy;
      }
      throw err;
    }
  },
  staleTime: 60_000,
});

/** The signed-in user and their labs; null when signed out. */
export function useMeQuery() {
  return useQuery(meQueryOptions);
}

function useSignedIn() {
  const client = useQueryClient();
  return (me: Me) => {
    setCsrfToken(me.csrfToken);
    client.setQueryData(sessionKeys.me, me);
  };
}

export function useSignInMutation() {
  const signedIn = useSignedIn();
  return useMutation({
    mutationFn: (input: SignInInput) =>
      apiRequest('/api/auth/sign-in', signedInSchema, { method: 'POST', body: input }),
    onSuccess: (res) => signedIn(res.me),
  });
}

export function useSignUpMutation() {
  const signedIn = useSignedIn();
  return useMutation({
    mutationFn: (input: SignUpInput) =>
      apiRequest('/api/auth/sign-up', signedInSchema, { method: 'POST', body: input }),
    onSuccess: (res) => signedIn(res.me),
  });
}

function useSignedOut() {
  const client = useQueryClient();
  return () => {
    setCsrfToken(undefined);
    writeLocal(ME_KEY, null);
    client.clear();
    client.setQueryData(sessionKeys.me, null);
  };
}

export function useSignOutMutation(everywhere = false) {
  const signedOut = useSignedOut();
  return useMutation({
    mutationFn: () =>
      apiRequest(everywhere ? '/api/auth/sign-out-everywhere' : '/api/auth/sign-out', nothing, {
        method: 'POST',
      }),
    onSuccess: signedOut,
  });
}

export function useChangePasswordMutation() {
  return useMutation({
    mutationFn: (input: ChangePasswordInput) =>
      apiRequest('/api/auth/password', nothing, { method: 'POST', body: input }),
  });
}

export function useRequestResetMutation() {
  return useMutation({
    mutationFn: (input: ResetRequestInput) =>
      apiRequest('/api/auth/password-reset/request', nothing, { method: 'POST', body: input }),
  });
}

export function useConfirmResetMutation() {
  const signedOut = useSignedOut();
  return useMutation({
    mutationFn: (input: ResetConfirmInput) =>
      apiRequest('/api/auth/password-reset/confirm', nothing, { method: 'POST', body: input }),
    onSuccess: signedOut,
  });
}

export function useUpdateMeMutation() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (input: UpdateMeInput) =>
      apiRequest('/api/me', userSchema, { method: 'PATCH', body: input }),
    onSuccess: () => client.invalidateQueries({ queryKey: sessionKeys.me }),
  });
}
