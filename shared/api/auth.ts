import { z } from 'zod';
import { SITE_ROLES } from '../domain/roles.ts';
import { emailSchema, passwordSchema, personNameSchema, userSchema } from './users.ts';

/**
 * Sign-in and session endpoints. State-changing requests carry the CSRF token from
 * GET /api/auth/csrf in the `x-csrf-token` header.
 *
 * GET  /api/auth/csrf                      -> csrfResponse
 * GET  /api/auth/me                        -> meResponse | 401
 * POST /api/auth/sign-in        signIn     -> meResponse | 401 | 429
 * POST /api/auth/sign-out                  -> 204
 * POST /api/auth/password-reset requestReset -> 202 (always, whether or not the address is known)
 * POST /api/auth/password-reset/complete completeReset -> 204 | 400 (expired or used token)
 * GET  /api/invites/:token                 -> inviteLookup | 404
 * POST /api/invites/:token/accept acceptInvite -> meResponse (signed in)
 * POST /api/invites (administrator) createInvite -> createdInvite (201; mailSent false when the mail could not be sent)
 * GET  /api/invites (administrator)        -> { invites: invite[] }
 */
export const csrfResponseSchema = z.object({ csrfToken: z.string() });

export const signInSchema = z.object({ email: emailSchema, password: z.string().min(1, { message: 'Enter your password' }) });
export type SignInInput = z.infer<typeof signInSchema>;

export const meResponseSchema = z.object({
  user: userSchema,
  /** Notebooks the person belongs to, with their role in each. */
  memberships: z.array(z.object({ notebookId: z.uuid(), role: z.enum(['pi', 'researcher', 'reader']) })),
});
export type MeResponse = z.infer<typeof meResponseSchema>;

export const requestResetSchema = z.object({ email: emailSchema });
export const completeResetSchema = z.object({ token: z.string().min(16), password: passwordSchema });

export const createInviteSchema = z.object({
  email: emailSchema,
  name: personNameSchema,
  siteRole: z.enum(SITE_ROLES).default('member'),
});
export type CreateInviteInput = z.infer<typeof createInviteSchema>;

export const inviteSchema = z.object({
  id: z.uuid(),
  email: z.string(),
  name: z.string(),
  siteRole: z.enum(SITE_ROLES),
  invitedBy: z.string(),
  expiresAt: z.string(),
  acceptedAt: z.string().nullable(),
  createdAt: z.string(),
});
export type Invite = z.infer<typeof inviteSchema>;
/** The answer to createInvite: the invite, and whether its mail went out (the invite stands either way). */
export const createdInviteSchema = inviteSchema.extend({ mailSent: z.boolean() });
export type CreatedInvite = z.infer<typeof createdInviteSchema>;

export const inviteLookupSchema = z.object({ email: z.string(), name: z.string(), expiresAt: z.string() });
export const acceptInviteSchema = z.object({ password: passwordSchema, name: personNameSchema.optional() });
