import { describe, expect, it } from 'vitest';
import { analyze, type ModelInput } from '@server/engine/index.ts';
import type { AnalyzeResult } from '@shared/engine/contract.ts';
import type { CellOutput } from '@shared/cells/output.ts';
import { diffCellOutputs, matchNearest, type ResultChange } from '@shared/diff/result-diff.ts';

/** A stored cell output around an engine result (hash and times do not matter to the comparison). */
function output(result: AnalyzeResult): CellOutput {
  return { inputHash: '0'.repeat(64), engineVersion: result.engine.version, computedAt: '2026-12-01T12:00:00Z', status: 'ok', result, elapsedMs: 1 };
}

const scalar = (rhs: string, parameters: { name: string; value: number }[]): ModelInput => ({ variables: [{ name: 'x', rhs }], parameters });
const branch = (model: ModelInput, parameter: string, start: Record<string, number>, min: number, max: number) =>
  output(analyze({ model, task: { kind: 'continuation', parameter, start, bounds: { min, max } } }));
const sentences = (changes: ResultChange[]) => changes.map((c) => c.sentence);

describe('diffCellOutputs: branches', () => {
  it('describes a fold that moved, with the parameter name and the signed difference', () => {
    // x' = μ − x² has its fold at μ = 0 (Strogatz, Nonlinear Dynamics and Chaos, §3.1); adding
    // 0.01 shifts it to μ = −0.01 (closed form: μ + 0.01 − x² = 0 has a double root there).
    const before = branch(scalar('mu - x^2', [{ name: 'mu', value: 1 }]), 'mu', { x: 1 }, -1, 1);
    const after = branch(scalar('mu + 0.01 - x^2', [{ name: 'mu', value: 1 }]), 'mu', { x: 1 }, -1, 1);
    const changes = diffCellOutputs('branch', before, after, { parameter: 'mu' });
    const fold = changes.find((c) => c.topic === 'fold')!;
    expect(fold.kind).toBe('moved');
    expect(fold.sentence).toBe('Fold moved from μ = 0.0000 to μ = −0.0100 (−0.0100)');
    expect(fold.delta).toBeCloseTo(-0.01, 8);
    // Same engine, same stop: nothing else to say but the covered range is unchanged too.
    expect(changes.filter((c) => c.topic === 'engine')).toEqual([]);
    expect(changes.filter((c) => c.topic === 'stability')).toEqual([]);
  });

  it('matches both folds of the hysteresis loop and reports each move', () => {
    // x' = h + r x − x³ (Strogatz §3.6): folds at h = ±(2r/3)·sqrt(r/3): ±0.3849 for r = 1 and
    // ±0.5060 for r = 1.2 (closed form).
    const model = (r: number) => scalar('h + r*x - x^3', [{ name: 'h', value: -1 }, { name: 'r', value: r }]);
    const before = branch(model(1), 'h', { x: -1.3 }, -1, 1);
    const after = branch(model(1.2), 'h', { x: -1.4 }, -1, 1);
    const hc = (r: number) => ((2 * r) / 3) * Math.sqrt(r / 3);
    const moved = diffCellOutputs('branch', before, after, { parameter: 'h' }).filter((c) => c.topic === 'fold');
    expect(moved.map((c) => c.kind)).toEqual(['moved', 'moved']);
    const byBefore = [...moved].sort((p, q) => p.before! - q.before!);
    expect(byBefore[0].before).toBeCloseTo(-hc(1), 7);
    expect(byBefore[0].after).toBeCloseTo(-hc(1.2), 7);
    expect(byBefore[1].before).toBeCloseTo(hc(1), 7);
    expect(byBefore[1].after).toBeCloseTo(hc(1.2), 7);
    expect(sentences(moved)).toContain('Fold moved from h = 0.3849 to h = 0.5060 (+0.1211)');
    expect(sentences(moved)).toContain('Fold moved from h = −0.3849 to h = −0.5060 (−0.1211)');
  });

  it('names the branch whose stability changed', () => {
    // x' = μ − x²: upper branch x = +√μ stable, lower unstable; x' = x² − μ swaps them (Strogatz §3.1).
    const before = branch(scalar('mu - x^2', [{ name: 'mu', value: 1 }]), 'mu', { x: 1 }, -1, 1);
    const after = branch(scalar('x^2 - mu', [{ name: 'mu', value: 1 }]), 'mu', { x: 1 }, -1, 1);
    const changes = diffCellOutputs('branch', before, after, { parameter: 'mu' });
    expect(changes.find((c) => c.topic === 'fold')!.kind).toBe('unchanged');
    expect(sentences(changes.filter((c) => c.topic === 'stability')).sort()).toEqual([
      'Stability of the lower branch changed: unstable → stable',
      'Stability of the upper branch changed: stable → unstable',
    ]);
  });

  it('reports a fold that appears and one that disappears when the range moves past it', () => {
    // x' = x(1 − x) − h has its fold at h = 1/4 (Strogatz, Exercise 3.7.3).
    const model = scalar('x*(1 - x) - h', [{ name: 'h', value: 0 }]);
    const without = branch(model, 'h', { x: 1 }, -0.5, 0.2);
    const withFold = branch(model, 'h', { x: 1 }, -0.5, 0.5);
    const gained = diffCellOutputs('branch', without, withFold, { parameter: 'h' });
    expect(sentences(gained)).toContain('New fold at h = 0.2500 (x = 0.5000)');
    expect(gained.some((c) => c.topic === 'range')).toBe(true);
    const lost = diffCellOutputs('branch', withFold, without, { parameter: 'h' });
    expect(sentences(lost)).toContain('Fold disappeared (was at h = 0.2500)');
  });

  it('notes a change of engine version', () => {
    const a = branch(scalar('mu - x^2', [{ name: 'mu', value: 1 }]), 'mu', { x: 1 }, -1, 1);
    const b = { ...a, engineVersion: 'engine-next' };
    expect(sentences(diffCellOutputs('branch', a, b, { parameter: 'mu' }))).toContain(`Computed with engine engine-next (before: ${a.engineVersion})`);
  });
});

