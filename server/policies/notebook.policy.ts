import type { NotebookRole } from '@shared/domain/roles.ts';
import type { MembershipEntity } from '@server/entities/membership.entity.ts';
import type { NotebookEntity } from '@server/entities/notebook.entity.ts';
import type { UserEntity } from '@server/entities/user.entity.ts';
import { ForbiddenError, NotFoundError } from '@server/errors/index.ts';

export type NotebookAction = 'read' | 'write' | 'review' | 'manage';

/**
 * What each notebook role may do:
 * - read: see the notebook, its members and entries; readers also comment;
 * - write: write entries, run cells, record revisions;
 * - review: review and approve (sign) revisions;
 * - manage: rename, describe, add and remove members.
 * Site administrators get no notebook rights from their site role.
 */
export const NOTEBOOK_PERMISSIONS: Record<NotebookAction, readonly NotebookRole[]> = {
  read: ['pi', 'researcher', 'reader'],
  write: ['pi', 'researcher'],
  review: ['pi'],
  manage: ['pi'],
};

export interface NotebookAccess {
  notebook: NotebookEntity;
  /** The caller's membership, or null when they are not a member. */
  membership: MembershipEntity | null;
}

export function can(action: NotebookAction, membership: MembershipEntity | null): boolean {
  return membership !== null && NOTEBOOK_PERMISSIONS[action].includes(membership.role);
}

/**
 * Throws NotFound when `user` is not a member (a non-member learns nothing, not even that
 * the notebook exists), Forbidden when their role does not allow `action`.
 * Returns the membership.
 */
export function authorize(user: UserEntity, action: NotebookAction, access: NotebookAccess): MembershipEntity {
  const { membership } = access;
  if (!membership || membership.userId !== user.id) throw new NotFoundError('No such notebook');
  if (!can(action, membership)) {
    throw new ForbiddenError(`A ${membership.role} of this notebook cannot ${action === 'write' ? 'write in it' : action === 'manage' ? 'manage it' : `${action} it`}`);
  }
  return membership;
}
