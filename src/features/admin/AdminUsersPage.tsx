import { useState } from 'react';
import type { AdminUser } from '../../../shared/admin.js';
import { siteRoles, type SiteRole } from '../../../shared/auth.js';
import { Button } from '../../components/ui/Button.js';
import { ConfirmDialog } from '../../components/ui/Dialog.js';
import { Notice } from '../../components/ui/Notice.js';
import { LoadingRows, Page } from '../../components/ui/Page.js';
import { ApiError } from '../../lib/api.js';
import { sentence } from '../../lib/fieldErrors.js';
import { useMe } from '../../core/session/me.js';
import { useAdminUsers, useUpdateAdminUser } from './api.js';

const dateFormat = new Intl.DateTimeFormat(undefined, { dateStyle: 'medium' });

export function AdminUsersPage() {
  const users = useAdminUsers();
  const me = useMe().data;
  const update = useUpdateAdminUser();
  const [disabling, setDisabling] = useState<AdminUser | null>(null);

  const change = (user: AdminUser, patch: { siteRole?: SiteRole; disabled?: boolean }) =>
    update.mutate({ id: user.id, patch }, { onSuccess: () => setDisabling(null) });
  const pendingId = update.isPending ? update.variables?.id : undefined;

  return (
    <Page title="Users" description="Accounts on this Orbitab site: site role and access.">
      <title>Users · Orbitab</title>
      {users.isPending ? (
        <LoadingRows label="Loading users" />
      ) : users.isError ? (
        <AdminLoadError error={users.error} />
      ) : (
        <>
          {update.isError && !disabling && (
            <Notice tone="error" className="mb-3">
              {sentence(update.error.message)}
            </Notice>
          )}
          <div className="overflow-hidden rounded-panel border border-line bg-surface">
            <table className="w-full border-collapse text-left text-ui">
              <thead className="bg-raised text-caption text-ink-3">
                <tr className="border-b border-line">
                  <th className="px-3 py-1.5 font-medium">Name</th>
                  <th className="px-3 py-1.5 font-medium">Email</th>
                  <th className="w-36 px-3 py-1.5 font-medium">Site role</th>
                  <th className="w-28 px-3 py-1.5 font-medium">Status</th>
                  <th className="w-32 px-3 py-1.5 font-medium">Joined</th>
                  <th className="w-32 px-3 py-1.5 font-medium">
                    <span className="sr-only">Actions</span>
                  </th>
                </tr>
              </thead>
              <tbody>
                {users.data.map((user) => (
                  <tr key={user.id} className="border-b border-line last:border-b-0 hover:bg-raised" aria-busy={pendingId === user.id || undefined}>
                    <td className="px-3 py-1.5 font-medium">
                      {user.name}
                      {user.id === me?.id && <span className="ml-1.5 text-caption font-normal text-ink-3">(you)</span>}
                    </td>
                    <td className="px-3 py-1.5 text-ink-2">{user.email}</td>
                    <td className="px-3 py-1">
                      <select
                        aria-label={`Site role of ${user.name}`}
                        value={user.siteRole}
                        disabled={pendingId === user.id}
                        onChange={(e) => change(user, { siteRole: e.target.value as SiteRole })}
                        className="h-7 w-full rounded-ctl border border-line-strong bg-surface px-1.5 text-ui text-ink"
                      >
                        {siteRoles.map((role) => (
                          <option key={role} value={role}>
                            {role === 'admin' ? 'Admin' : 'Member'}
                          </option>
                        ))}
                      </select>
                    </td>
                    <td className="px-3 py-1.5">
                      {user.disabled ? (
                        <span className="rounded-ctl bg-danger-soft px-1.5 py-0.5 text-caption font-medium text-danger">Disabled</span>
                      ) : (
                        <span className="rounded-ctl bg-ok-soft px-1.5 py-0.5 text-caption font-medium text-ok">Active</span>
                      )}
                      {!user.emailVerified && (
                        <span className="ml-1 text-caption text-ink-3" title="The address has not been confirmed from the mailed link: no sharing, no admin rights until it is">
                          address unconfirmed
                        </span>
                      )}
                    </td>
                    <td className="px-3 py-1.5 text-ink-3 tabular-nums">{dateFormat.format(new Date(user.createdAt))}</td>
                    <td className="px-3 py-1 text-right">
                      {user.disabled ? (
                        <Button busy={pendingId === user.id} onClick={() => change(user, { disabled: false })}>
                          Re-enable
                        </Button>
                      ) : (
                        <Button variant="ghost" className="hover:text-danger" disabled={pendingId === user.id} onClick={() => setDisabling(user)}>
                          Disable
                        </Button>
                      )}
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        </>
      )}
      <ConfirmDialog
        open={disabling !== null}
        title={`Disable ${disabling?.name ?? ''}?`}
        confirmLabel="Disable account"
        busy={update.isPending}
        error={update.isError && disabling ? sentence(update.error.message) : undefined}
        onCancel={() => {
          setDisabling(null);
          update.reset();
        }}
        onConfirm={() => disabling && change(disabling, { disabled: true })}
      >
        {disabling?.email} is signed out everywhere at once and cannot sign in until an admin re-enables the account. Their workbooks are kept.
      </ConfirmDialog>
    </Page>
  );
}

function AdminLoadError({ error }: { error: Error }) {
  if (error instanceof ApiError && error.status === 403) {
    return (
      <Notice tone="caution" title="Only site admins can manage users">
        Your account is a member, so the server refused to list accounts ({error.message}). Ask a site admin if you need a role changed or an
        account re-enabled.
      </Notice>
    );
  }
  return (
    <Notice tone="error" title="Could not load users">
      {sentence(error.message)}
    </Notice>
  );
}
