import { z } from 'zod';
import { ENTRY_LIMITS, ENTRY_STATUSES, entryDateSchema, personRefSchema, tagSchema } from './entries.ts';

/**
 * Search across every notebook the caller belongs to.
 *
 * GET /api/search?q=&notebookId=&author=&status=&tag=&from=&to=&contains=&parameter=&min=&max=&limit=  -> searchResponse
 *
 * - q: words, "quoted phrases", -excluded words, `or` (PostgreSQL web search syntax); ranked by
 *   relevance, with highlighted snippets. Without q, newest entries first.
 * - author, status, tag, from/to (entry date, inclusive): as in the entry list.
 * - contains: only entries whose head revision has a result with a fold, Hopf point, branch point or
 *   cusp. With `min` and/or `max` (and contains = fold, hopf or branch-point): only events whose
 *   parameter value lies in [min, max]; with `parameter`: only on branches followed in that parameter.
 */
export const SEARCH_EVENT_KINDS = ['fold', 'hopf', 'branch-point', 'cusp'] as const;
export type SearchEventKind = (typeof SEARCH_EVENT_KINDS)[number];
export const SEARCH_EVENT_LABELS: Record<SearchEventKind, string> = { fold: 'a fold', hopf: 'a Hopf point', 'branch-point': 'a branch point', cusp: 'a cusp' };

export const SEARCH_LIMITS = { defaultLimit: 20, maxLimit: 100 } as const;

const optionalNumber = (field: string) =>
  z
    .string()
    .trim()
    .regex(/^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/, { message: `${field} must be a number` })
    .transform(Number)
    .optional();

export const searchQuerySchema = z
  .object({
    q: z.string().trim().max(ENTRY_LIMITS.queryMax).optional(),
    notebookId: z.uuid({ message: 'notebookId must be a notebook id' }).optional(),
    author: z.uuid({ message: 'author must be a person id' }).optional(),
    status: z.enum(ENTRY_STATUSES).optional(),
    tag: tagSchema.optional(),
    from: entryDateSchema.optional(),
    to: entryDateSchema.optional(),
    contains: z.enum(SEARCH_EVENT_KINDS, { message: 'contains is one of fold, hopf, branch-point, cusp' }).optional(),
    parameter: z.string().trim().min(1).max(64).optional(),
    min: optionalNumber('min'),
    max: optionalNumber('max'),
    limit: z.coerce.number().int().min(1).max(SEARCH_LIMITS.maxLimit).default(SEARCH_LIMITS.defaultLimit),
  })
  .superRefine((v, ctx) => {
    if ((v.min !== undefined || v.max !== undefined || v.parameter) && (!v.contains || v.contains === 'cusp')) {
      ctx.addIssue({ code: 'custom', path: ['contains'], message: 'A parameter range needs contains = fold, hopf or branch-point' });
    }
    if (v.min !== undefined && v.max !== undefined && v.min > v.max) ctx.addIssue({ code: 'custom', path: ['max'], message: 'max must not be below min' });
    if (v.from && v.to && v.from > v.to) ctx.addIssue({ code: 'custom', path: ['to'], message: 'to must not be before from' });
  });
export type SearchQuery = z.output<typeof searchQuerySchema>;
export type SearchQueryInput = z.input<typeof searchQuerySchema>;

/**
 * A piece of a snippet; `hit` marks the words that matched. Render as text, never as HTML. With
 * `maths`, `text` is a whole formula's LaTeX to typeset (a formula cut at the snippet's edge comes
 * as readable text instead).
 */
export const snippetPartSchema = z.object({ text: z.string(), hit: z.boolean(), maths: z.boolean().optional() });
export type SnippetPart = z.infer<typeof snippetPartSchema>;

export const searchHitSchema = z.object({
  entryId: z.uuid(),
  notebook: z.object({ id: z.uuid(), title: z.string() }),
  title: z.string(),
  entryDate: z.string(),
  tags: z.array(z.string()),
  status: z.enum(ENTRY_STATUSES),
  author: personRefSchema,
  /** Relevance (ts_rank); 0 without q. */
  rank: z.number(),
  snippet: z.array(snippetPartSchema),
  /** With `contains`: the matching events (kind, parameter value or values, cell). */
  events: z.array(z.object({ kind: z.enum(SEARCH_EVENT_KINDS), cellId: z.string(), parameters: z.record(z.string(), z.number()) })),
});
export type SearchHit = z.infer<typeof searchHitSchema>;

export const searchResponseSchema = z.object({ results: z.array(searchHitSchema) });
export type SearchResponse = z.infer<typeof searchResponseSchema>;
