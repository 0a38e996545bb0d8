// The audit log of one workbook (owners and site admins): sharing, roles, locks and restores.
import { queryOptions, useQuery } from '@tanstack/react-query';
import type { AuditResponse } from '@shared/team.js';
import { api, queryKeys } from '../../lib/api.js';
import { workbookPath } from '@shared/workbooks.js';

export const auditQueryOptions = (workbookId: string) =>
  queryOptions({
    queryKey: queryKeys.audit(workbookId),
    queryFn: ({ signal }) => api<AuditResponse>(`${workbookPath(workbookId, 'audit')}?limit=200`, { signal }).then((r) => r.entries),
    staleTime: 0,
  });

export const useAudit = (workbookId: string, enabled: boolean) => useQuery({ ...auditQueryOptions(workbookId), enabled });
