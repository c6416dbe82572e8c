import { diffArrays } from 'diff';
import { CELL_KIND_LABELS, type CellKind } from '../cells/kinds.ts';
import { nodeAttrSchemas, type DocNode, type DocumentJson } from '../editor/document.ts';
import { MATHS_SOURCE } from '../editor/inline-maths.ts';

/**
 * A word-level comparison of two entry documents, block by block.
 *
 * 1. Each document is flattened into readable blocks (headings, paragraphs, list items, quotes,
 *    code, maths, images, rules and cell placeholders), in reading order.
 * 2. The two block lists are aligned by their text (longest common subsequence, `diffArrays`).
 * 3. Within a run of removed blocks followed by added blocks, blocks of the same type are paired
 *    and compared word by word when they share enough words; the rest stay whole insertions or
 *    deletions. Words are tokenised so that a number ("0.2471", "-1e-3") and an inline formula
 *    ("$k e^{x}$") are one token each: a changed value or formula is shown whole (the old one
 *    removed, the new one added), never as a changed run of digits or LaTeX. A changed displayed
 *    equation is likewise the old equation removed and the new one added.
 *
 * Cells take part as placeholders ("Model cell “Stirred tank”"); their inputs and results are
 * compared by `cell-input-diff.ts` and `result-diff.ts`.
 */

export const TEXT_BLOCK_TYPES = ['heading', 'paragraph', 'list-item', 'quote', 'code', 'maths', 'image', 'rule', 'cell'] as const;
export type TextBlockType = (typeof TEXT_BLOCK_TYPES)[number];

export interface TextBlock {
  type: TextBlockType;
  /** The block's readable text (inline maths as $…$). */
  text: string;
  /** Heading level, list marker or quote depth where it applies (display). */
  prefix: string;
  /** Set for cell placeholders. */
  cellId?: string;
  cellKind?: CellKind;
}

export type DiffPartKind = 'same' | 'added' | 'removed';
export interface DiffPart {
  kind: DiffPartKind;
  text: string;
}

export type BlockStatus = 'same' | 'added' | 'removed' | 'changed';
export interface BlockDiff {
  status: BlockStatus;
  type: TextBlockType;
  prefix: string;
  parts: DiffPart[];
  /** Index among the newer document's blocks (comments anchor here); absent for removed blocks. */
  newIndex?: number;
  /** Index among the older document's blocks; absent for added blocks. */
  oldIndex?: number;
  cellId?: string;
}

/** Pair a removed and an added block for a word diff only when this share of words is kept. */
export const WORD_DIFF_MIN_SHARED = 0.3;

function inlineText(node: DocNode): string {
  if (node.type === 'text') return node.text ?? '';
  if (node.type === 'hardBreak') return '\n';
  if (node.type === 'inlineMath') return `$${String(node.attrs?.latex ?? '')}$`;
  return (node.content ?? []).map(inlineText).join('');
}

function cellPlaceholder(node: DocNode): TextBlock {
  const parsed = nodeAttrSchemas.cell.safeParse(node.attrs ?? {});
  if (!parsed.success) return { type: 'cell', text: 'Cell', prefix: '' };
  const { id, kind, input } = parsed.data;
  const name = typeof input.name === 'string' && input.name.trim() ? ` “${input.name.trim()}”` : '';
  return { type: 'cell', text: `${CELL_KIND_LABELS[kind]} cell${name}`, prefix: '', cellId: id, cellKind: kind };
}

/** The document as readable blocks, in reading order. */
export function documentBlocks(doc: DocumentJson): TextBlock[] {
  const out: TextBlock[] = [];
  const visit = (node: DocNode, quote: number, marker: string | null): void => {
    const q = '> '.repeat(quote);
    switch (node.type) {
      case 'paragraph':
        out.push(marker !== null ? { type: 'list-item', text: inlineText(node), prefix: q + marker } : { type: quote ? 'quote' : 'paragraph', text: inlineText(node), prefix: q });
        return;
      case 'heading':
        out.push({ type: 'heading', text: inlineText(node), prefix: q + '#'.repeat(Number(node.attrs?.level ?? 1)) });
        return;
      case 'codeBlock':
        out.push({ type: 'code', text: inlineText(node), prefix: q });
        return;
      case 'displayMath':
        out.push({ type: 'maths', text: String(node.attrs?.latex ?? ''), prefix: q });
        return;
      case 'image':
        out.push({ type: 'image', text: String(node.attrs?.alt ?? node.attrs?.title ?? node.attrs?.src ?? ''), prefix: q });
        return;
      case 'horizontalRule':
        out.push({ type: 'rule', text: '', prefix: q });
        return;
      case 'cell':
        out.push({ ...cellPlaceholder(node), prefix: q });
        return;
      case 'blockquote':
        (node.content ?? []).forEach((c) => visit(c, quote + 1, null));
        return;
      case 'bulletList':
      case 'orderedList': {
        const start = Number(node.attrs?.start ?? 1);
        (node.content ?? []).forEach((item, i) => {
          const m = node.type === 'bulletList' ? '•' : `${start + i}.`;
          (item.content ?? []).forEach((c, j) => visit(c, quote, j === 0 ? m : ''));
        });
        return;
      }
      default:
        (node.content ?? []).forEach((c) => visit(c, quote, marker));
    }
  };
  (doc.content ?? []).forEach((n) => visit(n, 0, null));
  // An empty trailing paragraph (the editor keeps one) is not content.
  while (out.length > 0 && out[out.length - 1].type === 'paragraph' && out[out.length - 1].text.trim() === '') out.pop();
  return out;
}

