import type { EntityManager } from 'typeorm';
import type { NotebookRole } from '@shared/domain/roles.ts';
import type { EntryEntity } from '@server/entities/entry.entity.ts';
import { MembershipEntity } from '@server/entities/membership.entity.ts';
import { ReviewEntity } from '@server/entities/review.entity.ts';
import { SignatureEntity } from '@server/entities/signature.entity.ts';
import type { UserEntity } from '@server/entities/user.entity.ts';
import { authorizeReview, type ReviewAction } from '@server/policies/review.policy.ts';
import type { ReviewView } from '@server/presenters/review.presenter.ts';
import type { SignatureWithSigner } from '@server/presenters/signature.presenter.ts';
import { notebookRoleOf } from '@server/services/entries/notebook-role.ts';
import type { ActingContext } from '@server/services/entries/service-context.ts';

/** The notebook's PIs (the reviewers), by name. */
export async function notebookPis(manager: EntityManager, notebookId: string): Promise<UserEntity[]> {
  const rows = await manager.find(MembershipEntity, { where: { notebookId, role: 'pi' }, relations: { user: true } });
  return rows.map((m) => m.user).filter((u) => u.active).sort((a, b) => a.name.localeCompare(b.name));
}

/** The entry's latest review (open or closed), with its people; `lock` locks the row. */
export async function latestReview(manager: EntityManager, entryId: string, lock = false): Promise<ReviewEntity | null> {
  if (lock) {
    await manager.query(`SELECT id FROM review WHERE entry_id = $1 ORDER BY created_at DESC LIMIT 1 FOR UPDATE`, [entryId]);
  }
  return manager.findOne(ReviewEntity, {
    where: { entryId },
    relations: { requestedBy: true, decidedBy: true },
    order: { createdAt: 'DESC' },
  });
}

export async function reviewView(manager: EntityManager, review: ReviewEntity): Promise<ReviewView> {
  return { review, pis: await notebookPis(manager, review.notebookId) };
}

/** Signatures on one revision, oldest first. */
export async function signaturesOf(manager: EntityManager, revisionId: string): Promise<SignatureWithSigner[]> {
  return manager.find(SignatureEntity, { where: { revisionId }, relations: { signer: true }, order: { signedAt: 'ASC' } });
}

/** Checks the actor may do `action` on the entry's review; returns their notebook role. */
export async function authorizeOnEntry(
  ctx: ActingContext,
  entry: EntryEntity,
  action: ReviewAction,
  review: ReviewEntity | null,
  threadAuthorId?: string,
): Promise<NotebookRole> {
  const role = await notebookRoleOf(ctx.manager, entry.notebookId, ctx.actor.id);
  const authorIds = [entry.authorId, ...(review && review.status === 'open' ? [review.requestedById] : [])];
  authorizeReview(role, action, ctx.actor.id, { authorIds, threadAuthorId });
  return role as NotebookRole;
}
