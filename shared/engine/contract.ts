import { z } from 'zod';
import { ENGINE_DEFAULTS, ENGINE_LIMITS } from './limits.ts';

/**
 * Request/result contract of the numerical engine, shared by the HTTP API, the client cells
 * and the command-line tool (`npm run analyze -- FILE.json`).
 *
 * A request is `{ model, task, timeLimitMs? }`; the result shape depends on `task.kind`.
 * The zod schemas check shapes and limits only; the meaning of the expressions (syntax, known
 * names, allowed functions) is checked by the engine, which reports each problem with the
 * field path (e.g. "model.variables[1].rhs") and the character position in that field.
 */

// ---------------------------------------------------------------------------------------------
// Model
// ---------------------------------------------------------------------------------------------

export const identifierSchema = z
  .string()
  .min(1, { message: 'Enter a name' })
  .max(ENGINE_LIMITS.nameMax, { message: `Names have at most ${ENGINE_LIMITS.nameMax} characters` })
  .regex(/^[A-Za-z][A-Za-z0-9_]*$/, {
    message: 'A name starts with a letter and holds only letters, digits and "_"',
  });

const expressionSchema = z
  .string()
  .min(1, { message: 'Enter an expression' })
  .max(ENGINE_LIMITS.expressionMax, {
    message: `Expressions have at most ${ENGINE_LIMITS.expressionMax} characters`,
  });

const finite = z.number({ message: 'Enter a finite number' });

/**
 * One state variable x_i with its right-hand side x_i' = f_i(x, p). With `size`, an indexed
 * variable u[1] … u[size] of a discretised spatial model: `rhs` is written once for u[i] and may
 * use `i`, u[i − k] … u[i + k] and other variables at constant indices (u[1]); u[0] and
 * u[size + 1] are the boundary values `boundary.left` / `boundary.right` (expressions in the
 * parameters, default 0). Results name the entries "u[1]", "u[2]", ….
 */
export const variableSchema = z.object({
  name: identifierSchema,
  rhs: expressionSchema,
  size: z
    .number()
    .int()
    .min(1)
    .max(ENGINE_LIMITS.indexedSizeMax, { message: `An indexed variable has at most ${ENGINE_LIMITS.indexedSizeMax} entries` })
    .optional(),
  boundary: z.object({ left: expressionSchema.default('0'), right: expressionSchema.default('0') }).optional(),
});
/** One named parameter with its current value. */
export const parameterSchema = z.object({ name: identifierSchema, value: finite });
/** A named intermediate expression; may use variables, parameters and earlier definitions. */
export const definitionSchema = z.object({ name: identifierSchema, expression: expressionSchema });

export const modelSchema = z.object({
  variables: z
    .array(variableSchema)
    .min(1, { message: 'A model needs at least one variable' })
    .max(ENGINE_LIMITS.variablesMax, { message: `A model has at most ${ENGINE_LIMITS.variablesMax} variables` }),
  parameters: z
    .array(parameterSchema)
    .max(ENGINE_LIMITS.parametersMax, { message: `A model has at most ${ENGINE_LIMITS.parametersMax} parameters` })
    .default([]),
  definitions: z
    .array(definitionSchema)
    .max(ENGINE_LIMITS.definitionsMax, { message: `A model has at most ${ENGINE_LIMITS.definitionsMax} definitions` })
    .default([]),
});
export type ModelInput = z.input<typeof modelSchema>;
export type Model = z.output<typeof modelSchema>;

// ---------------------------------------------------------------------------------------------
// Tasks
// ---------------------------------------------------------------------------------------------

/** Values by name, e.g. { "x": 0.5, "y": 1 }. */
export const valuesSchema = z.record(z.string(), finite);
export type Values = z.infer<typeof valuesSchema>;

/** A closed interval [lo, hi] with lo < hi. */
export const intervalSchema = z
  .tuple([finite, finite])
  .refine(([lo, hi]) => lo < hi, { message: 'The lower end must be below the upper end' });

/** Find equilibria f(x, p) = 0 by Newton from `starts` quasi-random points in `box`. */
export const equilibriaTaskSchema = z.object({
  kind: z.literal('equilibria'),
  /** Search interval per variable; a variable left out gets [-10, 10]. */
  box: z.record(z.string(), intervalSchema).default({}),
  starts: z.number().int().min(1).max(ENGINE_LIMITS.startsMax).default(ENGINE_DEFAULTS.starts),
});

