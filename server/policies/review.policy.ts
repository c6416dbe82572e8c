import type { NotebookRole } from '@shared/domain/roles.ts';
import { ForbiddenError, NotFoundError } from '@server/errors/index.ts';

/**
 * Who may do what in a review, by notebook role:
 * - read: see the review, its signatures and comments (every member);
 * - comment: write comments and replies (every member, readers included);
 * - submit: submit an entry's revision for review (researchers and PIs);
 * - decide: mark seen, request changes or approve (sign) — PIs only, and never on an entry
 *   they wrote or submitted themselves (nobody approves their own work);
 * - resolve: resolve or reopen a thread (its author, the entry's author, and PIs).
 * Non-members are told the entry does not exist (404).
 */
export const REVIEW_ACTIONS = ['read', 'comment', 'submit', 'decide', 'resolve'] as const;
export type ReviewAction = (typeof REVIEW_ACTIONS)[number];

const ALLOWED: Record<ReviewAction, readonly NotebookRole[]> = {
  read: ['pi', 'researcher', 'reader'],
  comment: ['pi', 'researcher', 'reader'],
  submit: ['pi', 'researcher'],
  decide: ['pi'],
  resolve: ['pi', 'researcher', 'reader'],
};

export interface ReviewSubject {
  /** The entry's author, and whoever submitted the open review (if any). */
  authorIds: readonly string[];
  /** For "resolve": the author of the thread. */
  threadAuthorId?: string;
}

const REFUSALS: Record<ReviewAction, string> = {
  read: 'You may not read this entry',
  comment: 'You may not comment on this entry',
  submit: 'Readers cannot submit entries for review',
  decide: 'Only a PI of this notebook can review and approve entries',
  resolve: 'Only the thread’s author, the entry’s author or a PI can resolve this thread',
};

export function canReview(role: NotebookRole | null, action: ReviewAction, actorId: string, subject: ReviewSubject): boolean {
  if (role === null || !ALLOWED[action].includes(role)) return false;
  if (action === 'decide') return !subject.authorIds.includes(actorId);
  if (action === 'resolve') return role === 'pi' || subject.authorIds.includes(actorId) || subject.threadAuthorId === actorId;
  return true;
}

/** Throws NotFoundError for non-members and ForbiddenError when the role or authorship does not allow it. */
export function authorizeReview(role: NotebookRole | null, action: ReviewAction, actorId: string, subject: ReviewSubject): void {
  if (role === null) throw new NotFoundError('No such entry');
  if (canReview(role, action, actorId, subject)) return;
  if (action === 'decide' && role === 'pi') throw new ForbiddenError('You cannot review or approve an entry you wrote or submitted yourself');
  throw new ForbiddenError(REFUSALS[action]);
}
