import type { ConflictResponse } from '@shared/api/entries.ts';
import { ConflictError } from '@server/errors/index.ts';
import { presentRevision, type RevisionWithAuthor } from '@server/presenters/revision.presenter.ts';

/**
 * 409: the edit started from a revision that is no longer the head. Carries the head as it is
 * now, so the author can see what changed meanwhile and rebase instead of overwriting it.
 */
export class RevisionConflictError extends ConflictError {
  constructor(readonly current: RevisionWithAuthor) {
    super(
      `Revision ${current.number} was recorded by ${current.author.name} after your edit began; ` +
        'review their changes and save again on top of them',
    );
  }

  override toBody(): ConflictResponse {
    return { error: { code: 'conflict', message: this.message, current: presentRevision(this.current) } };
  }
}