export const stepSchema = z
  .object({
    initial: z.number().positive().default(ENGINE_DEFAULTS.step.initial),
    min: z.number().positive().default(ENGINE_DEFAULTS.step.min),
    max: z.number().positive().default(ENGINE_DEFAULTS.step.max),
  })
  .refine((s) => s.min <= s.initial && s.initial <= s.max, {
    message: 'Steps must satisfy min ≤ initial ≤ max',
  });

export const DIRECTIONS = ['both', 'increasing', 'decreasing'] as const;
export type Direction = (typeof DIRECTIONS)[number];

/**
 * Follow a branch of equilibria in one parameter by pseudo-arclength continuation. `start` is a
 * guess (variables left out start at 0); Newton first converges it at the model's parameter values.
 */
export const continuationTaskSchema = z.object({
  kind: z.literal('continuation'),
  parameter: identifierSchema,
  start: valuesSchema.default({}),
  bounds: z
    .object({ min: finite, max: finite })
    .refine((b) => b.min < b.max, { message: 'bounds.min must be below bounds.max' }),
  maxPoints: z.number().int().min(2).max(ENGINE_LIMITS.pointsMax).default(ENGINE_DEFAULTS.maxPoints),
  step: stepSchema.default({ ...ENGINE_DEFAULTS.step }),
  direction: z.enum(DIRECTIONS).default(ENGINE_DEFAULTS.direction),
  /**
   * Start on the other branch through a branch point: the index of a "branch-point" event in the
   * events of the same request without `switchAt`, or a point { parameter, state } near the
   * branch point (the branch point of that branch nearest to it is taken). The result is the
   * other branch, followed both ways from the branch point.
   */
  switchAt: z
    .union([z.number().int().min(0), z.object({ parameter: finite, state: valuesSchema.default({}) })])
    .optional(),
});

/**
 * Follow a fold (saddle-node) in two parameters. `start` should be near a fold, e.g. a fold event
 * of a continuation; it is first converged onto the fold with the second parameter held fixed.
 * `bounds` gives an interval for each of the two parameters.
 */
export const foldCurveTaskSchema = z.object({
  kind: z.literal('fold-curve'),
  parameters: z.tuple([identifierSchema, identifierSchema]).refine(([a, b]) => a !== b, {
    message: 'Choose two different parameters',
  }),
  start: z.object({ parameters: valuesSchema, state: valuesSchema.default({}) }),
  bounds: z.record(z.string(), intervalSchema),
  maxPoints: z.number().int().min(2).max(ENGINE_LIMITS.pointsMax).default(ENGINE_DEFAULTS.maxPoints),
  /** Step lengths in the joint (state, null vector, two parameters) space. */
  step: stepSchema.default({ ...ENGINE_DEFAULTS.step }),
  /** Which way to set off, judged by the second parameter (parameters[1]). */
  direction: z.enum(DIRECTIONS).default(ENGINE_DEFAULTS.direction),
});

/**
 * Follow a Hopf point in two parameters. `start` should be near a Hopf point, e.g. a "hopf" event
 * of a continuation; it is first converged onto the Hopf point with the second parameter held
 * fixed (the complex pair nearest the imaginary axis is taken). Steps are lengths in the joint
 * (state, eigenvector, frequency, two parameters) space.
 */
export const hopfCurveTaskSchema = foldCurveTaskSchema.extend({ kind: z.literal('hopf-curve') });

/**
 * Integration methods: "explicit" Dormand–Prince 5(4); "implicit" a linearly implicit Rosenbrock
 * method with the exact Jacobian (for stiff models); "auto" starts explicit and switches to the
 * implicit method when stiffness is detected.
 */
export const SIMULATE_METHODS = ['explicit', 'implicit', 'auto'] as const;
export type SimulateMethod = (typeof SIMULATE_METHODS)[number];

