import { CELL_KIND_LABELS, type CellKind } from '../cells/kinds.ts';
import { extractCells, type DocumentCell, type DocumentJson } from '../editor/document.ts';
import { displayName, formatTyped } from './format.ts';

/**
 * Field-by-field comparison of the cells of two documents.
 *
 * Cells are matched by id; a cell whose id changed (copied or re-created) is matched by kind and
 * name when exactly one unmatched cell has them. Model cells are compared by variable, parameter
 * and definition name; analysis cells by their task settings, each setting named in words.
 */

export type InputChangeKind = 'changed' | 'added' | 'removed';
export interface InputChange {
  kind: InputChangeKind;
  /** Dotted path of the field inside the cell input, e.g. "parameters.mu.value", "task.bounds.max". */
  field: string;
  /** What changed, as a sentence. */
  sentence: string;
  before?: unknown;
  after?: unknown;
}

export type CellMatchStatus = 'same' | 'changed' | 'added' | 'removed';
export interface CellPair {
  /** The newer cell's id (the older one's when the cell was removed). */
  cellId: string;
  /** The older cell's id when it differs (matched by kind and name). */
  olderCellId?: string;
  kind: CellKind;
  /** "Model “Stirred tank”", "Branch of equilibria". */
  title: string;
  status: CellMatchStatus;
  older?: DocumentCell;
  newer?: DocumentCell;
  changes: InputChange[];
}

function cellName(cell: DocumentCell): string {
  return typeof cell.input.name === 'string' ? cell.input.name.trim() : '';
}

export function cellTitle(cell: DocumentCell): string {
  const name = cellName(cell);
  return `${CELL_KIND_LABELS[cell.kind]}${name ? ` “${name}”` : ''}`;
}

/** Pair the cells of two documents (newer order first, then the removed ones). */
export function matchCells(older: DocumentJson, newer: DocumentJson): { older?: DocumentCell; newer?: DocumentCell }[] {
  const a = extractCells(older);
  const b = extractCells(newer);
  const byId = new Map(a.map((c) => [c.id, c]));
  const used = new Set<string>();
  const pairs: { older?: DocumentCell; newer?: DocumentCell }[] = [];
  const pending: DocumentCell[] = [];
  for (const c of b) {
    const o = byId.get(c.id);
    if (o && o.kind === c.kind) {
      used.add(o.id);
      pairs.push({ older: o, newer: c });
    } else {
      pending.push(c);
      pairs.push({ newer: c });
    }
  }
  for (const c of pending) {
    const key = `${c.kind}:${cellName(c)}`;
    const candidates = a.filter((o) => !used.has(o.id) && `${o.kind}:${cellName(o)}` === key);
    const candidatesNew = pending.filter((p) => `${p.kind}:${cellName(p)}` === key);
    if (candidates.length === 1 && candidatesNew.length === 1) {
      used.add(candidates[0].id);
      const pair = pairs.find((p) => p.newer === c)!;
      pair.older = candidates[0];
    }
  }
  for (const o of a) if (!used.has(o.id)) pairs.push({ older: o });
  return pairs;
}

type Named = { name?: unknown } & Record<string, unknown>;
const asList = (v: unknown): Named[] => (Array.isArray(v) ? v.filter((x): x is Named => !!x && typeof x === 'object') : []);
const show = (v: unknown): string =>
  typeof v === 'number' ? formatTyped(v) : typeof v === 'string' ? (v === '' ? '(empty)' : v) : v === undefined ? '(not set)' : JSON.stringify(v);

