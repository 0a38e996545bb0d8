// The change log of a workbook: the list of saved changes (each with its first cell changes), and
// bringing back one sheet or the whole workbook as it was right after one of them.
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
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

export const useRevisions = (workbookId: string, enabled: boolean) => useQuery({ ...revisionsQueryOptions(workbookId), enabled });

export function useRestoreRevision(workbookId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ n, sheetId }: { n: number; sheetId?: string }) =>
      api<{ revision: number; changeCount: number }>(workbookPath(workbookId, 'revisions', n, 'restore'), { method: 'POST', body: sheetId ? { sheetId } : {} }),
    onSuccess: () => {
      // The restored state reaches the grid as a live revision like any other; the lists refresh here.
      void queryClient.invalidateQueries({ queryKey: queryKeys.revisions(workbookId), exact: true });
      void queryClient.invalidateQueries({ queryKey: queryKeys.audit(workbookId) });
    },
  });
}
