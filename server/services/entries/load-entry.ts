import { authorizeEntry, type EntryAction } from '@server/policies/entry.policy.ts';
import { EntryEntity } from '@server/entities/entry.entity.ts';
import { NotFoundError } from '@server/errors/index.ts';
import { isUuid } from '@server/services/ids.ts';
import { notebookRoleOf } from './notebook-role.ts';
import type { ActingContext } from './service-context.ts';

/** Checks the actor may do `action` in the notebook (404 for non-members, 403 for a role that may not). */
export async function authorizeInNotebook(ctx: ActingContext, notebookId: string, action: EntryAction): Promise<void> {
  if (!isUuid(notebookId)) throw new NotFoundError('No such notebook');
  authorizeEntry(await notebookRoleOf(ctx.manager, notebookId, ctx.actor.id), action, 'notebook');
}

/**
 * Loads an entry of a notebook with its author, after checking the actor may do `action`.
 * With `lock`, the entry row is locked (SELECT … FOR UPDATE) until the transaction ends.
 */
export async function loadEntry(
  ctx: ActingContext,
  props: { notebookId: string; entryId: string; action: EntryAction; lock?: boolean },
): Promise<EntryEntity> {
  await authorizeInNotebook(ctx, props.notebookId, props.action);
  if (!isUuid(props.entryId)) throw new NotFoundError('No such entry');
  if (props.lock) {
    await ctx.manager.query('SELECT id FROM entry WHERE id = $1 AND notebook_id = $2 FOR UPDATE', [props.entryId, props.notebookId]);
  }
  const entry = await ctx.manager.findOne(EntryEntity, {
    where: { id: props.entryId, notebookId: props.notebookId },
    relations: { author: true },
  });
  if (!entry) throw new NotFoundError('No such entry');
  return entry;
}
