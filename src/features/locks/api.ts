// Locking sheets and protecting ranges: each answer patches the protection in the query cache
// (src/core/team/protection.ts), so the greyed cells follow whichever arrives first.
import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ProtectedRange, ProtectedRangeInput, Protection, SheetLock, SheetLockInput } from '@shared/team.js';
import { api, queryKeys } from '../../lib/api.js';
import { setProtection } from '../../core/team/protection.js';
import { withLock, withoutLock, withoutRange, withRange } from '../../core/team/editability.js';
import { workbookPath } from '@shared/workbooks.js';

const sheetPath = (workbookId: string, sheetId: string) => workbookPath(workbookId, 'sheets', sheetId);

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
