import { z } from 'zod';
import {
  continuationTaskSchema,
  equilibriaTaskSchema,
  foldCurveTaskSchema,
  identifierSchema,
  modelSchema,
  simulateTaskSchema,
  type Model,
} from '../engine/contract.ts';
import type { CellKind, AnalysisCellKind } from './kinds.ts';

/**
 * Inputs of each cell kind, as stored in the cell node's `input` attribute.
 *
 * These schemas are strict: the document itself accepts any object as a cell input (so an entry
 * with a half-typed cell can be saved); `checkCellInput` reports each problem by field path so
 * the form can show it next to the field, and a cell only runs once its input passes.
 */

const unitSchema = z.string().max(40, { message: 'Units have at most 40 characters' });
const noteSchema = z.string().max(2000, { message: 'Notes have at most 2000 characters' });

// ------------------------------------------------------------------------------------------
// Model cell
// ------------------------------------------------------------------------------------------

export const modelCellVariableSchema = z.object({
  name: identifierSchema,
  rhs: z.string().min(1, { message: 'Enter the right-hand side' }),
  unit: unitSchema.optional(),
  note: noteSchema.optional(),
});
export const modelCellParameterSchema = z.object({
  name: identifierSchema,
  value: z
    .number({ message: 'Enter a number' })
    .refine(Number.isFinite, { message: 'Enter a finite number' }),
  unit: unitSchema.optional(),
  note: noteSchema.optional(),
});
export const modelCellDefinitionSchema = z.object({
  name: identifierSchema,
  expression: z.string().min(1, { message: 'Enter an expression' }),
});

export const modelCellInputSchema = z.object({
  /** How analysis cells refer to this model in lists ("Stirred tank, first order"). */
  name: z
    .string()
    .trim()
    .min(1, { message: 'Give the model a name' })
    .max(120, { message: 'At most 120 characters' }),
  variables: z.array(modelCellVariableSchema).min(1, { message: 'A model needs at least one variable' }),
  parameters: z.array(modelCellParameterSchema).default([]),
  definitions: z.array(modelCellDefinitionSchema).default([]),
});
export type ModelCellInput = z.input<typeof modelCellInputSchema>;

/** The engine's model from a (valid) model cell: names and expressions only, units and notes dropped. */
export function toEngineModel(input: z.output<typeof modelCellInputSchema>): Model {
  return modelSchema.parse({
    variables: input.variables.map((v) => ({ name: v.name, rhs: v.rhs })),
    parameters: input.parameters.map((p) => ({ name: p.name, value: p.value })),
    definitions: input.definitions.map((d) => ({ name: d.name, expression: d.expression })),
  });
}

// ------------------------------------------------------------------------------------------
// Analysis cells
// ------------------------------------------------------------------------------------------

const modelCellIdSchema = z.uuid({ message: 'Choose a model cell' });

/** Which engine task each analysis cell runs. */
export const TASK_KIND_BY_CELL = {
  equilibria: 'equilibria',
  branch: 'continuation',
  'fold-map': 'fold-curve',
  trajectory: 'simulate',
} as const satisfies Record<AnalysisCellKind, string>;

/** How the branch diagram is drawn: which variable on the vertical axis, or the norm of the state. */
export const branchViewSchema = z.object({ yVariable: z.string().max(64).optional() }).default({});
export const trajectoryViewSchema = z
  .object({ phaseX: z.string().max(64).optional(), phaseY: z.string().max(64).optional() })
  .default({});
const emptyViewSchema = z.object({}).loose().default({});

export const equilibriaCellInputSchema = z.object({
  modelCellId: modelCellIdSchema,
  task: equilibriaTaskSchema,
  view: emptyViewSchema.optional(),
});
export const branchCellInputSchema = z.object({
  modelCellId: modelCellIdSchema,
  task: continuationTaskSchema,
  view: branchViewSchema.optional(),
});
export const foldMapCellInputSchema = z.object({
  modelCellId: modelCellIdSchema,
  task: foldCurveTaskSchema,
  view: emptyViewSchema.optional(),
});
export const trajectoryCellInputSchema = z.object({
  modelCellId: modelCellIdSchema,
  task: simulateTaskSchema,
  view: trajectoryViewSchema.optional(),
});

export const cellInputSchemas = {
  model: modelCellInputSchema,
  equilibria: equilibriaCellInputSchema,
  branch: branchCellInputSchema,
  'fold-map': foldMapCellInputSchema,
  trajectory: trajectoryCellInputSchema,
} as const;

export type EquilibriaCellInput = z.input<typeof equilibriaCellInputSchema>;
export type BranchCellInput = z.input<typeof branchCellInputSchema>;
export type FoldMapCellInput = z.input<typeof foldMapCellInputSchema>;
export type TrajectoryCellInput = z.input<typeof trajectoryCellInputSchema>;
export interface CellInputByKind {
  model: ModelCellInput;
  equilibria: EquilibriaCellInput;
  branch: BranchCellInput;
  'fold-map': FoldMapCellInput;
  trajectory: TrajectoryCellInput;
}
export type ParsedCellInput<K extends CellKind> = z.output<(typeof cellInputSchemas)[K]>;

// ------------------------------------------------------------------------------------------
// Field errors
// ------------------------------------------------------------------------------------------

/** One problem with a field: `path` is dotted with [index] for arrays, e.g. "variables[1].rhs". */
export interface FieldProblem {
  path: string;
  message: string;
  position?: number;
}

/** "variables[1].rhs" from ['variables', 1, 'rhs']. */
export function formatPath(path: readonly PropertyKey[]): string {
  let out = '';
  for (const part of path) {
    if (typeof part === 'number') out += `[${part}]`;
    else out += out ? `.${String(part)}` : String(part);
  }
  return out;
}

export function problemsFromZod(error: z.ZodError, prefix = ''): FieldProblem[] {
  return error.issues.map((issue) => {
    const path = formatPath(issue.path);
    return { path: prefix && path ? `${prefix}.${path}` : prefix || path, message: issue.message };
  });
}

export type CellInputCheck<K extends CellKind> =
  { ok: true; value: ParsedCellInput<K> } | { ok: false; problems: FieldProblem[] };

/** Check a cell's input against its kind's schema; problems name the field, relative to the input. */
export function checkCellInput<K extends CellKind>(kind: K, input: unknown): CellInputCheck<K> {
  const schema = cellInputSchemas[kind] as unknown as z.ZodType<ParsedCellInput<K>>;
  const parsed = schema.safeParse(input);
  if (parsed.success) return { ok: true, value: parsed.data };
  return { ok: false, problems: problemsFromZod(parsed.error) };
}
