import type {
  ContinuationResult,
  EquilibriaResult,
  FoldCurveResult,
  FoldEvent,
  Point,
  SimulateResult,
} from '@shared/engine/contract.ts';
import { num } from './doc.ts';

/**
 * Reading computed results for the prose. Every number an entry cites comes through here from
 * the cell's own output, so the text cannot drift from what the cells show.
 */

/** The branch's folds, lowest parameter value first. */
export function foldsOf(result: ContinuationResult): FoldEvent[] {
  const folds = result.branch.events.filter((e): e is FoldEvent => e.kind === 'fold');
  return folds.sort((a, b) => a.parameter - b.parameter);
}

/** Exactly two folds, or the seed stops: the prose about hysteresis needs both. */
export function twoFolds(result: ContinuationResult, what: string): [FoldEvent, FoldEvent] {
  const folds = foldsOf(result);
  if (folds.length !== 2) throw new Error(`${what}: expected two folds on the branch, found ${folds.length}`);
  return [folds[0], folds[1]];
}

/** "fold at Da = 0.0709": the one phrase the prose uses to cite a fold (tests look for it). */
export const foldAt = (parameter: string, fold: FoldEvent): string =>
  `fold at ${parameter} = ${num(fold.parameter)}`;

/** The cusps of a fold curve as "(Da, B) = (0.108, 7.5)". */
export function cuspsOf(result: FoldCurveResult, parameters: [string, string]): string[] {
  return result.curve.events.map(
    (c) =>
      `cusp at (${parameters[0]}, ${parameters[1]}) = (${num(c.parameters[parameters[0]])}, ${num(c.parameters[parameters[1]])})`,
  );
}

/** The parameter range the fold curve covers along one parameter. */
export function rangeOf(result: FoldCurveResult, parameter: string): [number, number] {
  const values = result.curve.points.map((p) => p.parameters[parameter]);
  return [Math.min(...values), Math.max(...values)];
}

const STABILITY_WORDS = { stable: 'stable', unstable: 'unstable', neutral: 'neutrally stable' } as const;

/** "x1 = 0.063, x2 = 0.303 (stable)". */
export function describePoint(point: Pick<Point, 'state' | 'stability'>, names: string[]): string {
  return `${names.map((n) => `${n} = ${num(point.state[n])}`).join(', ')} (${STABILITY_WORDS[point.stability]})`;
}

/** Equilibria in order of the first named variable. */
export function equilibriaBy(result: EquilibriaResult, name: string): Point[] {
  return [...result.equilibria].sort((a, b) => a.state[name] - b.state[name]);
}

export const countWord = (n: number, one: string, many: string): string =>
  `${['no', 'one', 'two', 'three', 'four', 'five'][n] ?? String(n)} ${n === 1 ? one : many}`;

/** The first and last sampled values of a variable along a trajectory, and the time at which it moved half the way. */
export function jumpOf(
  result: SimulateResult,
  name: string,
): { from: number; to: number; halfwayAt: number } {
  const values = result.trajectory.state[name];
  const from = values[0];
  const to = values[values.length - 1];
  const halfway = (from + to) / 2;
  const index = values.findIndex((v) => (to > from ? v >= halfway : v <= halfway));
  return { from, to, halfwayAt: result.trajectory.t[Math.max(0, index)] };
}