describe('diffCellOutputs: equilibria', () => {
  it('counts equilibria and lists the new ones with their stability', () => {
    // x' = h + x − x³ (Strogatz §3.6, r = 1): one equilibrium for |h| > 0.3849, three inside.
    const run = (h: number) => output(analyze({ model: scalar('h + x - x^3', [{ name: 'h', value: h }]), task: { kind: 'equilibria', box: { x: [-3, 3] } } }));
    const changes = diffCellOutputs('equilibria', run(0.5), run(0.2), {});
    expect(changes[0].sentence).toBe('1 → 3 equilibria');
    const appeared = changes.filter((c) => c.kind === 'appeared');
    expect(appeared).toHaveLength(2);
    // The new pair: roots of x³ − x − 0.2 = 0 by the trigonometric form of Cardano's formula,
    // x_k = (2/√3)·cos(⅓·acos(0.3√3) − 2πk/3): −0.20915 (unstable, f' = 1 − 3x² > 0) and
    // −0.87889 (stable); the third, 1.08803, continues the one equilibrium of h = 0.5.
    expect(sentences(appeared).sort()).toEqual(['New stable equilibrium at x = −0.8789', 'New unstable equilibrium at x = −0.2091']);
  });

  it('uses the singular for one equilibrium', () => {
    const run = (h: number) => output(analyze({ model: scalar('h + x - x^3', [{ name: 'h', value: h }]), task: { kind: 'equilibria', box: { x: [-3, 3] } } }));
    expect(diffCellOutputs('equilibria', run(0), run(1), {})[0].sentence).toBe('3 → 1 equilibrium');
  });
});

describe('diffCellOutputs: fold curves', () => {
  // x' = h + c + r x − x³: fold curve r = 3x², h + c = −2x³, cusp at (h, r) = (−c, 0)
  // (Strogatz §3.6, Fig. 3.6.3; Kuznetsov, Elements of Applied Bifurcation Theory, §8.2).
  const run = (c: number, rMin = -1) =>
    output(
      analyze({
        model: { variables: [{ name: 'x', rhs: `h + ${c} + r*x - x^3` }], parameters: [{ name: 'h', value: -c - 2 / (3 * Math.sqrt(3)) }, { name: 'r', value: 1 }] },
        task: { kind: 'fold-curve', parameters: ['h', 'r'], start: { parameters: {}, state: { x: 0.6 } }, bounds: { h: [-1, 1], r: [rMin, 2] } },
      }),
    );

  it('describes a cusp that moved', () => {
    const changes = diffCellOutputs('fold-map', run(0), run(0.1), { parameters: ['h', 'r'] });
    expect(sentences(changes.filter((c) => c.topic === 'cusp'))).toEqual(['Cusp moved from (h, r) = (0.0000, 0.0000) to (−0.1000, 0.0000) (h −0.1000)']);
  });

  it('describes a cusp that disappeared when the curve no longer reaches it', () => {
    // With r ≥ 0.5 the followed piece of the fold curve stops at the bound before the cusp at r = 0.
    const changes = diffCellOutputs('fold-map', run(0), run(0, 0.5), { parameters: ['h', 'r'] });
    expect(sentences(changes.filter((c) => c.topic === 'cusp'))).toEqual(['Cusp disappeared (was at (h, r) = (0.0000, 0.0000))']);
    expect(changes.some((c) => c.topic === 'range' && c.sentence.startsWith('Fold curve now spans r ∈ [0.5000'))).toBe(true);
  });
});

