// The workbook list: list, create, rename, delete. (Opening one is the grid feature's.)
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { workbookPath, type CreateWorkbookInput, type WorkbookSummary } from '@shared/workbooks.js';
import { api, queryKeys } from '../../lib/api.js';

export const workbooksQueryOptions = queryOptions({
  queryKey: queryKeys.workbooks,
  queryFn: ({ signal }) => api<{ workbooks: WorkbookSummary[] }>('/workbooks', { signal }).then((r) => r.workbooks),
});

export function useWorkbooks() {
  return useQuery(workbooksQueryOptions);
}

export function useCreateWorkbook() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: CreateWorkbookInput) => api<{ workbook: WorkbookSummary }>('/workbooks', { method: 'POST', body: input }).then((r) => r.workbook),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: queryKeys.workbooks, exact: true }),
  });
}

export function useRenameWorkbook() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ id, title }: { id: string; title: string }) =>
      api<{ workbook: WorkbookSummary }>(workbookPath(id), { method: 'PATCH', body: { title } }).then((r) => r.workbook),
    onSuccess: (workbook) => {
      queryClient.setQueryData(queryKeys.workbooks, (list: WorkbookSummary[] | undefined) => list?.map((w) => (w.id === workbook.id ? workbook : w)));
      // An open copy of this workbook shows the new title too.
      void queryClient.invalidateQueries({ queryKey: queryKeys.workbook(workbook.id), exact: true });
    },
  });
}

export function useDeleteWorkbook() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (id: string) => api<void>(workbookPath(id), { method: 'DELETE' }),
    onSuccess: (_r, id) => {
      queryClient.setQueryData(queryKeys.workbooks, (list: WorkbookSummary[] | undefined) => list?.filter((w) => w.id !== id));
      queryClient.removeQueries({ queryKey: queryKeys.workbook(id) });
    },
  });
}
