import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { analyze, EngineRequestError } from '@server/engine/index.ts';
import { continuationResultSchema, equilibriaResultSchema, foldCurveResultSchema, simulateResultSchema } from '@shared/engine/contract.ts';

const SCHEMAS = {
  equilibria: equilibriaResultSchema,
  continuation: continuationResultSchema,
  'fold-curve': foldCurveResultSchema,
  simulate: simulateResultSchema,
} as const;

// Random two-variable models, including singular and overflowing ones (1/x, log, sqrt, exp).
const leaf = fc.oneof(fc.constantFrom('x', 'y', 'mu', 'k'), fc.integer({ min: -3, max: 3 }).map(String));
const expr = fc.letrec<{ e: string }>((tie) => ({
  e: fc.oneof(
    { depthSize: 'small' },
    leaf,
    fc.tuple(tie('e'), fc.constantFrom('+', '-', '*', '/', '^'), tie('e')).map(([a, o, b]) => `(${a} ${o} ${b})`),
    fc.tuple(fc.constantFrom('exp', 'log', 'sqrt', 'sin', 'tanh', 'abs'), tie('e')).map(([f, a]) => `${f}(${a})`),
  ),
})).e;
const task = fc.oneof(
  fc.record({ kind: fc.constant('equilibria' as const), starts: fc.integer({ min: 1, max: 8 }) }),
  fc.record({ kind: fc.constant('continuation' as const), parameter: fc.constant('mu'), start: fc.record({ x: fc.double({ min: -2, max: 2, noNaN: true }) }), bounds: fc.constant({ min: -3, max: 3 }), maxPoints: fc.integer({ min: 2, max: 40 }) }),
  fc.record({ kind: fc.constant('fold-curve' as const), parameters: fc.constant(['mu', 'k'] as [string, string]), start: fc.record({ parameters: fc.constant({}), state: fc.record({ x: fc.double({ min: -2, max: 2, noNaN: true }) }) }), bounds: fc.constant({ mu: [-3, 3] as [number, number], k: [-3, 3] as [number, number] }), maxPoints: fc.integer({ min: 2, max: 30 }) }),
  fc.record({ kind: fc.constant('simulate' as const), initial: fc.record({ x: fc.double({ min: -2, max: 2, noNaN: true }), y: fc.double({ min: -2, max: 2, noNaN: true }) }), time: fc.record({ end: fc.double({ min: 0.1, max: 5, noNaN: true }), samples: fc.integer({ min: 2, max: 30 }) }) }),
);

function nonFinite(value: unknown, path = ''): string[] {
  if (typeof value === 'number') return Number.isFinite(value) ? [] : [path];
  if (Array.isArray(value)) return value.flatMap((v, i) => nonFinite(v, `${path}[${i}]`));
  if (value && typeof value === 'object') return Object.entries(value).flatMap(([k, v]) => nonFinite(v, `${path}.${k}`));
  return [];
}

describe('analyze on arbitrary models and tasks (property)', () => {
  it('returns a result in the contract or throws a request error, nothing else', () => {
    fc.assert(
      fc.property(expr, expr, task, (f, g, t) => {
        const request = {
          model: { variables: [{ name: 'x', rhs: f }, { name: 'y', rhs: g }], parameters: [{ name: 'mu', value: 0.5 }, { name: 'k', value: 1 }] },
          task: t,
          timeLimitMs: 300,
        };
        let result: unknown;
        try {
          result = analyze(request);
        } catch (error) {
          expect(error).toBeInstanceOf(EngineRequestError);
          return;
        }
        const parsed = SCHEMAS[t.kind].safeParse(result);
        expect(parsed.error?.issues.slice(0, 3) ?? []).toEqual([]);
        // No NaN or Infinity anywhere (they would not survive JSON).
        expect(nonFinite(result)).toEqual([]);
      }),
      { numRuns: Number(process.env.ENGINE_PROPERTY_RUNS ?? 300) },
    );
  }, 120_000);
});