/** Identity of a block for alignment: cells by id (their text changes with their name), others by type and text. */
function blockKey(b: TextBlock): string {
  return b.cellId ? `cell:${b.cellId}` : `${b.type}:${b.prefix}:${b.text}`;
}

function words(text: string): string[] {
  return text.toLowerCase().match(/[\p{L}\p{N}_.]+/gu) ?? [];
}

/** Share of words two texts have in common (0 … 1, by multiset overlap over the longer text). */
export function sharedWordShare(a: string, b: string): number {
  const wa = words(a);
  const wb = words(b);
  if (wa.length === 0 && wb.length === 0) return 1;
  const counts = new Map<string, number>();
  for (const w of wa) counts.set(w, (counts.get(w) ?? 0) + 1);
  let shared = 0;
  for (const w of wb) {
    const c = counts.get(w) ?? 0;
    if (c > 0) {
      shared += 1;
      counts.set(w, c - 1);
    }
  }
  return shared / Math.max(wa.length, wb.length);
}

const TOKEN = new RegExp(String.raw`${MATHS_SOURCE}|\s+|[-+]?\d+(?:\.\d+)?(?:[eE][-+]?\d+)?|[\p{L}\p{N}_]+|[^\s]`, 'gu');

/** Word-level parts: kept, removed and added runs of words, numbers, spaces and marks. */
export function wordParts(oldText: string, newText: string): DiffPart[] {
  const changes = diffArrays(oldText.match(TOKEN) ?? [], newText.match(TOKEN) ?? []);
  const parts: DiffPart[] = [];
  for (const c of changes) {
    const kind: DiffPartKind = c.added ? 'added' : c.removed ? 'removed' : 'same';
    const text = c.value.join('');
    const last = parts[parts.length - 1];
    if (last && last.kind === kind) last.text += text;
    else parts.push({ kind, text });
  }
  return parts;
}

/** The parts of a changed block: words for text, the whole old and new equation for displayed maths. */
function changedParts(type: TextBlockType, oldText: string, newText: string): DiffPart[] {
  if (oldText === newText) return [{ kind: 'same', text: newText }];
  if (type === 'maths') return [{ kind: 'removed', text: oldText }, { kind: 'added', text: newText }].filter((p) => p.text !== '') as DiffPart[];
  return wordParts(oldText, newText);
}

/** Compare two documents block by block, with word-level changes inside changed blocks. */
export function diffDocuments(older: DocumentJson, newer: DocumentJson): BlockDiff[] {
  const a = documentBlocks(older);
  const b = documentBlocks(newer);
  const changes = diffArrays(a.map(blockKey), b.map(blockKey));
  const out: BlockDiff[] = [];
  let i = 0; // index into a
  let j = 0; // index into b
  const whole = (block: TextBlock, status: 'same' | 'added' | 'removed', index: number, oldIndex?: number): BlockDiff => ({
    status,
    type: block.type,
    prefix: block.prefix,
    parts: [{ kind: status, text: block.text }],
    newIndex: status === 'removed' ? undefined : index,
    oldIndex: status === 'removed' ? index : oldIndex,
    cellId: block.cellId,
  });
  for (let k = 0; k < changes.length; k++) {
    const c = changes[k];
    if (!c.added && !c.removed) {
      for (let n = 0; n < c.count; n++) {
        const [ob, nb] = [a[i + n], b[j + n]];
        // A cell keeps its key when renamed: its placeholder text still changed.
        if (ob.text !== nb.text) out.push({ status: 'changed', type: nb.type, prefix: nb.prefix, parts: changedParts(nb.type, ob.text, nb.text), newIndex: j + n, oldIndex: i + n, cellId: nb.cellId });
        else out.push(whole(nb, 'same', j + n, i + n));
      }
      i += c.count;
      j += c.count;
      continue;
    }
    // Gather one run of removals and additions (in either order) and pair them up.
    let removed: number[] = [];
    let added: number[] = [];
    while (k < changes.length && (changes[k].added || changes[k].removed)) {
      const run = changes[k];
      const idx = Array.from({ length: run.count }, (_, n) => n);
      if (run.removed) {
        removed = removed.concat(idx.map((n) => i + n));
        i += run.count;
      } else {
        added = added.concat(idx.map((n) => j + n));
        j += run.count;
      }
      k += 1;
    }
    k -= 1;
    out.push(...pairRun(a, b, removed, added, whole));
  }
  return out;
}

