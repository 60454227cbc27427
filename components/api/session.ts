import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type {
  ChangePasswordInput,
  Me,
  ResetConfirmInput,
  ResetRequestInput,
  SignInInput,
  SignUpInput,
  UpdateMeInput,
} from '../../shared/schemas/auth';
import { readLocal, writeLocal } from '../local-store';
import { ApiError, apiRequest, setCsrfToken } from './client';

const ME_KEY = 'quenchbook.me';

export const sessionKeys = {
  me: ['me'] as const,
};

/**
 * A signed-out visitor's session answer, exactly `{"me":null}`: the schema takes it as it is, so
 * it is accepted without the schema kit and the sign-in screen loads no zod.
 */
export function isSignedOutAnswer(json: unknown): boolean {
  return (
    typeof json === 'object' &&
    json !== null &&
    !Array.isArray(json) &&
    Object.keys(json).length === 1 &&
    (json as { me?: unknown }).me === null
  );
}

export const meQueryOptions = queryOptions({
  queryKey: sessionKeys.me,
  queryFn: async ({ signal }): Promise<Me | null> => {
    try {
      const { me } = await apiRequest('/api/auth/session', (k) => k.sessionStateSchema, {
        signal,
        plainAnswer: isSignedOutAnswer,
      });
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
      apiRequest('/api/auth/sign-in', (k) => k.signedInSchema, { method: 'POST', body: input }),
    onSuccess: (res) => signedIn(res.me),
  });
}

export function useSignUpMutation() {
  const signedIn = useSignedIn();
  return useMutation({
    mutationFn: (input: SignUpInput) =>
      apiRequest('/api/auth/sign-up', (k) => k.signedInSchema, { method: 'POST', body: input }),
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
      apiRequest(
        everywhere ? '/api/auth/sign-out-everywhere' : '/api/auth/sign-out',
        (k) => k.ignoredAnswerSchema,
        {
          method: 'POST',
        },
      ),
    onSuccess: signedOut,
  });
}

export function useChangePasswordMutation() {
  return useMutation({
    mutationFn: (input: ChangePasswordInput) =>
      apiRequest('/api/auth/password', (k) => k.ignoredAnswerSchema, {
        method: 'POST',
        body: input,
      }),
  });
}

export function useRequestResetMutation() {
  return useMutation({
    mutationFn: (input: ResetRequestInput) =>
      apiRequest('/api/auth/password-reset/request', (k) => k.ignoredAnswerSchema, {
        method: 'POST',
        body: input,
      }),
  });
}

export function useConfirmResetMutation() {
  const signedOut = useSignedOut();
  return useMutation({
    mutationFn: (input: ResetConfirmInput) =>
      apiRequest('/api/auth/password-reset/confirm', (k) => k.ignoredAnswerSchema, {
        method: 'POST',
        body: input,
      }),
    onSuccess: signedOut,
  });
}

export function useUpdateMeMutation() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (input: UpdateMeInput) =>
      apiRequest('/api/me', (k) => k.userSchema, { method: 'PATCH', body: input }),
    onSuccess: () => client.invalidateQueries({ queryKey: sessionKeys.me }),
  });
}
