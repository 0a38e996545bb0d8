// Site administration: the account list and changes to one account.
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { AdminUser, AdminUserPatch, AdminUsersResponse } from '@shared/admin.js';
import type { MailOutboxResponse } from '@shared/team.js';
import { api, queryKeys } from '../../lib/api.js';

export const adminUsersQueryOptions = queryOptions({
  queryKey: queryKeys.adminUsers,
  queryFn: ({ signal }) => api<AdminUsersResponse>('/admin/users', { signal }).then((r) => r.users),
});

export function useAdminUsers() {
  return useQuery(adminUsersQueryOptions);
}

export function useUpdateAdminUser() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ id, patch }: { id: string; patch: AdminUserPatch }) =>
      api<{ user: AdminUser }>(`/admin/users/${encodeURIComponent(id)}`, { method: 'PATCH', body: patch }).then((r) => r.user),
    onSuccess: (user) => {
      queryClient.setQueryData(queryKeys.adminUsers, (users: AdminUser[] | undefined) => users?.map((u) => (u.id === user.id ? user : u)));
      // An admin who changed their own role must see the app as that role at once.
      const me = queryClient.getQueryData<{ id: string }>(queryKeys.me);
      if (me?.id === user.id) void queryClient.invalidateQueries({ queryKey: queryKeys.me });
    },
  });
}

/** The built-in fake SMTP server's inbox (newest first): what Orbitab e-mailed, invitation links included. */
export const adminMailQueryOptions = queryOptions({
  queryKey: queryKeys.adminMail,
  queryFn: ({ signal }) => api<MailOutboxResponse>('/admin/mail', { signal }).then((r) => r.messages),
  staleTime: 0,
});

export function useAdminMail() {
  return useQuery(adminMailQueryOptions);
}
