import type { NotebookRole } from '@shared/domain/roles.ts';
import { ForbiddenError, NotFoundError } from '@server/errors/index.ts';

/**
 * What a person may do with a notebook's entries, by their role in that notebook.
 * - read: list entries, open an entry, its revisions and its history (every member).
 * - write: create entries, autosave drafts, record and restore revisions (researchers and PIs).
 * - run: run computation cells (researchers and PIs).
 * Someone who is not a member is told the entry does not exist (404), so entries do not leak.
 */
export const ENTRY_ACTIONS = ['read', 'write', 'run'] as const;
export type EntryAction = (typeof ENTRY_ACTIONS)[number];

const ALLOWED: Record<EntryAction, readonly NotebookRole[]> = {
  read: ['pi', 'researcher', 'reader'],
  write: ['pi', 'researcher'],
  run: ['pi', 'researcher'],
};

export function can(role: NotebookRole | null, action: EntryAction): boolean {
  return role !== null && ALLOWED[action].includes(role);
}

/** Throws NotFoundError for non-members and ForbiddenError for members whose role does not allow it. */
export function authorizeEntry(role: NotebookRole | null, action: EntryAction, what = 'entry'): void {
  if (role === null) throw new NotFoundError(`No such ${what}`);
  if (!can(role, action)) {
    throw new ForbiddenError(
      action === 'read' ? `You may not read this ${what}` : `Readers cannot ${action === 'run' ? 'run cells' : 'change entries'}; ask a PI for the researcher role`,
    );
  }
}
