import type { Review, ReviewDetail, ReviewQueueItem } from '@shared/api/reviews.ts';
import type { ReviewEntity } from '@server/entities/review.entity.ts';
import { presentSignature, type SignatureWithSigner } from './signature.presenter.ts';

type Person = { id: string; name: string };

/** A review with the people it names loaded; `pis` are the notebook's PIs (the reviewers). */
export interface ReviewView {
  review: ReviewEntity & { requestedBy: Person; decidedBy: Person | null };
  pis: Person[];
}

const person = (p: Person) => ({ id: p.id, name: p.name });

export function presentReview({ review: r, pis }: ReviewView): Review {
  return {
    id: r.id,
    entryId: r.entryId,
    notebookId: r.notebookId,
    requestedBy: person(r.requestedBy),
    note: r.note,
    status: r.status,
    revisionId: r.revisionId,
    submittedRevisionId: r.submittedRevisionId,
    reviewers: pis.map((pi) => ({
      reviewer: person(pi),
      lastSeenRevisionId: r.lastSeen[pi.id]?.revisionId ?? null,
      seenAt: r.lastSeen[pi.id]?.seenAt ?? null,
    })),
    decidedBy: r.decidedBy ? person(r.decidedBy) : null,
    createdAt: r.createdAt.toISOString(),
    closedAt: r.closedAt ? r.closedAt.toISOString() : null,
  };
}

export function presentReviewDetail(view: ReviewView, signatures: SignatureWithSigner[], viewerId: string): ReviewDetail {
  return {
    review: presentReview(view),
    signatures: signatures.map(presentSignature),
    myLastSeenRevisionId: view.review.lastSeen[viewerId]?.revisionId ?? null,
  };
}

export function presentQueueItem(view: ReviewView, titles: { entry: string; notebook: string }, viewerId: string): ReviewQueueItem {
  const lastSeen = view.review.lastSeen[viewerId]?.revisionId ?? null;
  return {
    review: presentReview(view),
    entryTitle: titles.entry,
    notebookTitle: titles.notebook,
    lastSeenRevisionId: lastSeen,
    changedSinceSeen: lastSeen !== view.review.revisionId,
  };
}
