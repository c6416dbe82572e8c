import { randomUUID } from 'node:crypto';
import type { CellKind } from '@shared/cells/kinds.ts';
import type { DocNode, DocumentJson } from '@shared/editor/document.ts';

/**
 * Small builders for entry bodies in the editor's JSON form, so the scenario modules read like
 * the entries they write. Inline content is a list of strings (plain text), `math(…)` pieces and
 * `bold(…)` / `italic(…)` runs.
 */

export type Inline = string | DocNode;

const inlineNodes = (parts: Inline[]): DocNode[] =>
  parts.filter((p) => p !== '').map((p) => (typeof p === 'string' ? { type: 'text', text: p } : p));

export const math = (latex: string): DocNode => ({ type: 'inlineMath', attrs: { latex } });
export const bold = (text: string): DocNode => ({ type: 'text', text, marks: [{ type: 'bold' }] });
export const italic = (text: string): DocNode => ({ type: 'text', text, marks: [{ type: 'italic' }] });

export const heading = (level: 1 | 2 | 3, text: string): DocNode => ({
  type: 'heading',
  attrs: { level },
  content: inlineNodes([text]),
});
export const paragraph = (...parts: Inline[]): DocNode => ({
  type: 'paragraph',
  content: inlineNodes(parts),
});
export const displayMath = (latex: string): DocNode => ({ type: 'displayMath', attrs: { latex } });

const list = (type: 'bulletList' | 'orderedList', items: Inline[][]): DocNode => ({
  type,
  ...(type === 'orderedList' ? { attrs: { start: 1 } } : {}),
  content: items.map((item) => ({ type: 'listItem', content: [paragraph(...item)] })),
});
export const bullets = (...items: Inline[][]): DocNode => list('bulletList', items);
export const steps = (...items: Inline[][]): DocNode => list('orderedList', items);

/** A computation cell node. */
export const cellNode = (id: string, kind: CellKind, input: Record<string, unknown>): DocNode => ({
  type: 'cell',
  attrs: { id, kind, input },
});

export const doc = (...blocks: DocNode[]): DocumentJson => ({ type: 'doc', content: blocks });

/** A fresh cell id (cells keep their id across the revisions of an entry). */
export const newCellId = (): string => randomUUID();

/** A number for prose: `digits` significant digits, no trailing zeros ("0.0527", "9.5"). */
export function num(value: number, digits = 3): string {
  if (value === 0) return '0';
  return String(Number(value.toPrecision(digits)));
}

/** The calendar date `daysAgo` days before `today`, as YYYY-MM-DD (UTC). */
export function dayBefore(today: Date, daysAgo: number): string {
  const d = new Date(Date.UTC(today.getUTCFullYear(), today.getUTCMonth(), today.getUTCDate() - daysAgo));
  return d.toISOString().slice(0, 10);
}
