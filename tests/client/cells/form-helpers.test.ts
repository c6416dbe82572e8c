import { describe, expect, it } from 'vitest';
import { symbolTex } from '@/features/cells/components/expression-tex.ts';
import { problemAt, unplacedProblems } from '@/features/cells/components/field-problems.ts';
import { readNumber } from '@/features/cells/components/number-input.tsx';

describe('readNumber', () => {
  it.each([
    ['0.3', 0.3],
    ['-2', -2],
    ['1e-3', 0.001],
    ['.5', 0.5],
    ['  7 ', 7],
  ])('reads %j as the number %d', (text, n) => {
    expect(readNumber(text)).toBe(n);
  });
  it.each(['', '1e-', 'abc', '1,5', '--1', 'Infinity'])(
    'keeps %j as text (the form then says "Enter a number")',
    (text) => {
      expect(readNumber(text)).toBe(text);
    },
  );
});

describe('symbolTex', () => {
  it.each([
    ['x', 'x'],
    ['mu', '\\mu'],
    ['T_a', 'T_{a}'],
    ['x1', 'x_{1}'],
    ['Da', '\\mathrm{Da}'],
    ['k_in', 'k_{\\mathrm{in}}'],
    ['sigma_0', '\\sigma_{0}'],
  ])('sets the name %s as %s (LaTeX conventions, common practice)', (name, tex) => {
    expect(symbolTex(name)).toBe(tex);
  });
});

describe('problemAt', () => {
  const problems = [
    { path: 'task.bounds', message: 'bounds.min must be below bounds.max' },
    { path: 'variables[0].rhs', message: 'Enter the right-hand side' },
    { path: 'view.other', message: 'x' },
  ];
  it('finds the exact field, or the first problem inside it', () => {
    expect(problemAt(problems, 'variables[0].rhs')).toBe('Enter the right-hand side');
    expect(problemAt(problems, 'variables')).toBe('Enter the right-hand side');
    expect(problemAt(problems, 'task.bounds.min')).toBeUndefined();
  });
  it('lists what no field shows', () => {
    expect(unplacedProblems(problems, ['task', 'variables'])).toEqual([{ path: 'view.other', message: 'x' }]);
  });
});
