import { describe, expect, it } from 'vitest';
import type { RunCellResponse } from '@shared/api/entries.ts';
import { REPRODUCIBILITY_RELATIVE_TOLERANCE } from '@shared/api/reviews.ts';
import { resolveFromCells } from '@shared/cells/resolve.ts';
import type { CellOutput } from '@shared/cells/output.ts';
import { extractCells, type DocumentJson } from '@shared/editor/document.ts';
import type { ContinuationResult, EquilibriaResult, FoldCurveResult, SimulateResult } from '@shared/engine/contract.ts';
import { ENGINE_DEFAULTS } from '@shared/engine/limits.ts';
import { RUN_ERROR_CODES } from '@server/analysis/analysis-task.ts';
import { ENGINE_VERSION } from '@server/engine/version.ts';
import { requestInputHash } from '@server/services/analysis/request-hash.ts';
import { checkReproducibility, type RerunCell } from '@server/services/reproducibility/check-revision.ts';
import { close, compareResults } from '@server/services/reproducibility/compare-results.ts';

/**
 * The comparison behind the reproducibility check, on hand-made results. Values follow x' = μ − x²:
 * equilibria x = ±√μ, one fold at μ = 0, x = 0 (closed form; Strogatz, "Nonlinear Dynamics and
 * Chaos", §3.1).
 */
const engine = { version: 'test', elapsedMs: 1 };
const point = (mu: number, x: number, stability: 'stable' | 'unstable') => ({
  parameter: mu, state: { x }, stability, eigenvalues: [{ re: -2 * x, im: 0 }], unstableDimension: stability === 'unstable' ? 1 : 0, residual: 0,
});
const fold = (mu: number) => ({
  kind: 'fold' as const, parameter: mu, state: { x: 0 }, after: 1, eigenvalues: [{ re: 0, im: 0 }], residual: 0,
  normalForm: { a: 1, b: -2, nullVector: { x: 1 }, adjointNullVector: { x: 1 }, equilibriaSide: 'above' as const, nondegenerate: true },
});
const branch = (foldAt: number, points = [point(1, 1, 'stable'), point(0.25, 0.5, 'stable'), point(0.25, -0.5, 'unstable')]): ContinuationResult => ({
  branch: { points, events: [fold(foldAt)], stopReason: 'bounds' },
  engine,
});

describe('close', () => {
  it('uses a relative tolerance above 1 and an absolute one below', () => {
    expect(REPRODUCIBILITY_RELATIVE_TOLERANCE).toBe(1e-6);
    expect(close(1000, 1000.0009, 1e-6)).toBe(true);
    expect(close(1000, 1000.002, 1e-6)).toBe(false);
    expect(close(0, 9e-7, 1e-6)).toBe(true);
    expect(close(0, 2e-6, 1e-6)).toBe(false);
    expect(close(Number.NaN, Number.NaN, 1e-6)).toBe(true);
  });
});

