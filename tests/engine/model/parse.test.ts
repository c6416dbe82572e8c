import fc from 'fast-check';
import { evaluate } from 'mathjs';
import { describe, expect, it, test } from 'vitest';
import { ENGINE_ERROR_CODES, type ModelInput } from '@shared/engine/contract.ts';
import { validateModel } from '@server/engine/index.ts';
import { compileModel } from '@server/engine/model/compile.ts';
import { parseModel } from '@server/engine/model/parse.ts';
import { modelSchema } from '@shared/engine/contract.ts';

const CODES = new Set<string>(Object.values(ENGINE_ERROR_CODES));
const oneVariable = (rhs: string): ModelInput => ({ variables: [{ name: 'x', rhs }], parameters: [{ name: 'mu', value: 1 }], definitions: [] });

describe('parseModel', () => {
  test.each([
    // [rhs, code, position]
    ['mu - x^2', null, null],
    ['x +* 2', ENGINE_ERROR_CODES.syntax, 3],
    ['a = 1', ENGINE_ERROR_CODES.forbiddenSyntax, 2],
    ['f(x) = x', ENGINE_ERROR_CODES.forbiddenSyntax, 5],
    ['[1, 2]', ENGINE_ERROR_CODES.forbiddenSyntax, 0],
    ['x + {a: 1}', ENGINE_ERROR_CODES.forbiddenSyntax, 4],
    ['"text"', ENGINE_ERROR_CODES.forbiddenSyntax, 0],
    ['x + 5 cm', ENGINE_ERROR_CODES.unknownName, 6],
    ['x + zz', ENGINE_ERROR_CODES.unknownName, 4],
    ['x*mu + foo(x)', ENGINE_ERROR_CODES.unknownFunction, 7],
    ['x mod 2', ENGINE_ERROR_CODES.forbiddenSyntax, 2],
    ['x < 1', ENGINE_ERROR_CODES.forbiddenSyntax, 2],
    ['x ? 1 : 2', ENGINE_ERROR_CODES.forbiddenSyntax, 2],
    ['x; mu', ENGINE_ERROR_CODES.forbiddenSyntax, 1],
    ['log(x, 2)', ENGINE_ERROR_CODES.forbiddenSyntax, 0],
    ['true', ENGINE_ERROR_CODES.forbiddenSyntax, 0],
    ['x + 1e999', ENGINE_ERROR_CODES.forbiddenSyntax, 4],
    ['sin', ENGINE_ERROR_CODES.unknownName, 0],
    ['x.y', ENGINE_ERROR_CODES.forbiddenSyntax, 1],
    ['x + x + q', ENGINE_ERROR_CODES.unknownName, 8],
  ])('checks %j', (rhs, code, position) => {
    const { errors } = parseModel(modelSchema.parse(oneVariable(rhs)));
    if (code === null) expect(errors).toEqual([]);
    else expect(errors).toEqual([expect.objectContaining({ code, path: 'model.variables[0].rhs', position })]);
  });

  it('names each field with a duplicated or reserved name', () => {
    const errors = validateModel({
      variables: [{ name: 'x', rhs: '1' }, { name: 'x', rhs: '2' }],
      parameters: [{ name: 'exp', value: 1 }],
      definitions: [],
    });
    expect(errors.map((e) => [e.code, e.path])).toEqual([
      [ENGINE_ERROR_CODES.duplicateName, 'model.variables[1].name'],
      [ENGINE_ERROR_CODES.duplicateName, 'model.parameters[0].name'],
    ]);
  });

  it('lets a definition use only earlier definitions', () => {
    const errors = validateModel({ variables: [{ name: 'x', rhs: 'g' }], definitions: [{ name: 'g', expression: 'h + 1' }, { name: 'h', expression: 'x' }] });
    expect(errors).toEqual([expect.objectContaining({ code: ENGINE_ERROR_CODES.unknownName, path: 'model.definitions[0].expression', position: 0 })]);
    expect(validateModel({ variables: [{ name: 'x', rhs: 'g' }], definitions: [{ name: 'h', expression: 'x' }, { name: 'g', expression: 'h + 1' }] })).toEqual([]);
  });

  it('reports shape problems with their path', () => {
    expect(validateModel({ variables: [{ name: '1x', rhs: 'x' }] })).toEqual([expect.objectContaining({ code: ENGINE_ERROR_CODES.invalidRequest, path: 'model.variables[0].name' })]);
    expect(validateModel({ variables: [] })[0].path).toBe('model.variables');
  });

  it('never throws on arbitrary text, only returns structured errors (property)', () => {
    const alphabet = fc.constantFrom(...'x mu ( ) + - * / ^ , . ; = [ ] { } " \' ? : < > ! % & | 1 2 e pi exp sin log pow abs 0x 1e5 \n'.split(' '));
    fc.assert(
      fc.property(fc.oneof(fc.string(), fc.array(alphabet, { maxLength: 20 }).map((a) => a.join(''))), (text) => {
        const result = parseModel(modelSchema.parse(oneVariable(text.length ? text : ' ')));
        for (const e of result.errors) {
          expect(CODES.has(e.code)).toBe(true);
          expect(e.path).toBe('model.variables[0].rhs');
          expect(Number.isInteger(e.position)).toBe(true);
          expect(e.position).toBeGreaterThanOrEqual(0);
          expect(e.position!).toBeLessThanOrEqual(Math.max(text.length, 1));
        }
        expect(result.errors.length > 0 || result.model !== undefined).toBe(true);
      }),
      { numRuns: 2000 },
    );
  });

  it('compiles random valid expressions to code that agrees with mathjs evaluation (property)', () => {
    // Reference: mathjs `evaluate` on the same text and scope (an independent interpreter).
    const leaf = fc.oneof(fc.constantFrom('x', 'mu', 'pi', 'e'), fc.double({ min: -5, max: 5, noNaN: true }).map((v) => `(${v.toPrecision(6)})`));
    const expr = fc.letrec<{ e: string }>((tie) => ({
      e: fc.oneof(
        { depthSize: 'small', withCrossShrink: true },
        leaf,
        fc.tuple(tie('e'), fc.constantFrom('+', '-', '*', '/'), tie('e')).map(([a, o, b]) => `(${a} ${o} ${b})`),
        fc.tuple(fc.constantFrom('sin', 'cos', 'atan', 'tanh', 'exp', 'abs'), tie('e')).map(([f, a]) => `${f}(${a})`),
        tie('e').map((a) => `-(${a})`),
        tie('e').map((a) => `(${a})^2`),
      ),
    })).e;
    fc.assert(
      fc.property(expr, fc.double({ min: -2, max: 2, noNaN: true }), (text, xv) => {
        const m = compileModel(modelSchema.parse(oneVariable(text)));
        const out = new Float64Array(1);
        m.rhs(Float64Array.of(xv), m.parameterValues(), out);
        const ref = evaluate(text, { x: xv, mu: 1 }) as number;
        if (!Number.isFinite(ref)) return;
        expect(Math.abs(out[0] - ref)).toBeLessThanOrEqual(1e-12 * (1 + Math.abs(ref)));
      }),
      { numRuns: 400 },
    );
  });
});
