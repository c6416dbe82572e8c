import type { EntityManager } from 'typeorm';
import type { NotebookRole } from '@shared/domain/roles.ts';
import { MembershipEntity } from '@server/entities/membership.entity.ts';

/** The person's role in the notebook, or null when they are not a member. */
export async function notebookRoleOf(manager: EntityManager, notebookId: string, userId: string): Promise<NotebookRole | null> {
  const membership = await manager.findOne(MembershipEntity, { where: { notebookId, userId }, select: { id: true, role: true } });
  return membership?.role ?? null;
}