/** Integrate x' = f(x, p) from t = time.start (default 0) to time.end, sampled at `samples` equally spaced times. */
export const simulateTaskSchema = z.object({
  kind: z.literal('simulate'),
  initial: valuesSchema.default({}),
  time: z
    .object({
      start: finite.default(0),
      end: finite,
      samples: z.number().int().min(2).max(ENGINE_LIMITS.samplesMax).default(ENGINE_DEFAULTS.samples),
    })
    .refine((t) => t.end > t.start, { message: 'time.end must be after time.start' }),
  tolerance: z
    .object({
      relative: z.number().min(1e-14).max(1).default(ENGINE_DEFAULTS.tolerance.relative),
      absolute: z.number().min(1e-16).max(1).default(ENGINE_DEFAULTS.tolerance.absolute),
    })
    .default({ ...ENGINE_DEFAULTS.tolerance }),
  method: z.enum(SIMULATE_METHODS).default(ENGINE_DEFAULTS.method),
});

export const taskSchema = z.discriminatedUnion('kind', [
  equilibriaTaskSchema,
  continuationTaskSchema,
  foldCurveTaskSchema,
  hopfCurveTaskSchema,
  simulateTaskSchema,
]);
export const TASK_KINDS = ['equilibria', 'continuation', 'fold-curve', 'hopf-curve', 'simulate'] as const;
export type TaskKind = (typeof TASK_KINDS)[number];

export const analyzeRequestSchema = z.object({
  model: modelSchema,
  task: taskSchema,
  /** Time budget in ms (default 20 000); when spent, the result holds what was computed, with stopReason "time-limit". */
  timeLimitMs: z.number().int().min(1).max(ENGINE_LIMITS.timeLimitMsMax).optional(),
});
/** What a caller sends (defaults may be left out). */
export type AnalyzeRequestInput = z.input<typeof analyzeRequestSchema>;
/** A validated request, defaults filled in. */
export type AnalyzeRequest = z.output<typeof analyzeRequestSchema>;
export type EquilibriaTask = z.output<typeof equilibriaTaskSchema>;
export type ContinuationTask = z.output<typeof continuationTaskSchema>;
export type FoldCurveTask = z.output<typeof foldCurveTaskSchema>;
export type HopfCurveTask = z.output<typeof hopfCurveTaskSchema>;
export type SimulateTask = z.output<typeof simulateTaskSchema>;
export type Task = z.output<typeof taskSchema>;

// ---------------------------------------------------------------------------------------------
// Results
// ---------------------------------------------------------------------------------------------

export const engineInfoSchema = z.object({ version: z.string(), elapsedMs: z.number() });
export type EngineInfo = z.infer<typeof engineInfoSchema>;

export const eigenvalueSchema = z.object({ re: z.number(), im: z.number() });
export type Eigenvalue = z.infer<typeof eigenvalueSchema>;

/**
 * Stability of an equilibrium from the Jacobian's eigenvalues: "stable" when every real part is
 * below -tol, "unstable" when any is above +tol, otherwise "neutral" (tol = 1e-9 · max(1, |λ|max)).
 */
export const STABILITIES = ['stable', 'unstable', 'neutral'] as const;
export type Stability = (typeof STABILITIES)[number];

export const pointSchema = z.object({
  state: valuesSchema,
  stability: z.enum(STABILITIES),
  /** Jacobian eigenvalues, sorted by decreasing real part. */
  eigenvalues: z.array(eigenvalueSchema),
  /** Number of eigenvalues with positive real part. */
  unstableDimension: z.number().int(),
  /** ‖f(x, p)‖₂ at this point (diagnostics). */
  residual: z.number(),
});
export type Point = z.infer<typeof pointSchema>;

/**
 * How far the parameter may move from a branch point, staying on this branch, before the nearest
 * fold that way: `increasing` (fold parameter − parameter, > 0) and `decreasing` (parameter −
 * fold parameter, > 0); null when no fold was found that way on the computed branch.
 */
export const tippingMarginSchema = z.object({ increasing: z.number().nullable(), decreasing: z.number().nullable() });
export type TippingMargin = z.infer<typeof tippingMarginSchema>;

export const branchPointSchema = pointSchema.extend({
  parameter: z.number(),
  /** Distances to the nearest folds (continuation results from engine 1.1 on). */
  tippingMargin: tippingMarginSchema.optional(),
});
export type BranchPoint = z.infer<typeof branchPointSchema>;

