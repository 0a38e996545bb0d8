// Proving an address, forgetting a password and changing it: the calls behind the account pages.
import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { AuthResponse, PasswordResetRequested } from '../../../shared/auth.js';
import { api, queryKeys } from '../../lib/api.js';

export const authPaths = {
  verify: '/auth/verify',
  resendVerification: '/auth/verify/resend',
  requestReset: '/auth/password-reset',
  reset: (token: string) => `/auth/password-reset/${token}`,
  changePassword: '/auth/password',
} as const;

export function useVerifyEmail() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (token: string) => api<AuthResponse>(authPaths.verify, { method: 'POST', body: { token } }),
    // The signed-in user (if it is the same account) now shows as verified; re-ask rather than guess.
    onSuccess: () => queryClient.invalidateQueries({ queryKey: queryKeys.me }),
  });
}

export function useResendVerification() {
  return useMutation({ mutationFn: () => api<{ message: string }>(authPaths.resendVerification, { method: 'POST' }) });
}

export function useRequestReset() {
  return useMutation({ mutationFn: (email: string) => api<PasswordResetRequested>(authPaths.requestReset, { method: 'POST', body: { email } }) });
}

export function useResetPassword(token: string) {
  const queryClient = useQueryClient();
  return useMutation({
    meta: { signIn: true },
    mutationFn: (password: string) => api<void>(authPaths.reset(token), { method: 'POST', body: { password } }),
    // Every session of the account ended, this browser's too.
    onSuccess: () => {
      queryClient.clear();
      queryClient.setQueryData(queryKeys.me, null);
    },
  });
}

export function useChangePassword() {
  return useMutation({
    // A wrong current password is a 403 with its own message, not a lost session.
    meta: { signIn: true },
    mutationFn: (input: { current: string; next: string }) => api<void>(authPaths.changePassword, { method: 'POST', body: input }),
  });
}
