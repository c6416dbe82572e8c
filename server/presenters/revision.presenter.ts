import type { Revision, RevisionSummary } from '@shared/api/entries.ts';
import type { RevisionEntity } from '@server/entities/revision.entity.ts';
import { presentSignature, type SignatureWithSigner } from './signature.presenter.ts';

/** A revision with its author loaded. */
export type RevisionWithAuthor = RevisionEntity & { author: { id: string; name: string }; signatures?: SignatureWithSigner[] };

export function presentRevisionSummary(r: RevisionWithAuthor): RevisionSummary {
  return {
    id: r.id,
    number: r.number,
    entryId: r.entryId,
    parentId: r.parentId,
    title: r.title,
    message: r.message,
    author: { id: r.author.id, name: r.author.name },
    createdAt: r.createdAt.toISOString(),
    contentHash: r.contentHash,
    restoredFromId: r.restoredFromId,
    signatures: (r.signatures ?? []).map(presentSignature),
  };
}

export function presentRevision(r: RevisionWithAuthor): Revision {
  return {
    ...presentRevisionSummary(r),
    entryDate: r.entryDate,
    tags: r.tags,
    document: r.document,
    outputs: r.outputs,
  };
}
