// Members, roles and invitations of one workbook, and the invitation link page. Each call is a
// queryOptions or a mutation here; components use the thin hooks.
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type {
  AcceptInvitationResponse,
  AddMemberInput,
  AddMemberResponse,
  InvitationPreview,
  InvitationsResponse,
  MemberRoleResult,
  SheetRolesResponse,
} from '@shared/team.js';
import type { SheetRole, WorkbookRole } from '@shared/permissions.js';
import { api, queryKeys } from '../../lib/api.js';
import { workbookPath } from '@shared/workbooks.js';


export const invitationsQueryOptions = (workbookId: string) =>
  queryOptions({
    queryKey: queryKeys.invitations(workbookId),
    queryFn: ({ signal }) => api<InvitationsResponse>(workbookPath(workbookId, 'invitations'), { signal }).then((r) => r.invitations),
  });

export const invitationLinkQueryOptions = (token: string) =>
  queryOptions({
    queryKey: queryKeys.invitationLink(token),
    queryFn: ({ signal }) => api<InvitationPreview>(`/invitations/${encodeURIComponent(token)}`, { signal }),
    staleTime: 0,
  });

export const useInvitations = (workbookId: string, enabled: boolean) => useQuery({ ...invitationsQueryOptions(workbookId), enabled });
export const useInvitationLink = (token: string) => useQuery(invitationLinkQueryOptions(token));

/** After any change to who belongs: the member list, pending invitations, the audit log and my list of workbooks. */
function useRefreshSharing(workbookId: string) {
  const queryClient = useQueryClient();
  return () => {
    void queryClient.invalidateQueries({ queryKey: queryKeys.members(workbookId) });
    void queryClient.invalidateQueries({ queryKey: queryKeys.invitations(workbookId) });
    void queryClient.invalidateQueries({ queryKey: queryKeys.audit(workbookId) });
    // Exact: ['workbooks'] is also the prefix of the open workbook, which must not be reloaded under the grid.
    void queryClient.invalidateQueries({ queryKey: queryKeys.workbooks, exact: true });
  };
}

export function useAddMember(workbookId: string) {
  const refresh = useRefreshSharing(workbookId);
  return useMutation({
    mutationFn: (input: AddMemberInput) => api<AddMemberResponse>(workbookPath(workbookId, 'members'), { method: 'POST', body: input }),
    onSuccess: refresh,
  });
}

export function useChangeMemberRole(workbookId: string) {
  const refresh = useRefreshSharing(workbookId);
  return useMutation({
    mutationFn: ({ userId, role }: { userId: string; role: WorkbookRole }) =>
      api<MemberRoleResult>(workbookPath(workbookId, 'members', userId), { method: 'PATCH', body: { role } }),
    onSuccess: refresh,
  });
}

export function useRemoveMember(workbookId: string) {
  const refresh = useRefreshSharing(workbookId);
  return useMutation({
    mutationFn: (userId: string) => api<void>(workbookPath(workbookId, 'members', userId), { method: 'DELETE' }),
    onSuccess: refresh,
  });
}

export function useRevokeInvitation(workbookId: string) {
  const refresh = useRefreshSharing(workbookId);
  return useMutation({
    mutationFn: (invitationId: string) => api<void>(workbookPath(workbookId, 'invitations', invitationId), { method: 'DELETE' }),
    onSuccess: refresh,
  });
}

export function useAcceptInvitation(token: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => api<AcceptInvitationResponse>(`/invitations/${encodeURIComponent(token)}/accept`, { method: 'POST' }),
    onSuccess: () => {
      void queryClient.invalidateQueries({ queryKey: queryKeys.workbooks, exact: true });
      void queryClient.invalidateQueries({ queryKey: queryKeys.invitationLink(token) });
    },
  });
}

/** PUT …/sheets/:sheetId/roles: one member's role on one sheet (null: back to their workbook role). */
export function useSetSheetRole(workbookId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ sheetId, email, role }: { sheetId: string; email: string; role: SheetRole | null }) =>
      api<SheetRolesResponse>(workbookPath(workbookId, 'sheets', sheetId, 'roles'), { method: 'PUT', body: { email, role } }),
    // The live `protection` event brings the new roles to every open page, this one included.
    onSuccess: () => void queryClient.invalidateQueries({ queryKey: queryKeys.audit(workbookId) }),
  });
}
