import { z } from 'zod';
import { cellOutputSchema, cellOutputsSchema } from '../cells/output.ts';
import { documentSchema } from '../editor/document.ts';
import { signatureSchema } from './reviews.ts';

/**
 * Research-log entries, their revisions, the caller's working draft and cell runs.
 * Paths are under /api/notebooks/:notebookId unless they start with /api/engine.
 *
 * GET    /entries?q=&status=&author=&tag=&from=&to=   listEntriesQuery  -> entryList (newest first)
 * POST   /entries                                     createEntry       -> 201 entryDetail (with an empty revision #1)
 * GET    /entries/:entryId                                              -> entryDetail
 * PUT    /entries/:entryId/draft                      saveDraft         -> draft (autosave, per person)
 * DELETE /entries/:entryId/draft                                        -> 204
 * POST   /entries/:entryId/revisions                  recordRevision    -> 201 revision | 409 conflictResponse
 * GET    /entries/:entryId/revisions                                    -> revisionList (newest first)
 * GET    /entries/:entryId/revisions/:revisionId                        -> revision
 * POST   /entries/:entryId/revisions/:revisionId/restore restoreRevision -> 201 revision | 409 conflictResponse
 * POST   /entries/:entryId/cells/:cellId/run          runCell           -> runCellResponse (a cell output; engine errors
 *                                                                          are an output with status "error", not an HTTP error)
 * GET    /entries/:entryId/cells/:cellId/run                            -> runProgress (waiting / running / idle)
 * DELETE /entries/:entryId/cells/:cellId/run                            -> 204 (cancels the run) | 404 (none in progress)
 * POST   /api/engine/validate-model                   validateModel     -> validateModelResponse
 *
 * Readers read; researchers and PIs write and run; a person who is not a member gets 404.
 */

/** Limits on entries; documented here, enforced by the schemas below. */
export const ENTRY_LIMITS = {
  /** Characters in an entry title. */
  titleMax: 200,
  /** Tags on one entry. */
  tagsMax: 20,
  /** Characters in one tag. */
  tagMax: 40,
  /** Characters in a revision message. */
  messageMax: 1000,
  /** Characters in the search box. */
  queryMax: 200,
  /** Cell outputs kept beside one document. */
  outputsMax: 200,
} as const;

/** Where an entry stands in review. New entries are drafts; review moves them on. */
export const ENTRY_STATUSES = ['draft', 'in-review', 'approved', 'changes-requested'] as const;
export type EntryStatus = (typeof ENTRY_STATUSES)[number];
export const ENTRY_STATUS_LABELS: Record<EntryStatus, string> = {
  draft: 'Draft',
  'in-review': 'In review',
  approved: 'Approved',
  'changes-requested': 'Changes requested',
};

/** A calendar date, YYYY-MM-DD. */
export const entryDateSchema = z.iso.date({ message: 'Enter a date as YYYY-MM-DD' });

export const entryTitleSchema = z
  .string()
  .trim()
  .min(1, { message: 'Enter a title' })
  .max(ENTRY_LIMITS.titleMax, { message: `A title has at most ${ENTRY_LIMITS.titleMax} characters` });

export const tagSchema = z
  .string()
  .trim()
  .min(1, { message: 'A tag cannot be empty' })
  .max(ENTRY_LIMITS.tagMax, { message: `A tag has at most ${ENTRY_LIMITS.tagMax} characters` });

/** Tags are kept in the order given, without repeats (compared case-insensitively). */
export const tagsSchema = z
  .array(tagSchema)
  .max(ENTRY_LIMITS.tagsMax, { message: `An entry has at most ${ENTRY_LIMITS.tagsMax} tags` })
  .transform((tags) => {
    const seen = new Set<string>();
    return tags.filter((t) => {
      const key = t.toLowerCase();
      if (seen.has(key)) return false;
      seen.add(key);
      return true;
    });
  });

export const personRefSchema = z.object({ id: z.uuid(), name: z.string() });
export type PersonRef = z.infer<typeof personRefSchema>;

// ---------------------------------------------------------------------------------------------
// Entries
// ---------------------------------------------------------------------------------------------

export const listEntriesQuerySchema = z.object({
  q: z.string().trim().max(ENTRY_LIMITS.queryMax).optional(),
  status: z.enum(ENTRY_STATUSES).optional(),
  author: z.uuid({ message: 'author must be a person id' }).optional(),
  tag: tagSchema.optional(),
  from: entryDateSchema.optional(),
  to: entryDateSchema.optional(),
});
export type ListEntriesQuery = z.infer<typeof listEntriesQuerySchema>;

export const createEntrySchema = z.object({
  title: entryTitleSchema,
  entryDate: entryDateSchema,
  tags: tagsSchema.default([]),
});
export type CreateEntryInput = z.input<typeof createEntrySchema>;

export const entrySummarySchema = z.object({
  id: z.uuid(),
  notebookId: z.uuid(),
  title: z.string(),
  entryDate: z.string(),
  tags: z.array(z.string()),
  status: z.enum(ENTRY_STATUSES),
  author: personRefSchema,
  createdAt: z.string(),
  updatedAt: z.string(),
  headRevisionId: z.uuid(),
  revisionCount: z.number().int(),
});
export type EntrySummary = z.infer<typeof entrySummarySchema>;

export const entryListSchema = z.object({ entries: z.array(entrySummarySchema) });
export type EntryList = z.infer<typeof entryListSchema>;

// ---------------------------------------------------------------------------------------------
// Revisions and drafts
// ---------------------------------------------------------------------------------------------

