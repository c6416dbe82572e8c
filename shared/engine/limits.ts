/**
 * Limits and defaults of the numerical engine, shared by the request contract (zod), the
 * client cell forms and the engine itself. One place, documented.
 */
export const ENGINE_LIMITS = {
  /** Names of variables, parameters and definitions: a letter, then letters, digits or "_". */
  nameMax: 32,
  /** State variables of one model (a 50-point discretised boundary-value problem must fit). */
  variablesMax: 120,
  /** Entries of one indexed variable (a discretised spatial model). */
  indexedSizeMax: 1000,
  /** State dimension once indexed variables are written out. */
  stateMax: 1200,
  /** State dimension above which fold and Hopf curves are refused (their extended systems are dense). */
  curveStateMax: 200,
  /** Named parameters of one model. */
  parametersMax: 60,
  /** Named definitions (intermediate expressions) of one model. */
  definitionsMax: 120,
  /** Characters in one right-hand side or definition. */
  expressionMax: 4000,
  /** Random Newton starts when searching equilibria in a box. */
  startsMax: 2000,
  /** Points on a branch or fold curve. */
  pointsMax: 20000,
  /** Output samples of a simulated trajectory. */
  samplesMax: 100000,
  /** Time budget of one request, in milliseconds (the largest a request may ask for). */
  timeLimitMsMax: 600_000,
} as const;

export const ENGINE_DEFAULTS = {
  /** Time budget of one request when it does not set one: 20 s. */
  timeLimitMs: 20_000,
  /** Random Newton starts for `equilibria`. */
  starts: 64,
  /** Points on a branch or fold curve. */
  maxPoints: 500,
  /** Pseudo-arclength step lengths (in the joint state-parameter space). */
  step: { initial: 0.01, min: 1e-6, max: 0.1 },
  /** Which way to follow a branch from its starting point. */
  direction: 'both',
  /** Output samples of a simulated trajectory, end points included. */
  samples: 201,
  /** Error tolerances of the adaptive Runge-Kutta integrator. */
  tolerance: { relative: 1e-8, absolute: 1e-10 },
  /** Integration method of `simulate` ("explicit" keeps earlier results unchanged). */
  method: 'explicit',
} as const;
