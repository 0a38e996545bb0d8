// The revision history of a workbook: the list, one revision's patch, the workbook as it was right
// after a revision, and restoring it. Revisions never change once written, so their details and
// snapshots are cached for the visit.
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { RevisionSnapshot } from '@shared/team.js';
import { workbookPath, type RevisionSummary } from '@shared/workbooks.js';
import { api, queryKeys } from '../../lib/api.js';

export interface RevisionList {
  revision: number;
  revisions: RevisionSummary[];
}

export const revisionsQueryOptions = (workbookId: string) =>
  queryOptions({
    queryKey: queryKeys.revisions(workbookId),
    queryFn: ({ signal }) => api<RevisionList>(`${workbookPath(workbookId, 'revisions')}?limit=200`, { signal }),
    staleTime: 0,
  });

export const revisionSnapshotQueryOptions = (workbookId: string, n: number) =>
  queryOptions({
    queryKey: queryKeys.revisionSnapshot(workbookId, n),
    queryFn: ({ signal }) => api<RevisionSnapshot>(workbookPath(workbookId, 'revisions', n, 'snapshot'), { signal }),
    staleTime: Infinity,
  });

export const useRevisions = (workbookId: string, enabled: boolean) => useQuery({ ...revisionsQueryOptions(workbookId), enabled });
export const useRevisionSnapshot = (workbookId: string, n: number | null) =>
  useQuery({ ...revisionSnapshotQueryOptions(workbookId, n ?? 0), enabled: n !== null });

export function useRestoreRevision(workbookId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (n: number) => api<{ revision: number; changeCount: number }>(workbookPath(workbookId, 'revisions', n, 'restore'), { method: 'POST' }),
    onSuccess: () => {
      // The restored state reaches the grid as a live revision like any other; the lists refresh here.
      void queryClient.invalidateQueries({ queryKey: queryKeys.revisions(workbookId), exact: true });
      void queryClient.invalidateQueries({ queryKey: queryKeys.audit(workbookId) });
    },
  });
}
