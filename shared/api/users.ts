import { z } from 'zod';
import { LIMITS } from '../domain/limits.ts';
import { SITE_ROLES } from '../domain/roles.ts';

export const emailSchema = z.email({ message: 'Enter a valid e-mail address' }).max(LIMITS.emailMax).toLowerCase();
export const passwordSchema = z
  .string()
  .min(LIMITS.passwordMin, { message: `Use at least ${LIMITS.passwordMin} characters` })
  .max(LIMITS.passwordMax, { message: `Use at most ${LIMITS.passwordMax} characters` });
export const personNameSchema = z.string().trim().min(1, { message: 'Enter a name' }).max(LIMITS.nameMax);

/**
 * People and the signed-in person's own account.
 *
 * GET   /api/users (administrator)            -> { users: user[] }
 * PATCH /api/users/:id (administrator) updateUser -> user | 409 (the last active administrator cannot be demoted or deactivated)
 * PATCH /api/account           updateAccount  -> user
 * POST  /api/account/password  changePassword -> 204 | 400 (currentPassword wrong)
 * GET   /api/health                           -> { ok, database, storage } (200 or 503)
 */

/** A person as the API presents them (never the password hash). */
export const userSchema = z.object({
  id: z.uuid(),
  email: z.string(),
  name: z.string(),
  siteRole: z.enum(SITE_ROLES),
  active: z.boolean(),
  createdAt: z.string(),
});
export type User = z.infer<typeof userSchema>;

export const updateUserSchema = z
  .object({ name: personNameSchema, siteRole: z.enum(SITE_ROLES), active: z.boolean() })
  .partial();
export type UpdateUserInput = z.infer<typeof updateUserSchema>;

export const updateAccountSchema = z.object({ name: personNameSchema });
export const changePasswordSchema = z.object({ currentPassword: z.string().min(1), newPassword: passwordSchema });
