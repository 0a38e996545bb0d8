// The one TanStack Query client. A 401 from any query or mutation means the session ended (signed
// out elsewhere, expired, or the account was disabled): the app forgets the user and goes to sign-in.
import { MutationCache, QueryCache, QueryClient } from '@tanstack/react-query';
import { ApiError, queryKeys } from '../lib/api.js';

const sessionLostListeners = new Set<() => void>();

/** Called by the router, which owns navigation. */
export function onSessionLost(listener: () => void) {
  sessionLostListeners.add(listener);
  return () => sessionLostListeners.delete(listener);
}

function handleError(error: unknown) {
  if (error instanceof ApiError && error.status === 401) {
    queryClient.setQueryData(queryKeys.me, null);
    for (const listener of sessionLostListeners) listener();
  }
}

export const queryClient = new QueryClient({
  queryCache: new QueryCache({ onError: handleError }),
  // Sign-in answers a wrong password with 401 too; its mutation opts out with meta.signIn.
  mutationCache: new MutationCache({ onError: (error, _v, _c, mutation) => (mutation.meta?.signIn ? undefined : handleError(error)) }),
  defaultOptions: {
    queries: {
      staleTime: 30_000,
      // Retrying a 4xx only repeats the same refusal; retry network trouble and 5xx twice.
      retry: (failures, error) => !(error instanceof ApiError && error.status < 500) && failures < 2,
      refetchOnWindowFocus: false,
    },
  },
});
