// The members of one workbook (who they are, their roles): read by sharing, locks and the audit view.
import { queryOptions, useQuery } from '@tanstack/react-query';
import type { MembersResponse } from '@shared/team.js';
import { api, queryKeys } from '../../lib/api.js';
import { workbookPath } from '@shared/workbooks.js';


export const membersQueryOptions = (workbookId: string) =>
  queryOptions({
    queryKey: queryKeys.members(workbookId),
    queryFn: ({ signal }) => api<MembersResponse>(workbookPath(workbookId, 'members'), { signal }).then((r) => r.members),
  });

export const useMembers = (workbookId: string, enabled = true) => useQuery({ ...membersQueryOptions(workbookId), enabled });
