// One revision's patch: read by the history view and by live updates (to catch up on a missed revision).
// Revisions never change once written, so their details are cached for the visit.
import { queryOptions } from '@tanstack/react-query';
import { workbookPath, type RevisionDetail } from '@shared/workbooks.js';
import { api, queryKeys } from '../../lib/api.js';


export const revisionDetailQueryOptions = (workbookId: string, n: number) =>
  queryOptions({
    queryKey: queryKeys.revision(workbookId, n),
    queryFn: ({ signal }) => api<RevisionDetail>(workbookPath(workbookId, 'revisions', n), { signal }),
    staleTime: Infinity,
  });

