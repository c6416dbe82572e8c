import type { z } from 'zod';
import {
  analyzeRequestSchema,
  ENGINE_ERROR_CODES,
  modelSchema,
  type AnalyzeRequestInput,
  type AnalyzeResult,
  type EngineFieldError,
  type ResultByKind,
} from '@shared/engine/contract.ts';
import { ENGINE_DEFAULTS } from '@shared/engine/limits.ts';
import { withTolerances, type Tolerances } from './defaults.ts';
import { EngineRequestError } from './errors.ts';
import { compileModel } from './model/compile.ts';
import { expandIndexed, originalPath } from './model/indexed.ts';
import { parseModel } from './model/parse.ts';
import type { TaskContext } from './tasks/context.ts';
import { runContinuation } from './tasks/continuation.ts';
import { runEquilibria } from './tasks/equilibria.ts';
import { runFoldCurve } from './tasks/fold-curve.ts';
import { runHopfCurve } from './tasks/hopf-curve.ts';
import { runSimulate } from './tasks/simulate.ts';
import { ENGINE_VERSION } from './version.ts';

export interface AnalyzeOptions {
  /** Time budget in ms; overrides the request's `timeLimitMs` (default 20 000). */
  timeLimitMs?: number;
  /** Override single numerical tolerances (tests, diagnostics). */
  tolerances?: Partial<Tolerances>;
}

/** "model.variables[1].rhs" from a zod issue path. */
export function formatPath(path: ReadonlyArray<PropertyKey>): string {
  let out = '';
  for (const part of path) {
    if (typeof part === 'number') out += `[${part}]`;
    else out += out ? `.${String(part)}` : String(part);
  }
  return out;
}

function zodFieldErrors(error: z.ZodError, prefix: string[] = []): EngineFieldError[] {
  return error.issues.map((issue) => {
    const path = formatPath([...prefix, ...issue.path]);
    return { code: ENGINE_ERROR_CODES.invalidRequest, message: path ? `${path}: ${issue.message}` : issue.message, path: path || undefined };
  });
}

/**
 * Every problem of a model, one entry per field at most: shape and limits (zod), then names and
 * expressions (the engine's parser, with character positions). Empty when the model is usable.
 * Paths start at "model.".
 */
export function validateModel(model: unknown): EngineFieldError[] {
  const shaped = modelSchema.safeParse(model);
  if (!shaped.success) return zodFieldErrors(shaped.error, ['model']);
  const { expanded, errors } = expandIndexed(shaped.data);
  if (!expanded) return errors;
  return parseModel(expanded.model).errors.map((e) => originalPath(e, expanded.origin));
}

/**
 * Run one analysis request: validate it against the shared contract, compile the model, run the
 * task within the time budget, and attach { engine: { version, elapsedMs } }. A bad request
 * throws EngineRequestError (code, message, path, position); a numerical failure is a normal
 * result with a stop reason.
 */
export function analyze<R extends AnalyzeRequestInput>(request: R, options?: AnalyzeOptions): ResultByKind[R['task']['kind']];
export function analyze(request: unknown, options?: AnalyzeOptions): AnalyzeResult;
export function analyze(request: unknown, options: AnalyzeOptions = {}): AnalyzeResult {
  const started = performance.now();
  const parsed = analyzeRequestSchema.safeParse(request);
  if (!parsed.success) {
    const fields = zodFieldErrors(parsed.error);
    throw new EngineRequestError(fields[0] as EngineFieldError & { code: typeof ENGINE_ERROR_CODES.invalidRequest }, fields);
  }
  const { model: modelInput, task, timeLimitMs } = parsed.data;
  // The budget covers compilation too (symbolic derivatives of a large model take a while).
  const budget = options.timeLimitMs ?? timeLimitMs ?? ENGINE_DEFAULTS.timeLimitMs;
  const ctx: TaskContext = { deadline: Date.now() + budget, tolerances: withTolerances(options.tolerances) };
  const model = compileModel(modelInput);
  const engine = () => ({ version: ENGINE_VERSION, elapsedMs: Math.round((performance.now() - started) * 1000) / 1000 });
  switch (task.kind) {
    case 'equilibria': {
      const r = runEquilibria(model, task, ctx);
      return { ...r, engine: engine() };
    }
    case 'continuation': {
      const branch = runContinuation(model, task, ctx);
      return { branch, engine: engine() };
    }
    case 'fold-curve': {
      const curve = runFoldCurve(model, task, ctx);
      return { curve, engine: engine() };
    }
    case 'hopf-curve': {
      const curve = runHopfCurve(model, task, ctx);
      return { curve, engine: engine() };
    }
    case 'simulate': {
      const r = runSimulate(model, task, ctx);
      return { ...r, engine: engine() };
    }
  }
}
