// Session queries and mutations. "Who am I" is one query (`me`): null when signed out.
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { AuthResponse, PublicUser, SignInInput, SignUpInput } from '../../../shared/auth.js';
import { api, ApiError, queryKeys } from '../../lib/api.js';

export const meQueryOptions = queryOptions({
  queryKey: queryKeys.me,
  queryFn: async ({ signal }): Promise<PublicUser | null> => {
    try {
      return (await api<AuthResponse>('/auth/me', { signal })).user;
    } catch (e) {
      if (e instanceof ApiError && e.status === 401) return null;
      throw e;
    }
  },
  staleTime: 5 * 60_000,
});

export function useMe() {
  return useQuery(meQueryOptions);
}

/** Signing in and signing up both open a session: forget the previous user's data, then remember the new user. */
function useOpenSession<Input>(path: '/auth/sign-in' | '/auth/sign-up') {
  const queryClient = useQueryClient();
  return useMutation({
    // A wrong password is a 401 too; it must not be taken for "session lost".
    meta: { signIn: true },
    mutationFn: (input: Input) => api<AuthResponse>(path, { method: 'POST', body: input }),
    onSuccess: ({ user }) => {
      queryClient.clear();
      queryClient.setQueryData(queryKeys.me, user);
    },
  });
}

export function useSignIn() {
  return useOpenSession<SignInInput>('/auth/sign-in');
}

export function useSignUp() {
  return useOpenSession<SignUpInput>('/auth/sign-up');
}

export function useSignOut() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => api<void>('/auth/sign-out', { method: 'POST' }),
    // Forget everything the previous user could see, so the next account starts clean.
    onSuccess: () => {
      queryClient.clear();
      queryClient.setQueryData(queryKeys.me, null);
    },
  });
}
