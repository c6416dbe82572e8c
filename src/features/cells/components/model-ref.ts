import type { DocumentCell } from '@shared/editor/document.ts';

export interface ModelSummary {
  id: string;
  name: string;
  variables: string[];
  parameters: { name: string; value: number | undefined }[];
}

const list = (v: unknown): Record<string, unknown>[] =>
  Array.isArray(v) ? (v as Record<string, unknown>[]) : [];

/** What analysis-cell forms need to know of a model cell, read leniently (its input may be half-typed). */
export function summarizeModel(cell: DocumentCell): ModelSummary {
  const name =
    typeof cell.input.name === 'string' && cell.input.name.trim() ? cell.input.name.trim() : 'Untitled model';
  return {
    id: cell.id,
    name,
    variables: list(cell.input.variables)
      .map((v) => String(v.name ?? ''))
      .filter(Boolean),
    parameters: list(cell.input.parameters)
      .filter((p) => typeof p.name === 'string' && p.name)
      .map((p) => ({ name: String(p.name), value: typeof p.value === 'number' ? p.value : undefined })),
  };
}

export function modelSummaries(cells: readonly DocumentCell[]): ModelSummary[] {
  return cells.filter((c) => c.kind === 'model').map(summarizeModel);
}
