/**
 * The kinds of computation cell an entry can hold, and their names in plain words.
 *
 * - model: the equations (state variables with right-hand sides, parameters, definitions).
 * - equilibria: all equilibria found in a box of the state space, with their stability.
 * - branch: one-parameter continuation of a branch of equilibria, with its events (folds …).
 * - fold-map: the curve of folds in a plane of two parameters (bistable region, cusps).
 * - trajectory: a simulation from initial values.
 */
export const CELL_KINDS = ['model', 'equilibria', 'branch', 'fold-map', 'trajectory'] as const;
export type CellKind = (typeof CELL_KINDS)[number];

/** Cells that compute something from a model cell of the same entry. */
export const ANALYSIS_CELL_KINDS = ['equilibria', 'branch', 'fold-map', 'trajectory'] as const;
export type AnalysisCellKind = (typeof ANALYSIS_CELL_KINDS)[number];

export const CELL_KIND_LABELS: Record<CellKind, string> = {
  model: 'Model',
  equilibria: 'Equilibria',
  branch: 'Branch of equilibria',
  'fold-map': 'Fold map',
  trajectory: 'Trajectory',
};

/** A sentence for the insert menu. */
export const CELL_KIND_DESCRIPTIONS: Record<CellKind, string> = {
  model: 'State variables, their right-hand sides and parameters',
  equilibria: 'Every equilibrium in a box, with eigenvalues and stability',
  branch: 'Follow equilibria as one parameter changes; find folds',
  'fold-map': 'Where folds lie in a plane of two parameters; the bistable region',
  trajectory: 'Simulate from initial values: time series and phase plane',
};

export function isAnalysisKind(kind: CellKind): kind is AnalysisCellKind {
  return kind !== 'model';
}
