import { z } from 'zod';
import {
  continuationResultSchema,
  engineFieldErrorSchema,
  equilibriaResultSchema,
  foldCurveResultSchema,
  hopfCurveResultSchema,
  simulateResultSchema,
  type ContinuationResult,
  type EquilibriaResult,
  type FoldCurveResult,
  type SimulateResult,
} from '../engine/contract.ts';
import type { AnalysisCellKind } from './kinds.ts';

/**
 * The output of a cell run. Outputs are stored beside the document (`outputs: Record<cellId,
 * CellOutput>`), never inside it.
 *
 * - inputHash: sha256 hex of `canonicalJson({ engineVersion, model, task })` of the resolved
 *   request that produced it (see `hash.ts` and `resolve.ts`).
 * - engineVersion: the engine that computed it.
 * - computedAt: ISO 8601 time the run finished.
 * - status "ok" carries `result`; status "error" carries `error` (with the field path when the
 *   request was at fault).
 * - elapsedMs: wall-clock time of the run.
 */
export const engineResultSchema = z.union([
  continuationResultSchema,
  foldCurveResultSchema,
  hopfCurveResultSchema,
  simulateResultSchema,
  equilibriaResultSchema,
]);

export const cellOutputErrorSchema = engineFieldErrorSchema;
export type CellOutputError = z.infer<typeof cellOutputErrorSchema>;

export const cellOutputSchema = z
  .object({
    inputHash: z.string().regex(/^[0-9a-f]{64}$/, { message: 'inputHash must be 64 hex digits (sha256)' }),
    engineVersion: z.string().min(1).max(80),
    computedAt: z.iso.datetime({ offset: true, message: 'computedAt must be an ISO 8601 time' }),
    status: z.enum(['ok', 'error']),
    result: engineResultSchema.optional(),
    error: cellOutputErrorSchema.optional(),
    elapsedMs: z.number().min(0),
  })
  .refine((o) => (o.status === 'ok' ? o.result !== undefined : o.error !== undefined), {
    message: 'An "ok" output carries a result; an "error" output carries an error',
  });
export type CellOutput = z.infer<typeof cellOutputSchema>;

/** Outputs of a document's cells, by cell id. */
export const cellOutputsSchema = z.record(z.uuid(), cellOutputSchema);
export type CellOutputs = z.infer<typeof cellOutputsSchema>;

/** The result type each analysis cell gets back. */
export interface ResultByCellKind {
  equilibria: EquilibriaResult;
  branch: ContinuationResult;
  'fold-map': FoldCurveResult;
  trajectory: SimulateResult;
}

/** Narrow an output's result to the type the cell kind expects (by shape), or null. */
export function resultFor<K extends AnalysisCellKind>(
  kind: K,
  output: CellOutput | undefined,
): ResultByCellKind[K] | null {
  const r = output?.status === 'ok' ? output.result : undefined;
  if (!r) return null;
  const ok =
    (kind === 'equilibria' && 'equilibria' in r) ||
    (kind === 'branch' && 'branch' in r) ||
    (kind === 'fold-map' && 'curve' in r) ||
    (kind === 'trajectory' && 'trajectory' in r);
  return ok ? (r as ResultByCellKind[K]) : null;
}
