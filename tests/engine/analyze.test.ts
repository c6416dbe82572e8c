import { describe, expect, it, test } from 'vitest';
import { analyze, EngineRequestError, ENGINE_VERSION } from '@server/engine/index.ts';
import { ENGINE_ERROR_CODES, engineErrorResponseSchema } from '@shared/engine/contract.ts';

const model = { variables: [{ name: 'x', rhs: 'mu - x^2' }], parameters: [{ name: 'mu', value: 0.1 }] };

function requestError(request: unknown): EngineRequestError {
  try {
    analyze(request);
  } catch (error) {
    if (error instanceof EngineRequestError) return error;
    throw error;
  }
  throw new Error('expected a request error');
}

describe('analyze: bad requests', () => {
  test.each([
    ['not an object', 42, ENGINE_ERROR_CODES.invalidRequest, undefined],
    ['unknown task kind', { model, task: { kind: 'optimise' } }, ENGINE_ERROR_CODES.invalidRequest, 'task.kind'],
    ['infinite parameter value', { model: { ...model, parameters: [{ name: 'mu', value: Infinity }] }, task: { kind: 'equilibria' } }, ENGINE_ERROR_CODES.invalidRequest, 'model.parameters[0].value'],
    ['reversed bounds', { model, task: { kind: 'continuation', parameter: 'mu', bounds: { min: 1, max: -1 } } }, ENGINE_ERROR_CODES.invalidRequest, 'task.bounds'],
    ['bad expression', { model: { variables: [{ name: 'x', rhs: 'mu - x^2' }, { name: 'y', rhs: 'x +* 1' }], parameters: model.parameters }, task: { kind: 'equilibria' } }, ENGINE_ERROR_CODES.syntax, 'model.variables[1].rhs'],
    ['unknown continuation parameter', { model, task: { kind: 'continuation', parameter: 'nu', bounds: { min: -1, max: 1 } } }, ENGINE_ERROR_CODES.unknownReference, 'task.parameter'],
    ['unknown start variable', { model, task: { kind: 'continuation', parameter: 'mu', start: { q: 1 }, bounds: { min: -1, max: 1 } } }, ENGINE_ERROR_CODES.unknownReference, 'task.start.q'],
    ['parameter value outside bounds', { model, task: { kind: 'continuation', parameter: 'mu', bounds: { min: 1, max: 2 } } }, ENGINE_ERROR_CODES.invalidRequest, 'task.bounds'],
    ['unknown box variable', { model, task: { kind: 'equilibria', box: { z: [0, 1] } } }, ENGINE_ERROR_CODES.unknownReference, 'task.box.z'],
    ['too many starts', { model, task: { kind: 'equilibria', starts: 1e6 } }, ENGINE_ERROR_CODES.invalidRequest, 'task.starts'],
    ['same parameter twice', { model, task: { kind: 'fold-curve', parameters: ['mu', 'mu'], start: { parameters: {} }, bounds: {} } }, ENGINE_ERROR_CODES.invalidRequest, 'task.parameters'],
    ['missing fold-curve bounds', { model: { ...model, parameters: [...model.parameters, { name: 'k', value: 0 }] }, task: { kind: 'fold-curve', parameters: ['mu', 'k'], start: { parameters: {} }, bounds: { mu: [-1, 1] } } }, ENGINE_ERROR_CODES.invalidRequest, 'task.bounds.k'],
    ['simulation ending before it starts', { model, task: { kind: 'simulate', time: { end: -1 } } }, ENGINE_ERROR_CODES.invalidRequest, 'task.time'],
    ['too many variables', { model: { variables: Array.from({ length: 500 }, (_, i) => ({ name: `x${i}`, rhs: '0' })) }, task: { kind: 'equilibria' } }, ENGINE_ERROR_CODES.invalidRequest, 'model.variables'],
  ])('rejects %s with a code and the field path', (_label, request, code, path) => {
    const error = requestError(request);
    expect(error.code).toBe(code);
    expect(error.path).toBe(path);
    expect(error.message.length).toBeGreaterThan(5);
    expect(engineErrorResponseSchema.safeParse(error.toJSON()).success).toBe(true);
  });

  it('gives the character position of an expression error', () => {
    const error = requestError({ model: { variables: [{ name: 'x', rhs: 'mu - sqr(x)' }], parameters: model.parameters }, task: { kind: 'equilibria' } });
    expect(error.toJSON()).toEqual({ error: { code: ENGINE_ERROR_CODES.unknownFunction, message: expect.stringContaining('sqr'), path: 'model.variables[0].rhs', position: 5 } });
  });
});

describe('analyze: results', () => {
  it('carries the engine version and elapsed time', () => {
    const r = analyze({ model, task: { kind: 'equilibria', box: { x: [-1, 1] } } });
    expect(r.engine.version).toBe(ENGINE_VERSION);
    expect(r.engine.elapsedMs).toBeGreaterThanOrEqual(0);
    expect(r.equilibria.map((e) => e.state.x)).toEqual([expect.closeTo(-Math.sqrt(0.1), 12), expect.closeTo(Math.sqrt(0.1), 12)]);
  });

  it('returns what it computed with "time-limit" when the budget is spent', () => {
    const r = analyze({ model, task: { kind: 'simulate', initial: { x: 0 }, time: { end: 1e7, samples: 100000 }, tolerance: { relative: 1e-12, absolute: 1e-14 } } }, { timeLimitMs: 30 });
    expect(r.stopReason).toBe('time-limit');
    expect(r.trajectory.t.length).toBeGreaterThan(0);
    expect(r.trajectory.t.length).toBeLessThan(100000);
  });
});
