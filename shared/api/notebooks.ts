import { z } from 'zod';
import { LIMITS } from '../domain/limits.ts';
import { NOTEBOOK_ROLES } from '../domain/roles.ts';
import { emailSchema } from './users.ts';

/**
 * Notebooks (studies) and their members.
 *
 * GET    /api/notebooks                      -> { notebooks: notebookSummary[] }  (only those the caller belongs to)
 * POST   /api/notebooks          createNotebook -> notebook   (the creator becomes its PI)
 * GET    /api/notebooks/:id                  -> notebook | 404 (404 also when the caller is not a member)
 * PATCH  /api/notebooks/:id      updateNotebook -> notebook  (PI)
 * GET    /api/notebooks/:id/members          -> { members: member[] }
 * POST   /api/notebooks/:id/members addMember -> member      (PI; the person must have an account)
 * PATCH  /api/notebooks/:id/members/:userId changeMemberRole -> member (PI; the last PI cannot be demoted)
 * DELETE /api/notebooks/:id/members/:userId  -> 204         (PI; not the last PI)
 */
export const notebookTitleSchema = z.string().trim().min(1, { message: 'Enter a title' }).max(LIMITS.notebookTitleMax);

export const notebookDescriptionSchema = z
  .string()
  .max(LIMITS.notebookDescriptionMax, { message: `Use at most ${LIMITS.notebookDescriptionMax} characters` });

export const createNotebookSchema = z.object({
  title: notebookTitleSchema,
  description: notebookDescriptionSchema.default(''),
});
export type CreateNotebookInput = z.infer<typeof createNotebookSchema>;
/** Only the fields sent change (no defaults here: a missing description stays as it is). */
export const updateNotebookSchema = z.object({ title: notebookTitleSchema, description: notebookDescriptionSchema }).partial();
export type UpdateNotebookInput = z.infer<typeof updateNotebookSchema>;

export const notebookSummarySchema = z.object({
  id: z.uuid(),
  title: z.string(),
  description: z.string(),
  role: z.enum(NOTEBOOK_ROLES),
  memberCount: z.number().int(),
  updatedAt: z.string(),
});
export type NotebookSummary = z.infer<typeof notebookSummarySchema>;

export const notebookSchema = notebookSummarySchema.extend({ createdAt: z.string() });
export type Notebook = z.infer<typeof notebookSchema>;

export const memberSchema = z.object({
  userId: z.uuid(),
  name: z.string(),
  email: z.string(),
  role: z.enum(NOTEBOOK_ROLES),
  joinedAt: z.string(),
});
export type Member = z.infer<typeof memberSchema>;

export const addMemberSchema = z.object({ email: emailSchema, role: z.enum(NOTEBOOK_ROLES) });
export const changeMemberRoleSchema = z.object({ role: z.enum(NOTEBOOK_ROLES) });