describe('compareResults', () => {
  it('finds nothing when the rerun agrees within the tolerance', () => {
    expect(compareResults(branch(0), branch(4e-7), 'mu')).toEqual([]);
  });

  it('names a moved fold by its parameter, with both values', () => {
    expect(compareResults(branch(0.25), branch(0.250013), 'mu')).toEqual(['fold near mu = 0.2500: stored 0.250000, rerun 0.250013']);
  });

  it('reports a fold that only one run found', () => {
    const none: ContinuationResult = { branch: { ...branch(0).branch, events: [] }, engine };
    expect(compareResults(branch(0), none, 'mu')).toEqual(['fold near mu = 0.0000: in the stored result, not found by the rerun']);
    expect(compareResults(none, branch(0), 'mu')).toEqual(['fold near mu = 0.0000: found by the rerun, not in the stored result']);
  });

  it('compares point counts, then each point, and the stop reason', () => {
    const shorter = branch(0, [point(1, 1, 'stable'), point(0.25, 0.5, 'stable')]);
    expect(compareResults(branch(0), shorter, 'mu')).toEqual(['branch: stored 3 points, rerun 2 points']);
    const moved = branch(0, [point(1, 1, 'stable'), point(0.25, 0.5001, 'stable'), point(0.25, -0.5, 'stable')]);
    expect(compareResults(branch(0), moved, 'mu')).toEqual(['branch point 2: x stored 0.500000, rerun 0.500100', 'branch point 3: stored unstable, rerun stable']);
    const stopped: ContinuationResult = { branch: { ...branch(0).branch, stopReason: 'max-points' }, engine };
    expect(compareResults(branch(0), stopped, 'mu')).toEqual(['stopped because: stored "bounds", rerun "max-points"']);
  });

  it('matches equilibria by nearest state, in any order', () => {
    const eq = (xs: number[]): EquilibriaResult => ({
      equilibria: xs.map((x) => ({ state: { x }, stability: x > 0 ? 'stable' : 'unstable', eigenvalues: [], unstableDimension: x > 0 ? 0 : 1, residual: 0 })),
      starts: { tried: 10, converged: 10 }, stopReason: 'completed', engine,
    });
    expect(compareResults(eq([0.5, -0.5]), eq([-0.5, 0.5]), null)).toEqual([]);
    expect(compareResults(eq([0.5, -0.5]), eq([0.5]), null)).toEqual(['equilibria: stored 2, rerun 1']);
  });

  it('compares fold curves and trajectories sample by sample', () => {
    const curve = (b: number): FoldCurveResult => ({
      curve: { points: [{ parameters: { mu: 0, k: b }, state: { x: 0 }, normalForm: { a: 1, b: -2 }, residual: 0 }], events: [], stopReason: 'bounds' },
      engine,
    });
    expect(compareResults(curve(1), curve(1.01), null)).toEqual(['curve point 1: k stored 1.000000, rerun 1.010000']);
    const traj = (x1: number): SimulateResult => ({ trajectory: { t: [0, 1], state: { x: [1, x1] } }, stopReason: 'end', steps: { accepted: 5, rejected: 0 }, engine });
    expect(compareResults(traj(0.5), traj(0.5), null)).toEqual([]);
    expect(compareResults(traj(0.5), traj(0.6), null)).toEqual(['at t = 1.00000: x stored 0.500000, rerun 0.600000']);
  });

  it('caps long lists of point differences', () => {
    const many = (dx: number) => branch(0, Array.from({ length: 8 }, (_, i) => point(i, i + dx, 'stable')));
    const lines = compareResults(many(0), many(0.01), 'mu');
    expect(lines).toHaveLength(6);
    expect(lines[5]).toBe('and 3 more differences');
  });

  it('says when the kinds of result differ', () => {
    expect(compareResults(branch(0), { trajectory: { t: [], state: {} }, stopReason: 'end', steps: { accepted: 0, rejected: 0 }, engine }, 'mu')).toEqual([
      'the rerun gave a different kind of result than the stored one',
    ]);
  });
});

