/**
 * Engine benchmarks for this machine, one run: `npm run bench -- engine` (bench/index.ts runs it on import).
 * 1. compiled right-hand side vs a hand-written JS function of the same model (goal ≤ 2×);
 * 2. continuation points per second, with stability, for a two-variable model (goal ≥ 10 000/s);
 * 3. the 50-variable discretised Bratu problem followed through its fold, 300 points (goal < 0.5 s);
 * 4. the 1,000-point Bratu problem (one indexed variable, banded Jacobian) through its fold,
 *    compilation included (goal < 5 s: "a few seconds");
 * 5. a Hopf-rich four-variable model (two coupled Brusselators): continuation with stability,
 *    Hopf detection and first Lyapunov coefficients (goal ≥ 5,000 points/s, both Hopf points found);
 * 6. Robertson's stiff kinetics to t = 40 with the implicit method (goal < 100 ms).
 * Each figure is the median of several repetitions after a warm-up.
 */
import { analyze } from '@server/engine/index.ts';
import { compileModel } from '@server/engine/model/compile.ts';
import { modelSchema } from '@shared/engine/contract.ts';
import { bratuModel, coupledBrusselators } from '../tests/engine/models.ts';

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];
function timeIt(fn: () => void, repeats: number): number {
  fn();
  const times: number[] = [];
  for (let i = 0; i < repeats; i++) {
    const t = performance.now();
    fn();
    times.push(performance.now() - t);
  }
  return median(times);
}

// 1. Evaluation speed: a three-variable model with transcendental terms.
const evalModel = compileModel(
  modelSchema.parse({
    variables: [
      { name: 'x', rhs: 's*(y - x) + mu*exp(-x^2)' },
      { name: 'y', rhs: 'x*(r - z) - y + sin(x)' },
      { name: 'z', rhs: 'x*y - b*z' },
    ],
    parameters: [{ name: 's', value: 10 }, { name: 'r', value: 28 }, { name: 'b', value: 8 / 3 }, { name: 'mu', value: 0.5 }],
  }),
);
const handWritten = (x: Float64Array, p: Float64Array, out: Float64Array) => {
  out[0] = p[0] * (x[1] - x[0]) + p[3] * Math.exp(-(x[0] * x[0]));
  out[1] = x[0] * (p[1] - x[2]) - x[1] + Math.sin(x[0]);
  out[2] = x[0] * x[1] - p[2] * x[2];
};
const N = 2_000_000;
const state = Float64Array.of(0.1, 0.2, 0.3);
const params = evalModel.parameterValues();
const out = new Float64Array(3);
let sink = 0;
// Two separate loops (not one closure over `f`), so each call site stays monomorphic; the
// repetitions alternate between them.
const compiledRhs = evalModel.rhs;
const runCompiled = () => {
  for (let i = 0; i < N; i++) {
    state[0] = (i % 1000) * 1e-3;
    compiledRhs(state, params, out);
    sink += out[0];
  }
};
const runHandWritten = () => {
  for (let i = 0; i < N; i++) {
    state[0] = (i % 1000) * 1e-3;
    handWritten(state, params, out);
    sink += out[0];
  }
};
const compiledTimes: number[] = [];
const handTimes: number[] = [];
runCompiled();
runHandWritten();
for (let r = 0; r < 7; r++) {
  compiledTimes.push(timeOnce(runCompiled));
  handTimes.push(timeOnce(runHandWritten));
}
function timeOnce(fn: () => void): number {
  const t = performance.now();
  fn();
  return performance.now() - t;
}
const compiledMs = median(compiledTimes);
const handMs = median(handTimes);

// 2. Continuation throughput: a two-variable S-shaped branch (two folds), stability at every point.
const sModel = {
  variables: [{ name: 'x', rhs: 'mu + x - x^3 - 0.5*y' }, { name: 'y', rhs: 'x - y' }],
  parameters: [{ name: 'mu', value: -20 }],
};
const contRequest = {
  model: sModel,
  task: { kind: 'continuation' as const, parameter: 'mu', start: { x: -2.8 }, bounds: { min: -20, max: 20 }, maxPoints: 20000, direction: 'increasing' as const, step: { initial: 0.001, min: 1e-6, max: 0.002 } },
};
let contPoints = 0;
let contFolds = 0;
const contMs = timeIt(() => {
  const r = analyze(contRequest);
  contPoints = r.branch.points.length;
  contFolds = r.branch.events.length;
}, 5);

// 3. Bratu, 50 variables, 300 points through the fold.
const bratuRequest = {
  model: bratuModel(50),
  task: { kind: 'continuation' as const, parameter: 'lambda', bounds: { min: -1, max: 4 }, maxPoints: 300, direction: 'increasing' as const, step: { initial: 0.05, min: 1e-6, max: 0.5 } },
};
const firstStart = performance.now();
let bratu = analyze(bratuRequest);
const bratuFirstMs = performance.now() - firstStart;
const bratuMs = timeIt(() => {
  bratu = analyze(bratuRequest);
}, 5);

