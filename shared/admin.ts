// Site administration: the user list and the changes an admin may make to an account.
import { z } from 'zod';
import { siteRoleSchema, type PublicUser } from './auth.js';

/** One row of GET /api/admin/users → `{ users: AdminUser[] }`, oldest account first. */
export interface AdminUser extends PublicUser {
  disabled: boolean;
  /** ISO 8601. */
  createdAt: string;
}

export interface AdminUsersResponse {
  users: AdminUser[];
}

/** PATCH /api/admin/users/:id → `{ user: AdminUser }`. Disabling ends that user's sessions at once. */
export const adminUserPatchSchema = z
  .strictObject(
    {
      siteRole: siteRoleSchema.optional(),
      disabled: z.boolean({ error: 'must be true or false' }).optional(),
    },
    {
      error: (issue) =>
        issue.code === 'unrecognized_keys'
          ? `unknown field ${issue.keys.join(', ')}; only siteRole and disabled can change`
          : 'must be an object with siteRole and/or disabled',
    },
  )
  .refine((p) => p.siteRole !== undefined || p.disabled !== undefined, { error: 'give siteRole or disabled (or both)' });
export type AdminUserPatch = z.infer<typeof adminUserPatchSchema>;

export const adminUserIdSchema = z.string().min(1).max(64);
