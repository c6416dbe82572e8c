import { z } from 'zod';
import { personRefSchema } from './entries.ts';

/**
 * Figures: a plot of a cell output in a recorded revision, rendered by the server to SVG and PNG
 * and stored in file storage. Paths are under /api/notebooks/:notebookId/entries/:entryId.
 *
 * POST   /figures                  attachFigure -> 201 figure (422 when the cell has no plottable output)
 * GET    /figures                               -> figureList (newest first)
 * GET    /figures/:figureId                     -> figure
 * GET    /figures/:figureId/svg                 -> 302 to a short-lived signed address of the SVG
 * GET    /figures/:figureId/png                 -> 302 to a short-lived signed address of the PNG
 *
 * A figure carries the input hash and engine version of the output it shows, so it can always
 * be traced to the exact model and settings that produced it.
 */
export const FIGURE_LIMITS = {
  captionMax: 500,
  /** Width and height of the rendered plot area, in CSS pixels. */
  width: 560,
  height: 340,
  /** PNG pixels per CSS pixel. */
  pngScale: 2,
} as const;

/** Cell kinds that have a plot. */
export const FIGURE_CELL_KINDS = ['branch', 'fold-map', 'trajectory'] as const;

export const attachFigureSchema = z.object({
  revisionId: z.uuid({ message: 'revisionId must be a revision id' }),
  cellId: z.uuid({ message: 'cellId must be a cell id' }),
  caption: z.string().trim().max(FIGURE_LIMITS.captionMax).default(''),
  /** Branch plots: the state variable on the vertical axis (default: the cell's view, else the first). */
  variable: z.string().trim().min(1).max(64).optional(),
  /** Branch plots: measured data sets of this entry drawn over the branch. */
  measurementSetIds: z.array(z.uuid()).max(8).default([]),
});
export type AttachFigureInput = z.input<typeof attachFigureSchema>;

export const figureSchema = z.object({
  id: z.uuid(),
  entryId: z.uuid(),
  revisionId: z.uuid(),
  cellId: z.uuid(),
  cellKind: z.enum(FIGURE_CELL_KINDS),
  inputHash: z.string(),
  engineVersion: z.string(),
  caption: z.string(),
  svgSha256: z.string(),
  pngSha256: z.string(),
  pngWidth: z.number().int(),
  pngHeight: z.number().int(),
  createdBy: personRefSchema,
  createdAt: z.string(),
  svgUrl: z.string(),
  pngUrl: z.string(),
});
export type Figure = z.infer<typeof figureSchema>;

export const figureListSchema = z.object({ figures: z.array(figureSchema) });
export type FigureList = z.infer<typeof figureListSchema>;
