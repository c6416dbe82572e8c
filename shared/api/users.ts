import { z } from 'zod';
import { LIMITS } from '../domain/limits.ts';
import { SITE_ROLES } from '../domain/roles.ts';

export const emailSchema = z.email({ message: 'Enter a valid e-mail address' }).max(LIMITS.emailMax).toLowerCase();
export const passwordSchema = z
  .string()
  .min(LIMITS.passwordMin, { message: `Use at least ${LIMITS.passwordMin} characters` })
  .max(LIMITS.passwordMax, { message: `Use at most ${LIMITS.passwordMax} characters` });
export const personNameSchema = z.string().trim().min(1, { message: 'Enter a name' }).max(LIMITS.nameMax);

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
