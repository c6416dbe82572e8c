import type { FieldProblem } from '@shared/cells/inputs.ts';

/** The message for a field: exact path first, else the first problem under it (e.g. "task.bounds" for "task.bounds.min"). */
export function problemAt(problems: readonly FieldProblem[] | undefined, path: string): string | undefined {
  if (!problems) return undefined;
  const exact = problems.find((p) => p.path === path);
  if (exact) return exact.message;
  return problems.find((p) => p.path.startsWith(`${path}.`) || p.path.startsWith(`${path}[`))?.message;
}

/** Problems no field shows (so the card can list them). */
export function unplacedProblems(
  problems: readonly FieldProblem[] | undefined,
  placed: readonly string[],
): FieldProblem[] {
  return (problems ?? []).filter(
    (p) => !placed.some((f) => p.path === f || p.path.startsWith(`${f}.`) || p.path.startsWith(`${f}[`)),
  );
}
