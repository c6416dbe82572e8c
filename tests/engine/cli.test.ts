import { spawnSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { continuationResultSchema, engineErrorResponseSchema } from '@shared/engine/contract.ts';

const dir = mkdtempSync(join(tmpdir(), 'bifolio-cli-'));
const run = (args: string[], input?: string) => spawnSync('npm', ['run', '--silent', 'analyze', '--', ...args], { input, encoding: 'utf8', cwd: process.cwd() });

describe('npm run analyze', () => {
  it('prints the result of a file and exits 0', () => {
    const file = join(dir, 'fold.json');
    writeFileSync(file, JSON.stringify({ model: { variables: [{ name: 'x', rhs: 'mu - x^2' }], parameters: [{ name: 'mu', value: 1 }] }, task: { kind: 'continuation', parameter: 'mu', start: { x: 1 }, bounds: { min: -1, max: 2 } } }));
    const r = run([file]);
    expect(r.status).toBe(0);
    const result = continuationResultSchema.parse(JSON.parse(r.stdout));
    // ẋ = μ − x²: fold at μ = 0 (Strogatz §3.1).
    expect(result.branch.events[0].parameter).toBeCloseTo(0, 12);
  }, 30_000);

  it('reads standard input and reports a bad request with exit code 2', () => {
    const r = run(['-'], JSON.stringify({ model: { variables: [{ name: 'x', rhs: 'x + * 2' }] }, task: { kind: 'equilibria' } }));
    expect(r.status).toBe(2);
    const body = engineErrorResponseSchema.parse(JSON.parse(r.stdout));
    expect(body.error).toMatchObject({ code: 'expression_syntax', path: 'model.variables[0].rhs', position: 4 });
  }, 30_000);

  it('reports malformed JSON with exit code 2', () => {
    const r = run(['-'], '{ "model": ');
    expect(r.status).toBe(2);
    expect(JSON.parse(r.stdout).error.code).toBe('malformed_json');
  }, 30_000);

  it('exits 0 with a stop reason on a numerical failure', () => {
    const r = run(['-'], JSON.stringify({ model: { variables: [{ name: 'x', rhs: 'x^2 + 1 + mu' }], parameters: [{ name: 'mu', value: 0 }] }, task: { kind: 'continuation', parameter: 'mu', bounds: { min: -0.5, max: 1 } } }));
    expect(r.status).toBe(0);
    expect(JSON.parse(r.stdout).branch.stopReason).toBe('start-not-converged');
  }, 30_000);
});
