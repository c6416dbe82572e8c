import { z } from 'zod';

/** A person as shown beside a review, signature or comment (same shape as entries' PersonRef; kept here so entries.ts can import this file). */
const personRefSchema = z.object({ id: z.uuid(), name: z.string() });

/**
 * Review of entries by a notebook's PIs, electronic signatures, and comments.
 *
 * Review (paths under /api/notebooks/:notebookId/entries/:entryId):
 * POST /review                   submitReview          -> 201 reviewDetail (entry becomes "in-review"; one open review per entry)
 * GET  /review                                         -> reviewDetail | 404 (no review yet). The latest review, open or closed.
 * POST /review/mark-seen         markSeen              -> reviewDetail (the caller, a PI, has looked at `revisionId`)
 * POST /review/request-changes   requestChanges        -> reviewDetail (status "changes-requested"; the comment is kept as a comment)
 * POST /review/approve           approveReview         -> reviewDetail with the new signature
 *                                                         401 code "signature_failed" when the password is wrong (audited)
 *                                                         409 code "conflict" when `revisionId` is no longer the review's revision
 *                                                         409 code "not_reproduced" (body error.reproducibility: the report) when the
 *                                                         rerun differs and `acceptDifferences` is not true; nothing is signed
 * GET  /review/reproducibility                         -> reproducibilityReport (reruns every cell of the review's revision now,
 *                                                         without signing; the same check runs inside approve)
 *
 * Queue:
 * GET  /api/reviews/queue                              -> reviewQueue (open reviews awaiting the caller as PI, oldest first)
 *
 * Comments (paths under /api/notebooks/:notebookId/entries/:entryId):
 * GET    /comments?revisionId=   listCommentsQuery     -> commentList (threads: top-level comments with their replies)
 * POST   /comments               createComment         -> 201 comment (`parentId` makes a reply; `@Name` mentions mail the person)
 * POST   /comments/:commentId/resolve                  -> comment (threads only: a top-level comment)
 * POST   /comments/:commentId/reopen                   -> comment
 *
 * Who may: every member reads and comments; only the notebook's PIs request changes or approve,
 * and never on an entry they wrote themselves; researchers and PIs submit. Non-members get 404.
 * Signatures are shown with every revision (Revision.signatures in shared/api/entries.ts).
 */

export const REVIEW_LIMITS = {
  /** Characters in a submission note. */
  noteMax: 2000,
  /** Characters in a comment. */
  commentMax: 5000,
  /** Characters in a password typed to sign. */
  passwordMax: 256,
} as const;

export const REVIEW_STATUSES = ['open', 'changes-requested', 'approved'] as const;
export type ReviewStatus = (typeof REVIEW_STATUSES)[number];
export const REVIEW_STATUS_LABELS: Record<ReviewStatus, string> = {
  open: 'Awaiting review',
  'changes-requested': 'Changes requested',
  approved: 'Approved',
};

/** What a signature means. 21 CFR Part 11 §11.50(a)(3): the meaning is part of the signed record. */
export const SIGNATURE_MEANINGS = ['approved'] as const;
export type SignatureMeaning = (typeof SIGNATURE_MEANINGS)[number];
export const SIGNATURE_MEANING_LABELS: Record<SignatureMeaning, string> = { approved: 'Approved' };

// ---------------------------------------------------------------------------------------------
// Reproducibility
// ---------------------------------------------------------------------------------------------

/**
 * Relative tolerance when a rerun's numbers are compared with the stored ones:
 * |rerun − stored| ≤ REPRODUCIBILITY_RELATIVE_TOLERANCE · max(1, |stored|).
 */
export const REPRODUCIBILITY_RELATIVE_TOLERANCE = 1e-6;

export const REPRODUCIBILITY_STATUSES = ['reproduced', 'differs', 'not-checked'] as const;
export type ReproducibilityStatus = (typeof REPRODUCIBILITY_STATUSES)[number];