describe('diffCellOutputs: trajectories', () => {
  it('reports the final state change of exponential decay', () => {
    // x' = −k x, x(0) = 1: x(1) = e^(−k) (closed form): 0.3679 for k = 1, 0.1353 for k = 2.
    const run = (k: number) =>
      output(analyze({ model: scalar('-k*x', [{ name: 'k', value: k }]), task: { kind: 'simulate', initial: { x: 1 }, time: { end: 1, samples: 11 }, tolerance: { relative: 1e-10, absolute: 1e-12 } } }));
    const [change] = diffCellOutputs('trajectory', run(1), run(2), {});
    expect(change.sentence).toBe('Final x changed from 0.3679 to 0.1353 (−0.2325)');
    expect(change.delta).toBeCloseTo(Math.exp(-2) - Math.exp(-1), 8);
  });
});

describe('diffCellOutputs: runs on one side only or failing', () => {
  it('says when a result is new, gone or now failing', () => {
    const ok = branch(scalar('mu - x^2', [{ name: 'mu', value: 1 }]), 'mu', { x: 1 }, -1, 1);
    const failed: CellOutput = { ...ok, status: 'error', result: undefined, error: { code: 'unknown_name', message: 'Unknown name "q"' } };
    expect(sentences(diffCellOutputs('branch', undefined, ok, {}))).toEqual(['Computed in this revision (no result before)']);
    expect(sentences(diffCellOutputs('branch', ok, undefined, {}))).toEqual(['No result in this revision (there was one before)']);
    expect(sentences(diffCellOutputs('branch', ok, failed, {}))).toEqual(['Now fails: Unknown name "q"']);
  });
});

describe('matchNearest', () => {
  it('pairs nearest first and leaves far points unmatched', () => {
    const at = (...coords: number[]) => ({ coords });
    const m = matchNearest([at(0), at(1)], [at(0.95), at(0.1), at(5)], [1]);
    expect(m.pairs).toEqual([{ i: 1, j: 0 }, { i: 0, j: 1 }]);
    expect(m.onlyB).toEqual([2]);
    expect(m.onlyA).toEqual([]);
  });
});

describe('diffCellOutputs: Hopf points', () => {
  it('describes a Hopf point that moved and one whose criticality changed', () => {
    // x' = (μ − c)x − y ∓ x(x² + y²), y' = x + (μ − c)y ∓ y(x² + y²): the origin has eigenvalues
    // (μ − c) ± i, so the Hopf point sits at μ = c; with "−" it is supercritical, with "+"
    // subcritical (Strogatz, Nonlinear Dynamics and Chaos, §8.2, Examples 8.2.1 and 8.2.2 in polar form).
    const run = (c: number, sign: '-' | '+') =>
      branch(
        {
          variables: [
            { name: 'x', rhs: `(mu - ${c})*x - y ${sign} x*(x^2 + y^2)` },
            { name: 'y', rhs: `x + (mu - ${c})*y ${sign} y*(x^2 + y^2)` },
          ],
          parameters: [{ name: 'mu', value: -1 }],
        },
        'mu',
        { x: 0, y: 0 },
        -1,
        1,
      );
    const before = run(0, '-');
    const hopf = (o: CellOutput) => (o.result as { branch: { events: { kind: string }[] } }).branch.events.filter((e) => e.kind === 'hopf');
    expect(hopf(before)).toHaveLength(1);
    const moved = diffCellOutputs('branch', before, run(0.1, '-'), { parameter: 'mu' }).filter((c) => c.topic === 'hopf');
    expect(sentences(moved)).toEqual(['Hopf point moved from μ = 0.0000 to μ = 0.1000 (+0.1000)']);
    const flipped = diffCellOutputs('branch', before, run(0, '+'), { parameter: 'mu' }).filter((c) => c.topic === 'hopf');
    expect(sentences(flipped)).toEqual(['Hopf point unchanged at μ = 0.0000', 'Hopf point at μ = 0.0000: now subcritical (before: supercritical)']);
  });
});