export const EQUILIBRIA_SIDES = ['above', 'below'] as const;

/**
 * Fold normal form. v = nullVector (|v|₂ = 1, largest-magnitude component positive);
 * w = adjointNullVector (wᵀJ = 0, w·v = 1); a = w·∂f/∂μ; b = w·D²f(v, v). Near the fold the
 * equilibria are x ≈ x* ± v·sqrt(−2a(μ−μ*)/b); they exist where −a(μ−μ*)/b > 0: `equilibriaSide`.
 */
export const foldNormalFormSchema = z.object({
  a: z.number(),
  b: z.number(),
  nullVector: valuesSchema,
  adjointNullVector: valuesSchema,
  equilibriaSide: z.enum(EQUILIBRIA_SIDES),
  /** a ≠ 0 and b ≠ 0 (relative to the sizes of f_μ and D²f). */
  nondegenerate: z.boolean(),
});
export type FoldNormalForm = z.infer<typeof foldNormalFormSchema>;

export const foldEventSchema = z.object({
  kind: z.literal('fold'),
  parameter: z.number(),
  state: valuesSchema,
  /** Index of the branch point just before the fold. */
  after: z.number().int(),
  eigenvalues: z.array(eigenvalueSchema),
  normalForm: foldNormalFormSchema,
  /** ‖(f, Jv, |v|−1)‖₂ of the extended system at the located fold (diagnostics). */
  residual: z.number(),
  /**
   * dμ* / dp for every other parameter p: how the fold's parameter value moves when p changes,
   * −(w·∂f/∂p)/(w·∂f/∂μ) (engine 1.1 on).
   */
  sensitivities: valuesSchema.optional(),
});
export type FoldEvent = z.infer<typeof foldEventSchema>;

/** A branch direction: unit vector in (state, parameter). */
export const branchDirectionSchema = z.object({ state: valuesSchema, parameter: z.number() });
export const BRANCH_POINT_TYPES = ['transcritical', 'pitchfork', 'simple'] as const;

/**
 * A simple branch point: two branches of equilibria cross. Detected where the determinant of
 * [J f_μ; tᵀ 0] changes sign while the tangent's parameter component does not. `tangents` are
 * the two branch directions (the followed branch's first). `type`: "transcritical" when the
 * parameter moves to opposite sides along both branches, "pitchfork" when along one branch it
 * moves to the same side on both ends (a symmetric pair of branches), otherwise "simple".
 */
export const branchPointEventSchema = z.object({
  kind: z.literal('branch-point'),
  parameter: z.number(),
  state: valuesSchema,
  after: z.number().int(),
  tangents: z.array(branchDirectionSchema),
  type: z.enum(BRANCH_POINT_TYPES),
  eigenvalues: z.array(eigenvalueSchema),
  /** ‖f‖₂ at the located point (diagnostics). */
  residual: z.number(),
});
export type BranchPointEvent = z.infer<typeof branchPointEventSchema>;

export const CRITICALITIES = ['supercritical', 'subcritical', 'degenerate'] as const;

/**
 * A Hopf point: a complex pair λ = ±iω crosses the imaginary axis (a real pair ±κ, the "neutral
 * saddle", is not reported). `firstLyapunovCoefficient` l1 by Kuznetsov's formula (Elements of
 * Applied Bifurcation Theory, 3rd ed., §3.5, eq. 3.20, and §10.2) with Aq = iωq, Aᵀp = −iωp,
 * ⟨q, q⟩ = 1, ⟨p, q⟩ = 1 (⟨u, v⟩ = Σ ū_i v_i); l1 < 0 supercritical (a stable cycle appears),
 * l1 > 0 subcritical, |l1| below tolerance degenerate.
 */
export const hopfEventSchema = z.object({
  kind: z.literal('hopf'),
  parameter: z.number(),
  state: valuesSchema,
  after: z.number().int(),
  frequency: z.number(),
  firstLyapunovCoefficient: z.number(),
  criticality: z.enum(CRITICALITIES),
  eigenvalues: z.array(eigenvalueSchema),
  /** ‖f‖₂ at the located point (diagnostics). */
  residual: z.number(),
});
export type HopfEvent = z.infer<typeof hopfEventSchema>;

