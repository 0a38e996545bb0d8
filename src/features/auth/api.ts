// Signing in and signing up. "Who am I" and signing out live in src/core/session (every feature uses them).
import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { AuthResponse, SignInInput, SignUpInput } from '../../../shared/auth.js';
import { api, queryKeys } from '../../lib/api.js';

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
