// Sheet locks and protected ranges of one workbook. The current protection lives in the query cache:
// seeded from GET /api/workbooks/:id, replaced by each live `protection` event, and patched by the
// answers of the calls below, so the greyed cells follow whichever arrives first.
import { queryOptions, useMutation, useQuery, useQueryClient, type QueryClient } from '@tanstack/react-query';
import type { ProtectedRange, ProtectedRangeInput, Protection, SheetLock, SheetLockInput } from '../../../shared/team.js';
import type { WorkbookPayload } from '../../../shared/workbooks.js';
import { api, queryKeys } from '../../lib/api.js';
import { noProtection, withLock, withoutLock, withoutRange, withRange } from './editability.js';

const sheetPath = (workbookId: string, sheetId: string) => `/workbooks/${encodeURIComponent(workbookId)}/sheets/${encodeURIComponent(sheetId)}`;

export function protectionOf(payload: Pick<WorkbookPayload, 'locks' | 'protectedRanges'>): Protection {
  return { locks: payload.locks ?? [], protectedRanges: payload.protectedRanges ?? [] };
}

export const protectionQueryOptions = (workbookId: string) =>
  queryOptions({
    queryKey: queryKeys.protection(workbookId),
    // Only refetched after the live stream reconnects (events may have been missed meanwhile).
    queryFn: ({ signal }) => api<WorkbookPayload>(`/workbooks/${encodeURIComponent(workbookId)}`, { signal }).then(protectionOf),
    staleTime: Infinity,
    // Like the workbook itself: each visit starts from what the server says now.
    gcTime: 0,
  });

export function useProtection(workbookId: string, initial: Protection | undefined): Protection {
  return useQuery({ ...protectionQueryOptions(workbookId), initialData: initial }).data ?? noProtection;
}

export function setProtection(queryClient: QueryClient, workbookId: string, update: Protection | ((p: Protection) => Protection)) {
  queryClient.setQueryData<Protection>(queryKeys.protection(workbookId), (old) => (typeof update === 'function' ? update(old ?? noProtection) : update));
}

function useProtectionMutation<V, R>(workbookId: string, call: (v: V) => Promise<R>, apply: (p: Protection, r: R, v: V) => Protection) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: call,
    onSuccess: (result, variables) => {
      setProtection(queryClient, workbookId, (p) => apply(p, result, variables));
      void queryClient.invalidateQueries({ queryKey: queryKeys.audit(workbookId) });
    },
  });
}

export const useLockSheet = (workbookId: string) =>
  useProtectionMutation(
    workbookId,
    ({ sheetId, ...body }: { sheetId: string } & SheetLockInput) => api<{ lock: SheetLock }>(`${sheetPath(workbookId, sheetId)}/lock`, { method: 'PUT', body }),
    (p, r) => withLock(p, r.lock),
  );

export const useUnlockSheet = (workbookId: string) =>
  useProtectionMutation(
    workbookId,
    (sheetId: string) => api<void>(`${sheetPath(workbookId, sheetId)}/lock`, { method: 'DELETE' }),
    (p, _r, sheetId) => withoutLock(p, sheetId),
  );

export const useProtectRange = (workbookId: string) =>
  useProtectionMutation(
    workbookId,
    ({ sheetId, ...body }: { sheetId: string } & ProtectedRangeInput) =>
      api<{ protectedRange: ProtectedRange }>(`${sheetPath(workbookId, sheetId)}/protected-ranges`, { method: 'POST', body }),
    (p, r) => withRange(p, r.protectedRange),
  );

export const useUnprotectRange = (workbookId: string) =>
  useProtectionMutation(
    workbookId,
    ({ sheetId, rangeId }: { sheetId: string; rangeId: string }) => api<void>(`${sheetPath(workbookId, sheetId)}/protected-ranges/${encodeURIComponent(rangeId)}`, { method: 'DELETE' }),
    (p, _r, v) => withoutRange(p, v.rangeId),
  );