/** Events along a branch. */
export const branchEventSchema = z.discriminatedUnion('kind', [foldEventSchema, branchPointEventSchema, hopfEventSchema]);
export type BranchEvent = z.infer<typeof branchEventSchema>;

/**
 * Why a branch or curve stopped. "start-not-converged": Newton did not converge at the start, so
 * nothing could be followed. "end-point": a Hopf curve ends at a Bogdanov–Takens point (ω = 0).
 */
export const STOP_REASONS = [
  'bounds',
  'max-points',
  'closed',
  'step-too-small',
  'time-limit',
  'start-not-converged',
  'end-point',
] as const;
export type StopReason = (typeof STOP_REASONS)[number];

export const branchSchema = z.object({
  points: z.array(branchPointSchema),
  events: z.array(branchEventSchema),
  /** Why the branch ended at its last point. */
  stopReason: z.enum(STOP_REASONS),
  /** With direction "both": why it ended at its first point. */
  stopReasonAtStart: z.enum(STOP_REASONS).optional(),
});
export type Branch = z.infer<typeof branchSchema>;

export const foldCurvePointSchema = z.object({
  parameters: valuesSchema,
  state: valuesSchema,
  normalForm: z.object({ a: z.number(), b: z.number() }),
  /** ‖(f, Jv, |v|−1)‖₂ of the extended system (diagnostics). */
  residual: z.number(),
});
export type FoldCurvePoint = z.infer<typeof foldCurvePointSchema>;

export const cuspEventSchema = z.object({
  kind: z.literal('cusp'),
  parameters: valuesSchema,
  state: valuesSchema,
  /** Index of the curve point just before the cusp. */
  after: z.number().int(),
});
export type CuspEvent = z.infer<typeof cuspEventSchema>;

/**
 * Codimension-two points where fold and Hopf curves meet or degenerate (Kuznetsov, Elements of
 * Applied Bifurcation Theory, 3rd ed., ch. 8): "cusp" (fold curve, b = 0); "bogdanov-takens"
 * (a second eigenvalue reaches zero on a fold curve; on a Hopf curve, ω reaches zero);
 * "zero-hopf" (a fold with a pair ±iω: on a fold curve a complex pair crosses the axis, on a
 * Hopf curve a real eigenvalue reaches zero); "generalized-hopf" (Hopf curve, l1 = 0).
 */
export const CODIMENSION_TWO_KINDS = ['cusp', 'bogdanov-takens', 'zero-hopf', 'generalized-hopf'] as const;
export const codimensionTwoEventSchema = z.object({
  kind: z.enum(CODIMENSION_TWO_KINDS),
  parameters: valuesSchema,
  state: valuesSchema,
  /** Index of the curve point just before it. */
  after: z.number().int(),
});
export type CodimensionTwoEvent = z.infer<typeof codimensionTwoEventSchema>;

export const foldCurveSchema = z.object({
  points: z.array(foldCurvePointSchema),
  /** Cusps, Bogdanov–Takens and zero-Hopf points along the fold curve. */
  events: z.array(codimensionTwoEventSchema),
  stopReason: z.enum(STOP_REASONS),
  stopReasonAtStart: z.enum(STOP_REASONS).optional(),
});
export type FoldCurve = z.infer<typeof foldCurveSchema>;

export const hopfCurvePointSchema = z.object({
  parameters: valuesSchema,
  state: valuesSchema,
  frequency: z.number(),
  /** l1 with the normalisation of "hopf" events. */
  firstLyapunovCoefficient: z.number(),
  /** ‖(f, J·a + ω·b, J·b − ω·a, …)‖₂ of the extended system (diagnostics). */
  residual: z.number(),
});
export type HopfCurvePoint = z.infer<typeof hopfCurvePointSchema>;

export const hopfCurveSchema = z.object({
  points: z.array(hopfCurvePointSchema),
  /** Generalized Hopf, zero-Hopf and Bogdanov–Takens points along the Hopf curve. */
  events: z.array(codimensionTwoEventSchema),
  stopReason: z.enum(STOP_REASONS),
  stopReasonAtStart: z.enum(STOP_REASONS).optional(),
});
export type HopfCurve = z.infer<typeof hopfCurveSchema>;