/** Compare lists of named things (variables, parameters, definitions) field by field. */
function diffNamedList(
  field: string,
  older: unknown,
  newer: unknown,
  describe: (name: string, key: string, before: unknown, after: unknown) => string,
  noun: string,
): InputChange[] {
  const out: InputChange[] = [];
  const a = asList(older);
  const b = asList(newer);
  const name = (x: Named, i: number) => (typeof x.name === 'string' && x.name ? x.name : `#${i + 1}`);
  const oldByName = new Map(a.map((x, i) => [name(x, i), x]));
  const newNames = new Set(b.map(name));
  b.forEach((x, i) => {
    const n = name(x, i);
    const o = oldByName.get(n);
    if (!o) {
      out.push({ kind: 'added', field: `${field}.${n}`, sentence: `New ${noun} ${displayName(n)}${describeNew(field, x)}`, after: x });
      return;
    }
    const keys = [...new Set([...Object.keys(o), ...Object.keys(x)])].filter((k) => k !== 'name');
    for (const k of keys) {
      if (JSON.stringify(o[k]) === JSON.stringify(x[k])) continue;
      out.push({ kind: 'changed', field: `${field}.${n}.${k}`, sentence: describe(n, k, o[k], x[k]), before: o[k], after: x[k] });
    }
  });
  a.forEach((x, i) => {
    const n = name(x, i);
    if (!newNames.has(n)) out.push({ kind: 'removed', field: `${field}.${n}`, sentence: `${capitalise(noun)} ${displayName(n)} removed`, before: x });
  });
  return out;
}

function describeNew(field: string, x: Named): string {
  if (field === 'variables' && typeof x.rhs === 'string') return `: ${displayName(String(x.name))}′ = ${x.rhs}`;
  if (field === 'parameters' && typeof x.value === 'number') return ` = ${formatTyped(x.value)}`;
  if (field === 'definitions' && typeof x.expression === 'string') return ` = ${x.expression}`;
  return '';
}

const capitalise = (s: string) => s.charAt(0).toUpperCase() + s.slice(1);

function modelChanges(a: Record<string, unknown>, b: Record<string, unknown>): InputChange[] {
  const out: InputChange[] = [];
  if (a.name !== b.name) out.push({ kind: 'changed', field: 'name', sentence: `Model renamed from “${show(a.name)}” to “${show(b.name)}”`, before: a.name, after: b.name });
  out.push(
    ...diffNamedList('variables', a.variables, b.variables, (n, k, before, after) => {
      const v = displayName(n);
      if (k === 'rhs') return `Equation for ${v}′ changed: ${v}′ = ${show(before)} → ${v}′ = ${show(after)}`;
      if (k === 'unit') return `Unit of ${v} changed: ${show(before)} → ${show(after)}`;
      if (k === 'note') return `Note on ${v} changed`;
      return `${capitalise(k)} of ${v} changed: ${show(before)} → ${show(after)}`;
    }, 'variable'),
    ...diffNamedList('parameters', a.parameters, b.parameters, (n, k, before, after) => {
      const p = displayName(n);
      if (k === 'value') return `Parameter ${p} ${show(before)} → ${show(after)}`;
      if (k === 'unit') return `Unit of ${p} changed: ${show(before)} → ${show(after)}`;
      if (k === 'note') return `Note on ${p} changed`;
      return `${capitalise(k)} of ${p} changed: ${show(before)} → ${show(after)}`;
    }, 'parameter'),
    ...diffNamedList('definitions', a.definitions, b.definitions, (n, k, before, after) =>
      k === 'expression' ? `Definition ${displayName(n)} changed: ${show(before)} → ${show(after)}` : `${capitalise(k)} of ${displayName(n)} changed: ${show(before)} → ${show(after)}`,
    'definition'),
  );
  return out;
}

/** Settings of analysis cells in words; `{name}` stands for the variable or parameter in the path. */
const SETTING_WORDS: Record<string, string> = {
  'task.parameter': 'continuation parameter',
  'task.parameters': 'the two parameters',
  'task.bounds.min': 'lower end of the parameter range',
  'task.bounds.max': 'upper end of the parameter range',
  'task.bounds.{name}': 'range of {name}',
  'task.start.{name}': 'starting guess for {name}',
  'task.start.parameters.{name}': 'starting value of {name}',
  'task.start.state.{name}': 'starting guess for {name}',
  'task.maxPoints': 'most points followed',
  'task.step.initial': 'first step size',
  'task.step.min': 'smallest step size',
  'task.step.max': 'largest step size',
  'task.direction': 'direction of continuation',
  'task.box.{name}': 'search interval for {name}',
  'task.starts': 'number of starting points',
  'task.initial.{name}': 'initial value of {name}',
  'task.time.start': 'start time',
  'task.time.end': 'end time',
  'task.time.samples': 'number of samples',
  'task.tolerance.relative': 'relative tolerance',
  'task.tolerance.absolute': 'absolute tolerance',
  'view.yVariable': 'variable on the vertical axis',
  'view.phaseX': 'horizontal axis of the phase plane',
  'view.phaseY': 'vertical axis of the phase plane',
  modelCellId: 'model the cell uses',
  timeLimitMs: 'time budget',
};

