// The signed-in user, for every feature: "who am I" is one query (`me`), null when signed out; and signing out.
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { AuthResponse, PublicUser } from '../../../shared/auth.js';
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