export const EQUILIBRIA_STOP_REASONS = ['completed', 'time-limit'] as const;
export const equilibriaResultSchema = z.object({
  equilibria: z.array(pointSchema),
  /** Starts tried and how many of them converged (before deduplication). */
  starts: z.object({ tried: z.number().int(), converged: z.number().int() }),
  stopReason: z.enum(EQUILIBRIA_STOP_REASONS),
  engine: engineInfoSchema,
});
export type EquilibriaResult = z.infer<typeof equilibriaResultSchema>;

export const continuationResultSchema = z.object({ branch: branchSchema, engine: engineInfoSchema });
export type ContinuationResult = z.infer<typeof continuationResultSchema>;

export const foldCurveResultSchema = z.object({ curve: foldCurveSchema, engine: engineInfoSchema });
export type FoldCurveResult = z.infer<typeof foldCurveResultSchema>;

export const hopfCurveResultSchema = z.object({ curve: hopfCurveSchema, engine: engineInfoSchema });
export type HopfCurveResult = z.infer<typeof hopfCurveResultSchema>;

/** "end": reached time.end; "not-finite": the solution left the floating-point range. */
export const SIMULATE_STOP_REASONS = ['end', 'step-too-small', 'not-finite', 'time-limit'] as const;
export const simulateResultSchema = z.object({
  trajectory: z.object({ t: z.array(z.number()), state: z.record(z.string(), z.array(z.number())) }),
  stopReason: z.enum(SIMULATE_STOP_REASONS),
  /** Accepted and rejected integrator steps (diagnostics); `implicit`: of those, taken by the implicit method. */
  steps: z.object({ accepted: z.number().int(), rejected: z.number().int(), implicit: z.number().int().optional() }),
  /** The method that ran; with "auto", the time it switched to the implicit method, if it did. */
  method: z.object({ used: z.enum(SIMULATE_METHODS), switchedAt: z.number().optional() }).optional(),
  engine: engineInfoSchema,
});
export type SimulateResult = z.infer<typeof simulateResultSchema>;

export type AnalyzeResult = EquilibriaResult | ContinuationResult | FoldCurveResult | HopfCurveResult | SimulateResult;
/** The result type for a given task kind. */
export interface ResultByKind {
  equilibria: EquilibriaResult;
  continuation: ContinuationResult;
  'fold-curve': FoldCurveResult;
  'hopf-curve': HopfCurveResult;
  simulate: SimulateResult;
}

// ---------------------------------------------------------------------------------------------
// Errors
// ---------------------------------------------------------------------------------------------

/** Stable codes of request errors (clients branch on them). */
export const ENGINE_ERROR_CODES = {
  /** The body is not JSON (command line). */
  malformedJson: 'malformed_json',
  /** The request does not match the contract (shape, types, limits). */
  invalidRequest: 'invalid_request',
  /** An expression does not parse. */
  syntax: 'expression_syntax',
  /** An expression uses a construct outside the allowed set (assignment, matrix, string, unit, ...). */
  forbiddenSyntax: 'expression_forbidden',
  /** An expression calls a function outside the whitelist. */
  unknownFunction: 'unknown_function',
  /** An expression uses a name that is not a variable, parameter, earlier definition or constant. */
  unknownName: 'unknown_name',
  /** Two variables/parameters/definitions share a name, or a name is reserved. */
  duplicateName: 'duplicate_name',
  /** A task refers to a variable or parameter the model does not have. */
  unknownReference: 'unknown_reference',
} as const;
export type EngineErrorCode = (typeof ENGINE_ERROR_CODES)[keyof typeof ENGINE_ERROR_CODES];

export const engineFieldErrorSchema = z.object({
  code: z.string(),
  message: z.string(),
  /** Dotted path of the field, e.g. "model.variables[1].rhs". */
  path: z.string().optional(),
  /** 0-based character position inside that field's text, where it applies. */
  position: z.number().int().optional(),
});
export type EngineFieldError = z.infer<typeof engineFieldErrorSchema>;
export const engineErrorResponseSchema = z.object({ error: engineFieldErrorSchema });
export type EngineErrorResponse = z.infer<typeof engineErrorResponseSchema>;