function settingWords(path: string): string {
  if (SETTING_WORDS[path]) return SETTING_WORDS[path];
  const cut = path.lastIndexOf('.');
  const parent = path.slice(0, cut);
  const name = path.slice(cut + 1);
  const template = SETTING_WORDS[`${parent}.{name}`];
  if (template) return template.replace('{name}', displayName(name));
  return path.replace(/^task\./, '');
}

/** Flatten an input into settings; an interval [lo, hi] or a parameter pair stays one setting. */
function leaves(value: unknown, path: string, out: Map<string, unknown>): void {
  const isLeafTuple = Array.isArray(value) && value.every((x) => typeof x !== 'object' || x === null);
  if (value && typeof value === 'object' && !isLeafTuple) {
    for (const [k, v] of Object.entries(value as Record<string, unknown>)) leaves(v, path ? `${path}.${k}` : k, out);
    return;
  }
  out.set(path, value);
}

const showSetting = (v: unknown): string =>
  Array.isArray(v) ? `[${v.map((x) => (typeof x === 'number' ? formatTyped(x) : String(x))).join(', ')}]` : typeof v === 'string' ? displayName(v) : show(v);

function analysisChanges(a: Record<string, unknown>, b: Record<string, unknown>): InputChange[] {
  const la = new Map<string, unknown>();
  const lb = new Map<string, unknown>();
  leaves(a, '', la);
  leaves(b, '', lb);
  const out: InputChange[] = [];
  for (const path of [...new Set([...la.keys(), ...lb.keys()])]) {
    const before = la.get(path);
    const after = lb.get(path);
    if (JSON.stringify(before) === JSON.stringify(after)) continue;
    const words = settingWords(path);
    const kind: InputChangeKind = before === undefined ? 'added' : after === undefined ? 'removed' : 'changed';
    const sentence =
      path === 'modelCellId'
        ? 'The cell now uses a different model cell'
        : kind === 'added'
          ? `${capitalise(words)} set to ${showSetting(after)}`
          : kind === 'removed'
            ? `${capitalise(words)} no longer set (was ${showSetting(before)})`
            : `${capitalise(words)} changed: ${showSetting(before)} → ${showSetting(after)}`;
    out.push({ kind, field: path, sentence, before, after });
  }
  return out;
}

/** Changes between two versions of one cell's input (same kind). */
export function diffCellInputs(kind: CellKind, older: Record<string, unknown>, newer: Record<string, unknown>): InputChange[] {
  return kind === 'model' ? modelChanges(older, newer) : analysisChanges(older, newer);
}

/** Every cell of both documents with its input changes. */
export function diffCells(older: DocumentJson, newer: DocumentJson): CellPair[] {
  return matchCells(older, newer).map(({ older: o, newer: n }) => {
    const cell = (n ?? o)!;
    if (!o) return { cellId: cell.id, kind: cell.kind, title: cellTitle(cell), status: 'added', newer: n, changes: [] };
    if (!n) return { cellId: cell.id, kind: cell.kind, title: cellTitle(cell), status: 'removed', older: o, changes: [] };
    const changes = diffCellInputs(cell.kind, o.input, n.input);
    return {
      cellId: n.id,
      olderCellId: o.id !== n.id ? o.id : undefined,
      kind: cell.kind,
      title: cellTitle(n),
      status: changes.length ? 'changed' : 'same',
      older: o,
      newer: n,
      changes,
    };
  });
}
