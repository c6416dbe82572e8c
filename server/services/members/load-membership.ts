import type { EntityManager } from 'typeorm';
import { MembershipEntity } from '@server/entities/membership.entity.ts';
import { ConflictError, NotFoundError } from '@server/errors/index.ts';
import { isUuid } from '@server/services/ids.ts';

/** A member of the notebook (with the user), locked for change; NotFound otherwise. */
export async function loadMembership(manager: EntityManager, notebookId: string, userId: string): Promise<MembershipEntity> {
  const membership = isUuid(userId)
    ? await manager.findOne(MembershipEntity, { where: { notebookId, userId }, relations: { user: true } })
    : null;
  if (!membership) throw new NotFoundError('This person is not a member of the notebook');
  return membership;
}

/** Refuses to leave a notebook without a PI. Call with the notebook row locked. */
export async function assertNotLastPi(manager: EntityManager, membership: MembershipEntity, field: string): Promise<void> {
  if (membership.role !== 'pi') return;
  const pis = await manager.count(MembershipEntity, { where: { notebookId: membership.notebookId, role: 'pi' } });
  if (pis <= 1) {
    throw new ConflictError('A notebook needs at least one PI', [{ path: field, message: 'Make another member PI first' }]);
  }
}