/** The content a revision or draft holds. */
const contentShape = {
  title: entryTitleSchema,
  entryDate: entryDateSchema,
  tags: tagsSchema,
  document: documentSchema,
  outputs: cellOutputsSchema
    .refine((o) => Object.keys(o).length <= ENTRY_LIMITS.outputsMax, {
      message: `At most ${ENTRY_LIMITS.outputsMax} cell outputs`,
    })
    .default({}),
};

export const revisionSchema = z.object({
  id: z.uuid(),
  number: z.number().int().min(1),
  entryId: z.uuid(),
  parentId: z.uuid().nullable(),
  title: z.string(),
  entryDate: z.string(),
  tags: z.array(z.string()),
  document: documentSchema,
  outputs: z.record(z.string(), cellOutputSchema),
  message: z.string().nullable(),
  author: personRefSchema,
  createdAt: z.string(),
  /** sha256 hex of canonicalJson({ title, entryDate, tags, document, outputs }). */
  contentHash: z.string(),
  /** Set when this revision restores an older one. */
  restoredFromId: z.uuid().nullable(),
  /** Electronic signatures on this revision (see shared/api/reviews.ts); empty when unsigned. */
  signatures: z.array(signatureSchema).default([]),
});
export type Revision = z.infer<typeof revisionSchema>;

export const revisionSummarySchema = revisionSchema.pick({
  id: true,
  number: true,
  entryId: true,
  parentId: true,
  title: true,
  message: true,
  author: true,
  createdAt: true,
  contentHash: true,
  restoredFromId: true,
  signatures: true,
});
export type RevisionSummary = z.infer<typeof revisionSummarySchema>;

export const revisionListSchema = z.object({ revisions: z.array(revisionSummarySchema) });
export type RevisionList = z.infer<typeof revisionListSchema>;

export const saveDraftSchema = z.object({ baseRevisionId: z.uuid(), ...contentShape });
export type SaveDraftInput = z.input<typeof saveDraftSchema>;
/** A working copy of an entry: its base revision and its content (the draft body once parsed). */
export type DraftContent = z.infer<typeof saveDraftSchema>;

export const draftSchema = z.object({
  baseRevisionId: z.uuid(),
  title: z.string(),
  entryDate: z.string(),
  tags: z.array(z.string()),
  document: documentSchema,
  outputs: z.record(z.string(), cellOutputSchema),
  updatedAt: z.string(),
});
export type Draft = z.infer<typeof draftSchema>;

export const recordRevisionSchema = z.object({
  baseRevisionId: z.uuid({ message: 'baseRevisionId must be the id of the revision the edit started from' }),
  ...contentShape,
  message: z
    .string()
    .trim()
    .max(ENTRY_LIMITS.messageMax, { message: `A message has at most ${ENTRY_LIMITS.messageMax} characters` })
    .optional(),
});
export type RecordRevisionInput = z.input<typeof recordRevisionSchema>;

export const restoreRevisionSchema = z.object({
  baseRevisionId: z.uuid({ message: 'baseRevisionId must be the id of the current head revision' }),
});
export type RestoreRevisionInput = z.input<typeof restoreRevisionSchema>;

export const entryDetailSchema = z.object({
  entry: entrySummarySchema,
  head: revisionSchema,
  /** The caller's own working draft, if they have one. */
  draft: draftSchema.nullable(),
});
export type EntryDetail = z.infer<typeof entryDetailSchema>;

/** 409 answer when the base revision is no longer the head: `current` is the head now. */
export const conflictResponseSchema = z.object({
  error: z.object({ code: z.literal('conflict'), message: z.string(), current: revisionSchema }),
});
export type ConflictResponse = z.infer<typeof conflictResponseSchema>;

// ---------------------------------------------------------------------------------------------
// Cell runs and model validation
// ---------------------------------------------------------------------------------------------

/**
 * The resolved engine request of a cell: the model (from the cell's model cell) and the task.
 * Only the outer shape is checked here; the engine checks the rest and answers with field paths.
 */
export const runCellSchema = z.object({
  model: z.record(z.string(), z.unknown(), { message: 'model must be an object' }),
  task: z.record(z.string(), z.unknown(), { message: 'task must be an object' }),
  timeLimitMs: z.unknown().optional(),
});
export type RunCellInput = z.input<typeof runCellSchema>;

/** A run's answer: the cell output, and whether it came from the store of earlier runs. */
export const runCellResponseSchema = z.intersection(cellOutputSchema, z.object({ cached: z.boolean() }));
export type RunCellResponse = z.infer<typeof runCellResponseSchema>;

/**
 * GET …/cells/:cellId/run: whether the cell has a run in progress on any server instance.
 * "waiting": the run waits in the queue for a free worker (its budget has not started);
 * "running": a worker is on it, for at most `budgetMs` (then it returns what it has).
 * DELETE on the same path cancels it, whichever instance runs it.
 */
export const runProgressSchema = z.discriminatedUnion('state', [
  z.object({ state: z.literal('idle') }),
  z.object({
    state: z.enum(['waiting', 'running']),
    startedBy: personRefSchema,
    acceptedAt: z.string(),
    startedAt: z.string().nullable(),
    /** Time since the run was accepted. */
    elapsedMs: z.number(),
    budgetMs: z.number(),
  }),
]);
export type RunProgress = z.infer<typeof runProgressSchema>;

export const validateModelSchema = z.object({ model: z.unknown() });
export type ValidateModelInput = z.input<typeof validateModelSchema>;

export const validateModelResponseSchema = z.object({
  errors: z.array(z.object({ path: z.string(), message: z.string(), position: z.number().int().optional() })),
});
export type ValidateModelResponse = z.infer<typeof validateModelResponseSchema>;
