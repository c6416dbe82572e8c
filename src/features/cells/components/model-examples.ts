import type { ModelCellInput } from '@shared/cells/inputs.ts';

/**
 * Small working models a new model cell offers in one click. Each starts a branch cell well: its
 * first parameter's value is a point where the state 0 is a regular equilibrium (Newton converges
 * there), and the new branch cell's default range (the value ± 1) crosses the model's bifurcations.
 */
export const MODEL_EXAMPLES: { key: string; label: string; description: string; input: ModelCellInput }[] = [
  {
    key: 'hysteresis',
    label: 'Two folds (hysteresis)',
    description: 'x′ = μ + x − x³: a stable state jumps at two folds, μ = ±0.385',
    input: {
      name: 'Two folds',
      variables: [{ name: 'x', rhs: 'mu + x - x^3' }],
      parameters: [{ name: 'mu', value: 0 }],
      definitions: [],
    },
  },
  {
    key: 'pitchfork',
    label: 'Pitchfork',
    description: 'x′ = μx − x³: the rest state loses stability at μ = 0 and two new states branch off',
    input: {
      name: 'Pitchfork',
      variables: [{ name: 'x', rhs: 'mu*x - x^3' }],
      parameters: [{ name: 'mu', value: -0.5 }],
      definitions: [],
    },
  },
];

/** True for a model cell nothing has been written in yet (no right-hand side, no parameter, no definition). */
export function isBlankModel(input: Record<string, unknown>): boolean {
  const list = (v: unknown) => (Array.isArray(v) ? (v as Record<string, unknown>[]) : []);
  return (
    list(input.variables).every((v) => !String(v.rhs ?? '').trim()) && list(input.parameters).length === 0 && list(input.definitions).length === 0
  );
}
