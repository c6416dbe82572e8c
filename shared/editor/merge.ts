import { diffArrays } from 'diff';
import { canonicalJson } from '../cells/hash.ts';
import type { DocNode, DocumentJson } from './document.ts';

/** A change one side made to the base: base blocks [start, end) became `blocks`. */
interface Hunk {
  start: number;
  end: number;
  blocks: DocNode[];
}

function hunks(base: string[], side: string[], sideBlocks: DocNode[]): Hunk[] {
  const out: Hunk[] = [];
  let b = 0;
  let s = 0;
  let open: Hunk | null = null;
  for (const part of diffArrays(base, side)) {
    if (part.removed) {
      open ??= { start: b, end: b, blocks: [] };
      open.end += part.count;
      b += part.count;
    } else if (part.added) {
      open ??= { start: b, end: b, blocks: [] };
      open.blocks.push(...sideBlocks.slice(s, s + part.count));
      s += part.count;
    } else {
      if (open) out.push(open);
      open = null;
      b += part.count;
      s += part.count;
    }
  }
  if (open) out.push(open);
  return out;
}

const overlaps = (a: Hunk, b: Hunk) => a.start === b.start || (a.start < b.end && b.start < a.end);

function applyWithin(baseBlocks: DocNode[], start: number, end: number, list: Hunk[]): DocNode[] {
  const out: DocNode[] = [];
  let i = start;
  for (const h of list) {
    out.push(...baseBlocks.slice(i, h.start), ...h.blocks);
    i = h.end;
  }
  out.push(...baseBlocks.slice(i, end));
  return out;
}

export interface MergeResult {
  doc: DocumentJson;
  /** Places where both sides changed the same blocks differently; both versions are kept, theirs first. */
  conflicts: number;
}

/**
 * Three-way merge of two edits of one document, block by block (top-level blocks compared as
 * canonical JSON): a change made on one side only is taken; the same change on both sides is
 * taken once; different changes to the same blocks keep both versions (theirs, then mine) and
 * count as a conflict for the author to resolve. Used to rebase an author's unrecorded edit onto
 * a revision someone else recorded meanwhile.
 */
export function mergeDocuments(base: DocumentJson, mine: DocumentJson, theirs: DocumentJson): MergeResult {
  const bBlocks = base.content ?? [];
  const mBlocks = mine.content ?? [];
  const tBlocks = theirs.content ?? [];
  const key = (n: DocNode) => canonicalJson(n);
  const bKeys = bBlocks.map(key);
  const mineH = hunks(bKeys, mBlocks.map(key), mBlocks).map((h) => ({ ...h, side: 'mine' as const }));
  const theirsH = hunks(bKeys, tBlocks.map(key), tBlocks).map((h) => ({ ...h, side: 'theirs' as const }));
  const all = [...theirsH, ...mineH].sort((a, b) => a.start - b.start || a.end - b.end);

  const out: DocNode[] = [];
  let conflicts = 0;
  let cursor = 0;
  let k = 0;
  while (k < all.length) {
    const group = [all[k]];
    let gStart = all[k].start;
    let gEnd = all[k].end;
    k++;
    while (k < all.length && group.some((g) => overlaps(g, all[k]))) {
      gStart = Math.min(gStart, all[k].start);
      gEnd = Math.max(gEnd, all[k].end);
      group.push(all[k]);
      k++;
    }
    out.push(...bBlocks.slice(cursor, gStart));
    const fromMine = group.filter((g) => g.side === 'mine');
    const fromTheirs = group.filter((g) => g.side === 'theirs');
    const mineRegion = applyWithin(bBlocks, gStart, gEnd, fromMine);
    const theirRegion = applyWithin(bBlocks, gStart, gEnd, fromTheirs);
    if (fromMine.length === 0) out.push(...theirRegion);
    else if (fromTheirs.length === 0) out.push(...mineRegion);
    else if (canonicalJson(mineRegion) === canonicalJson(theirRegion)) out.push(...mineRegion);
    else {
      conflicts++;
      out.push(...theirRegion, ...mineRegion);
    }
    cursor = gEnd;
  }
  out.push(...bBlocks.slice(cursor));
  return { doc: { type: 'doc', content: out.length ? out : [{ type: 'paragraph' }] }, conflicts };
}

/** A field changed on one side wins; changed on both, mine wins (the author is looking at it). */
export function mergeValue<T>(base: T, mine: T, theirs: T): T {
  const b = canonicalJson(base);
  if (canonicalJson(mine) !== b) return mine;
  return theirs;
}