function pairRun(
  a: TextBlock[],
  b: TextBlock[],
  removed: number[],
  added: number[],
  whole: (block: TextBlock, status: 'same' | 'added' | 'removed', index: number, oldIndex?: number) => BlockDiff,
): BlockDiff[] {
  const out: BlockDiff[] = [];
  let r = 0;
  for (const ai of added) {
    const nb = b[ai];
    // The next unpaired removed block of the same kind that shares enough words (or is the same cell).
    let match = -1;
    for (let s = r; s < removed.length; s++) {
      const ob = a[removed[s]];
      const sameCell = nb.cellId !== undefined && ob.cellId === nb.cellId;
      if (sameCell || (!nb.cellId && !ob.cellId && ob.type === nb.type && sharedWordShare(ob.text, nb.text) >= WORD_DIFF_MIN_SHARED)) {
        match = s;
        break;
      }
    }
    if (match === -1) {
      out.push(whole(nb, 'added', ai));
      continue;
    }
    for (; r < match; r++) out.push(whole(a[removed[r]], 'removed', removed[r]));
    const ob = a[removed[match]];
    r = match + 1;
    out.push({
      status: 'changed',
      type: nb.type,
      prefix: nb.prefix,
      parts: changedParts(nb.type, ob.text, nb.text),
      newIndex: ai,
      oldIndex: removed[match],
      cellId: nb.cellId,
    });
  }
  for (; r < removed.length; r++) out.push(whole(a[removed[r]], 'removed', removed[r]));
  return out;
}

export type CollapsedItem = { kind: 'block'; block: BlockDiff } | { kind: 'unchanged'; blocks: BlockDiff[] };

/**
 * Fold runs of unchanged blocks, keeping `context` unchanged blocks beside each change visible.
 * A run is folded only when it hides at least two blocks.
 */
export function collapseUnchanged(blocks: readonly BlockDiff[], context = 1): CollapsedItem[] {
  const out: CollapsedItem[] = [];
  let n = 0;
  while (n < blocks.length) {
    if (blocks[n].status !== 'same') {
      out.push({ kind: 'block', block: blocks[n] });
      n += 1;
      continue;
    }
    let end = n;
    while (end < blocks.length && blocks[end].status === 'same') end += 1;
    const run = blocks.slice(n, end);
    const keepBefore = n === 0 ? 0 : context;
    const keepAfter = end === blocks.length ? 0 : context;
    if (run.length - keepBefore - keepAfter >= 2) {
      run.slice(0, keepBefore).forEach((block) => out.push({ kind: 'block', block }));
      out.push({ kind: 'unchanged', blocks: run.slice(keepBefore, run.length - keepAfter) });
      run.slice(run.length - keepAfter).forEach((block) => out.push({ kind: 'block', block }));
    } else {
      run.forEach((block) => out.push({ kind: 'block', block }));
    }
    n = end;
  }
  return out;
}

/** "4 unchanged paragraphs", "1 unchanged block", "3 unchanged blocks" (mixed types). */
export function describeUnchanged(blocks: readonly BlockDiff[]): string {
  const types = new Set(blocks.map((b) => b.type));
  const noun: Record<TextBlockType, [string, string]> = {
    heading: ['heading', 'headings'],
    paragraph: ['paragraph', 'paragraphs'],
    'list-item': ['list item', 'list items'],
    quote: ['quoted paragraph', 'quoted paragraphs'],
    code: ['code block', 'code blocks'],
    maths: ['formula', 'formulas'],
    image: ['image', 'images'],
    rule: ['divider', 'dividers'],
    cell: ['cell', 'cells'],
  };
  const [one, many] = types.size === 1 ? noun[blocks[0].type] : ['block', 'blocks'];
  return `${blocks.length} unchanged ${blocks.length === 1 ? one : many}`;
}