describe('checkReproducibility', () => {
  const MODEL = 'a0000000-0000-4000-8000-000000000001';
  const FIRST = 'a0000000-0000-4000-8000-000000000002';
  const SECOND = 'a0000000-0000-4000-8000-000000000003';
  const cell = (id: string, kind: string, input: object) => ({ type: 'cell', attrs: { id, kind, input } });
  const task = { kind: 'continuation', parameter: 'mu', start: { x: 1 }, bounds: { min: -1, max: 2 } };
  const document: DocumentJson = {
    type: 'doc',
    content: [
      cell(MODEL, 'model', { name: 'Saddle-node', variables: [{ name: 'x', rhs: 'mu - x^2' }], parameters: [{ name: 'mu', value: 1 }], definitions: [] }),
      cell(FIRST, 'branch', { modelCellId: MODEL, task }),
      cell(SECOND, 'branch', { modelCellId: MODEL, task: { ...task, start: { x: -1 } } }),
    ],
  };
  const cells = extractCells(document);
  /** The stored output of a cell: a fold at μ = 0, computed from the cell's present input. */
  const stored = (cellId: string): CellOutput => {
    const resolution = resolveFromCells(cells, cells.find((c) => c.id === cellId)!);
    if (!resolution.ok) throw new Error('the test cell does not resolve');
    return { inputHash: requestInputHash(ENGINE_VERSION, resolution.request), engineVersion: ENGINE_VERSION, computedAt: new Date().toISOString(), status: 'ok', result: branch(0), elapsedMs: 1 };
  };
  const revision = { document, outputs: { [FIRST]: stored(FIRST), [SECOND]: stored(SECOND) } };
  const answer = (output: Partial<RunCellResponse>): RunCellResponse => ({ ...stored(FIRST), cached: false, ...output }) as RunCellResponse;

  it('reruns each analysis cell in turn, with its request, its engine budget and a signal, and compares the answers', async () => {
    const calls: Parameters<RerunCell>[0][] = [];
    const report = await checkReproducibility(async (props) => {
      calls.push(props);
      return answer({ result: props.cellId === FIRST ? branch(4e-7) : branch(0.01) });
    }, revision);
    expect(calls.map((c) => [c.cellId, c.budgetMs, c.signal.aborted])).toEqual([
      [FIRST, ENGINE_DEFAULTS.timeLimitMs, false],
      [SECOND, ENGINE_DEFAULTS.timeLimitMs, false],
    ]);
    expect(calls[0].request).toMatchObject({ task: { kind: 'continuation', parameter: 'mu' } });
    expect(report.status).toBe('differs');
    expect(report.cells.map((c) => [c.cellId, c.status])).toEqual([
      [FIRST, 'reproduced'],
      [SECOND, 'differs'],
    ]);
  });

  it('reports "not-checked" for a rerun that did not end in the check\'s time or that no worker computed, never "differs"', async () => {
    const report = await checkReproducibility(
      async ({ cellId }) =>
        cellId === FIRST ? null : answer({ status: 'error', result: undefined, error: { code: 'run_queue_busy', message: 'The analysis queue is busy' } }),
      revision,
    );
    expect(report.status).toBe('not-checked');
    expect(report.cells).toEqual([
      { cellId: FIRST, kind: 'branch', status: 'not-checked', differences: ['the time for the reproducibility check ran out before the rerun of this cell ended'] },
      { cellId: SECOND, kind: 'branch', status: 'not-checked', differences: ['the rerun was not computed: The analysis queue is busy'] },
    ]);
  });

  it('reports "not-checked" when the instance running a rerun stopped, but "differs" when the worker crashed on the cell', async () => {
    const lost = await checkReproducibility(
      async () => answer({ status: 'error', result: undefined, error: { code: RUN_ERROR_CODES.lost, message: 'The server running this analysis stopped before it finished' } }),
      revision,
    );
    expect(lost.cells.map((c) => c.status)).toEqual(['not-checked', 'not-checked']);
    const crashed = await checkReproducibility(
      async () => answer({ status: 'error', result: undefined, error: { code: RUN_ERROR_CODES.crashed, message: 'The analysis worker failed: out of memory' } }),
      revision,
    );
    expect(crashed.status).toBe('differs');
    expect(crashed.cells[0].differences).toEqual(['stored a result, rerun error "run_failed"']);
  });

  it('keeps to its total time: the budget of a rerun is what is left, and cells not reached are "not-checked"', async () => {
    const budgets: number[] = [];
    const report = await checkReproducibility(
      async ({ budgetMs }) => {
        budgets.push(budgetMs);
        await new Promise((r) => setTimeout(r, 400));
        return answer({ result: branch(0) });
      },
      revision,
      { totalBudgetMs: 1300 },
    );
    expect(budgets).toHaveLength(1);
    expect(budgets[0]).toBeLessThanOrEqual(1300);
    expect(report.cells.map((c) => c.status)).toEqual(['reproduced', 'not-checked']);
    expect(report.cells[1].differences).toEqual(['the time for the reproducibility check ran out before this cell']);
  });
});