// 4. Bratu, 1,000 points as one indexed variable, through the fold; first call includes compilation.
const LARGE_N = 1000;
const largeRequest = {
  model: { variables: [{ name: 'u', size: LARGE_N, rhs: `(u[i-1] - 2*u[i] + u[i+1])*${(LARGE_N + 1) ** 2} + lambda*exp(u[i])` }], parameters: [{ name: 'lambda', value: 0 }] },
  task: { kind: 'continuation' as const, parameter: 'lambda', bounds: { min: -1, max: 4 }, maxPoints: 120, direction: 'increasing' as const, step: { initial: 0.05, min: 1e-6, max: 0.5 } },
};
let t0 = performance.now();
let large = analyze(largeRequest);
const largeFirstMs = performance.now() - t0;
t0 = performance.now();
large = analyze(largeRequest);
const largeMs = performance.now() - t0;
const largeFold = large.branch.events.find((e) => e.kind === 'fold');

// 5. Two coupled Brusselators: Hopf points at b = 5 and b = 5.6 (closed form in tests/engine/models.ts).
const hopfRequest = {
  model: coupledBrusselators(),
  task: { kind: 'continuation' as const, parameter: 'b', start: { x1: 2, y1: 0.5, x2: 2, y2: 0.5 }, bounds: { min: 0.5, max: 8 }, maxPoints: 20000, direction: 'increasing' as const, step: { initial: 0.001, min: 1e-6, max: 0.002 } },
};
let hopfPoints = 0;
let hopfEvents: number[] = [];
const hopfMs = timeIt(() => {
  const r = analyze(hopfRequest);
  hopfPoints = r.branch.points.length;
  hopfEvents = r.branch.events.filter((e) => e.kind === 'hopf').map((e) => e.parameter);
}, 5);

// 6. Robertson's problem, implicit method.
const robertsonRequest = {
  model: {
    variables: [{ name: 'y1', rhs: '-0.04*y1 + 1e4*y2*y3' }, { name: 'y2', rhs: '0.04*y1 - 1e4*y2*y3 - 3e7*y2^2' }, { name: 'y3', rhs: '3e7*y2^2' }],
  },
  task: { kind: 'simulate' as const, initial: { y1: 1 }, time: { end: 40, samples: 41 }, tolerance: { relative: 1e-6, absolute: 1e-12 }, method: 'implicit' as const },
};
let robertsonSteps = 0;
const robertsonMs = timeIt(() => {
  robertsonSteps = analyze(robertsonRequest).steps.accepted;
}, 5);

const rows = [
  ['compiled vs hand-written f (3 variables, 2e6 calls)', `${compiledMs.toFixed(1)} ms vs ${handMs.toFixed(1)} ms`, `ratio ${(compiledMs / handMs).toFixed(2)}×`, 'ratio ≤ 2×', compiledMs / handMs <= 2],
  ['continuation with stability (2 variables)', `${contPoints} points, ${contFolds} folds in ${contMs.toFixed(1)} ms`, `${Math.round((contPoints / contMs) * 1000).toLocaleString('en')} points/s`, '≥ 10,000 points/s', (contPoints / contMs) * 1000 >= 10_000],
  ['Bratu, 1,000 points (indexed, banded), through the fold', `${large.branch.points.length} points, fold at λ = ${largeFold?.parameter.toFixed(6) ?? 'none'}`, `${largeMs.toFixed(0)} ms (first call incl. compile ${largeFirstMs.toFixed(0)} ms)`, '< 5,000 ms incl. compile', largeFirstMs < 5000 && largeFold !== undefined],
  ['two coupled Brusselators (4 variables), Hopf points', `${hopfPoints} points, Hopf at b = ${hopfEvents.map((b) => b.toFixed(6)).join(', ')}`, `${Math.round((hopfPoints / hopfMs) * 1000).toLocaleString('en')} points/s`, '≥ 5,000 points/s, 2 Hopf', (hopfPoints / hopfMs) * 1000 >= 5000 && hopfEvents.length === 2],
  ["Robertson's problem to t = 40, implicit", `${robertsonSteps} steps`, `${robertsonMs.toFixed(1)} ms`, '< 100 ms', robertsonMs < 100],
  ['Bratu, 50 variables, through the fold', `${bratu.branch.points.length} points, fold at λ = ${bratu.branch.events[0]?.parameter.toFixed(6) ?? 'none'}`, `${bratuMs.toFixed(0)} ms (first call incl. compile ${bratuFirstMs.toFixed(0)} ms)`, '< 500 ms for 300 points', bratuMs < 500 && bratu.branch.points.length === 300 && bratu.branch.events.length === 1],
] as const;

const widths = [0, 1, 2, 3].map((c) => Math.max(...rows.map((r) => String(r[c]).length), 8));
const line = (cells: string[]) => cells.map((c, i) => c.padEnd(widths[i])).join('  ');
console.log(`Bifolio engine benchmarks — Node ${process.version}, ${new Date().toISOString()}`);
console.log(line(['benchmark', 'measured', 'figure', 'goal']) + '  met');
for (const r of rows) console.log(line([r[0], r[1], r[2], r[3]]) + `  ${r[4] ? 'yes' : 'NO'}`);
if (!Number.isFinite(sink)) console.log('(checksum not finite)');