/** One cell's outcome. `differences` says in words what differs (empty when reproduced). */
export const cellReproducibilitySchema = z.object({
  cellId: z.string(),
  kind: z.string(),
  status: z.enum(REPRODUCIBILITY_STATUSES),
  differences: z.array(z.string()),
});
export type CellReproducibility = z.infer<typeof cellReproducibilitySchema>;

export const reproducibilityReportSchema = z.object({
  /** "reproduced" when every cell is; "differs" when any cell differs; "not-checked" when there was nothing to rerun or time ran out. */
  status: z.enum(REPRODUCIBILITY_STATUSES),
  /** Every difference of every cell, prefixed with the cell id. */
  differences: z.array(z.string()),
  cells: z.array(cellReproducibilitySchema),
  engineVersion: z.string(),
  checkedAt: z.string(),
  tolerance: z.number(),
});
export type ReproducibilityReport = z.infer<typeof reproducibilityReportSchema>;

// ---------------------------------------------------------------------------------------------
// Signatures
// ---------------------------------------------------------------------------------------------

/**
 * An electronic signature on one revision. Carries what 21 CFR Part 11 §11.50 asks a signed
 * record to show: the signer's printed name, the date and time of signing, and its meaning.
 * Bound to the revision's content hash (§11.70): it cannot be moved to another revision.
 */
export const signatureSchema = z.object({
  id: z.uuid(),
  revisionId: z.uuid(),
  contentHash: z.string(),
  signer: personRefSchema,
  printedName: z.string(),
  meaning: z.enum(SIGNATURE_MEANINGS),
  signedAt: z.string(),
  reproducibility: reproducibilityReportSchema,
});
export type Signature = z.infer<typeof signatureSchema>;

// ---------------------------------------------------------------------------------------------
// Reviews
// ---------------------------------------------------------------------------------------------

export const submitReviewSchema = z.object({
  /** The revision submitted: must be the entry's head (else 409). */
  revisionId: z.uuid({ message: 'revisionId must be the id of the revision to submit' }),
  note: z
    .string()
    .trim()
    .max(REVIEW_LIMITS.noteMax, { message: `A note has at most ${REVIEW_LIMITS.noteMax} characters` })
    .default(''),
});
export type SubmitReviewInput = z.input<typeof submitReviewSchema>;

export const markSeenSchema = z.object({
  revisionId: z.uuid({ message: 'revisionId must be the id of the revision you looked at' }),
});
export type MarkSeenInput = z.input<typeof markSeenSchema>;

export const requestChangesSchema = z.object({
  /** The revision the decision is about: must be the review's current revision (else 409). */
  revisionId: z.uuid({ message: 'revisionId must be the id of the revision you reviewed' }),
  comment: z
    .string()
    .trim()
    .min(1, { message: 'Say what should change' })
    .max(REVIEW_LIMITS.commentMax, { message: `A comment has at most ${REVIEW_LIMITS.commentMax} characters` }),
});
export type RequestChangesInput = z.input<typeof requestChangesSchema>;

export const approveReviewSchema = z.object({
  /** The revision being signed: must be the review's current revision (else 409). */
  revisionId: z.uuid({ message: 'revisionId must be the id of the revision you are signing' }),
  /** The signer's password, typed again (21 CFR Part 11 §11.200(a)). */
  password: z
    .string({ message: 'Enter your password to sign' })
    .min(1, { message: 'Enter your password to sign' })
    .max(REVIEW_LIMITS.passwordMax, { message: 'That password is too long' }),
  /** Sign even when the rerun differs; the differences are kept on the signature. Default false. */
  acceptDifferences: z.boolean().default(false),
});
export type ApproveReviewInput = z.input<typeof approveReviewSchema>;

export const reviewerSeenSchema = z.object({
  reviewer: personRefSchema,
  /** The last revision this PI marked as seen; null if they have not looked yet. */
  lastSeenRevisionId: z.uuid().nullable(),
  seenAt: z.string().nullable(),
});

