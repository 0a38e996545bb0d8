// The current sheet locks and protected ranges of one workbook, in the query cache: seeded from
// GET /api/workbooks/:id, replaced by each live `protection` event, patched by the lock mutations.
import { queryOptions, useQuery, type QueryClient } from '@tanstack/react-query';
import type { Protection } from '@shared/team.js';
import { workbookPath, type WorkbookPayload } from '@shared/workbooks.js';
import { api, queryKeys } from '../../lib/api.js';
import { noProtection } from './editability.js';

export function protectionOf(payload: Pick<WorkbookPayload, 'locks' | 'sheetRoles' | 'protectedRanges'>): Protection {
  return { locks: payload.locks ?? [], sheetRoles: payload.sheetRoles ?? [], protectedRanges: payload.protectedRanges ?? [] };
}

export const protectionQueryOptions = (workbookId: string) =>
  queryOptions({
    queryKey: queryKeys.protection(workbookId),
    // Only refetched after the live stream reconnects (events may have been missed meanwhile).
    queryFn: ({ signal }) => api<WorkbookPayload>(workbookPath(workbookId), { signal }).then(protectionOf),
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

