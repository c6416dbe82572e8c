import type { EntityManager } from 'typeorm';
import { MembershipEntity } from '@server/entities/membership.entity.ts';
import { NotebookEntity } from '@server/entities/notebook.entity.ts';
import type { UserEntity } from '@server/entities/user.entity.ts';
import { isUuid } from '@server/services/ids.ts';
import { NotFoundError } from '@server/errors/index.ts';
import type { NotebookAccess } from '@server/policies/notebook.policy.ts';

/** Loads a notebook and the caller's membership in it, for the policy to judge. */
export async function loadNotebookAccess(manager: EntityManager, notebookId: string, user: UserEntity, forUpdate = false): Promise<NotebookAccess> {
  const notebook = isUuid(notebookId)
    ? await manager.findOne(NotebookEntity, { where: { id: notebookId }, ...(forUpdate ? { lock: { mode: 'pessimistic_write' as const } } : {}) })
    : null;
  if (!notebook) throw new NotFoundError('No such notebook');
  const membership = await manager.findOne(MembershipEntity, { where: { notebookId, userId: user.id } });
  return { notebook, membership };
}

export const countMembers = (manager: EntityManager, notebookId: string): Promise<number> => manager.count(MembershipEntity, { where: { notebookId } });