export const reviewSchema = z.object({
  id: z.uuid(),
  entryId: z.uuid(),
  notebookId: z.uuid(),
  requestedBy: personRefSchema,
  note: z.string(),
  status: z.enum(REVIEW_STATUSES),
  /** The revision under review: follows new revisions while the review is open. */
  revisionId: z.uuid(),
  /** The revision first submitted. */
  submittedRevisionId: z.uuid(),
  /** Each PI of the notebook and the revision they last looked at (diff that → revisionId). */
  reviewers: z.array(reviewerSeenSchema),
  decidedBy: personRefSchema.nullable(),
  createdAt: z.string(),
  closedAt: z.string().nullable(),
});
export type Review = z.infer<typeof reviewSchema>;

export const reviewDetailSchema = z.object({
  review: reviewSchema,
  /** Signatures on the review's revision. */
  signatures: z.array(signatureSchema),
  /** The caller's own last-seen revision (diff base), when the caller is a PI. */
  myLastSeenRevisionId: z.uuid().nullable(),
});
export type ReviewDetail = z.infer<typeof reviewDetailSchema>;

export const reviewQueueItemSchema = z.object({
  review: reviewSchema,
  entryTitle: z.string(),
  notebookTitle: z.string(),
  /** The caller's last-seen revision; null means everything is new to them. */
  lastSeenRevisionId: z.uuid().nullable(),
  /** True when the review's revision moved on since the caller last looked. */
  changedSinceSeen: z.boolean(),
});
export type ReviewQueueItem = z.infer<typeof reviewQueueItemSchema>;

export const reviewQueueSchema = z.object({ items: z.array(reviewQueueItemSchema) });
export type ReviewQueue = z.infer<typeof reviewQueueSchema>;

// ---------------------------------------------------------------------------------------------
// Comments
// ---------------------------------------------------------------------------------------------

/** Where a comment points: a revision, and optionally one block (by index) or one cell (by id). */
export const commentAnchorSchema = z.object({
  revisionId: z.uuid({ message: 'anchor.revisionId must be a revision of this entry' }),
  blockIndex: z.number().int().min(0, { message: 'anchor.blockIndex is a block number from 0' }).optional(),
  cellId: z.string().min(1).max(100).optional(),
});
export type CommentAnchor = z.infer<typeof commentAnchorSchema>;

export const createCommentSchema = z.object({
  anchor: commentAnchorSchema,
  /** A reply to this comment (threads are one level: a reply to a reply joins the same thread). */
  parentId: z.uuid().optional(),
  body: z
    .string()
    .trim()
    .min(1, { message: 'A comment cannot be empty' })
    .max(REVIEW_LIMITS.commentMax, { message: `A comment has at most ${REVIEW_LIMITS.commentMax} characters` }),
});
export type CreateCommentInput = z.input<typeof createCommentSchema>;

export const listCommentsQuerySchema = z.object({ revisionId: z.uuid().optional() });
export type ListCommentsQuery = z.infer<typeof listCommentsQuerySchema>;

export const COMMENT_KINDS = ['comment', 'changes-requested'] as const;
export type CommentKind = (typeof COMMENT_KINDS)[number];

export const commentSchema = z.object({
  id: z.uuid(),
  entryId: z.uuid(),
  parentId: z.uuid().nullable(),
  anchor: commentAnchorSchema,
  kind: z.enum(COMMENT_KINDS),
  body: z.string(),
  author: personRefSchema,
  mentions: z.array(personRefSchema),
  createdAt: z.string(),
  resolvedAt: z.string().nullable(),
  resolvedBy: personRefSchema.nullable(),
});
export type Comment = z.infer<typeof commentSchema>;

export const commentThreadSchema = commentSchema.extend({ replies: z.array(commentSchema) });
export type CommentThread = z.infer<typeof commentThreadSchema>;

export const commentListSchema = z.object({ threads: z.array(commentThreadSchema) });
export type CommentList = z.infer<typeof commentListSchema>;
