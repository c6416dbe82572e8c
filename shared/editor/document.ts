import { z } from 'zod';
import { canonicalJson } from '../cells/hash.ts';
import { CELL_KINDS, CELL_KIND_LABELS, type CellKind } from '../cells/kinds.ts';

/**
 * The entry body: a rich-text document in the editor's JSON form
 * (`{ type: 'doc', content: [...] }`).
 *
 * Allowed blocks: paragraphs, headings (levels 1–4), bullet and numbered lists, quotes,
 * code blocks, horizontal rules, images, display maths and computation cells. Allowed
 * inline content: text (with marks), hard breaks and inline maths.
 *
 * Cell nodes carry `{ id, kind, input }`. The document accepts any object as `input` so
 * that an entry with a half-typed or invalid cell can still be saved; the cell's input is
 * checked against its kind's schema when the cell runs (see `shared/cells/inputs.ts`).
 *
 * Used by the client editor (its node names must match these) and by the server to validate,
 * snapshot, search and diff documents.
 */

/** Limits on one document; documented here, enforced by `documentSchema`. */
export const DOCUMENT_LIMITS = {
  /** Nesting depth of nodes (doc → list → item → paragraph → text is 5). */
  maxDepth: 24,
  /** Total number of nodes, text runs included. */
  maxNodes: 50_000,
  /** Characters in one text run. */
  maxTextLength: 100_000,
  /** Characters in one LaTeX source. */
  maxLatexLength: 4_000,
  /** Computation cells in one document. */
  maxCells: 200,
  /** Characters of a URL (links, images). */
  maxUrlLength: 4_000,
  /** Size of one cell's input, as JSON characters. */
  maxCellInputChars: 200_000,
} as const;

export const BLOCK_NODE_TYPES = [
  'paragraph',
  'heading',
  'bulletList',
  'orderedList',
  'listItem',
  'blockquote',
  'codeBlock',
  'horizontalRule',
  'image',
  'displayMath',
  'cell',
] as const;
export const INLINE_NODE_TYPES = ['text', 'hardBreak', 'inlineMath'] as const;
export const NODE_TYPES = ['doc', ...BLOCK_NODE_TYPES, ...INLINE_NODE_TYPES] as const;
export type NodeType = (typeof NODE_TYPES)[number];

export const MARK_TYPES = ['bold', 'italic', 'strike', 'underline', 'code', 'link'] as const;
export type MarkType = (typeof MARK_TYPES)[number];

/**
 * Whether a link or image address may be kept: http(s) and mailto addresses, and addresses
 * relative to the app (its attachment and figure URLs are paths under /api). Anything else
 * (javascript:, data:, file:, another host through "//") is refused. Control characters and
 * white space at either end are refused too, since browsers drop them ("java\tscript:",
 * " //other.host").
 */
export function isAllowedUrl(u: string): boolean {
  // eslint-disable-next-line no-control-regex
  if (/[\u0000-\u001f\u007f]/.test(u) || u.trim() !== u) return false;
  if (/^https?:\/\/[^/\\]/i.test(u) || /^mailto:[^/\\]/i.test(u)) return true;
  // Browsers read "\" as "/" in web addresses: "/\host" and "\\host" are another host.
  if (/^[/\\]{2}/.test(u)) return false;
  // Relative: no scheme, i.e. no ":" before the first "/", "?" or "#".
  return !/^[^/?#]*:/.test(u);
}

const urlSchema = z
  .string()
  .max(DOCUMENT_LIMITS.maxUrlLength)
  .refine(isAllowedUrl, {
    message: 'This kind of address is not allowed: use an http(s) or mailto address, or a file of this entry',
  });

const latexSchema = z.string().max(DOCUMENT_LIMITS.maxLatexLength, {
  message: `A formula may have at most ${DOCUMENT_LIMITS.maxLatexLength} characters`,
});

/** Attributes per node type; a node type not listed here takes no attributes that matter. */
export const nodeAttrSchemas = {
  heading: z.object({ level: z.number().int().min(1).max(4) }).loose(),
  orderedList: z.object({ start: z.number().int().min(0).optional() }).loose(),
  codeBlock: z.object({ language: z.string().max(40).nullish() }).loose(),
  image: z
    .object({
      src: urlSchema.min(1),
      alt: z.string().max(1000).nullish(),
      title: z.string().max(1000).nullish(),
    })
    .loose(),
  inlineMath: z.object({ latex: latexSchema }).loose(),
  displayMath: z.object({ latex: latexSchema }).loose(),
  cell: z.object({
    id: z.uuid({ message: 'A cell needs a UUID' }),
    kind: z.enum(CELL_KINDS),
    input: z
      .record(z.string(), z.unknown())
      .refine((v) => JSON.stringify(v).length <= DOCUMENT_LIMITS.maxCellInputChars, {
        message: 'This cell input is too large',
      }),
  }),
} as const;

export const markSchema = z.discriminatedUnion('type', [
  z.object({ type: z.literal('bold'), attrs: z.record(z.string(), z.unknown()).optional() }),
  z.object({ type: z.literal('italic'), attrs: z.record(z.string(), z.unknown()).optional() }),
  z.object({ type: z.literal('strike'), attrs: z.record(z.string(), z.unknown()).optional() }),
  z.object({ type: z.literal('underline'), attrs: z.record(z.string(), z.unknown()).optional() }),
  z.object({ type: z.literal('code'), attrs: z.record(z.string(), z.unknown()).optional() }),
  z.object({
    type: z.literal('link'),
    attrs: z
      .object({ href: urlSchema.min(1), target: z.string().nullish(), rel: z.string().nullish() })
      .loose(),
  }),
]);
export type DocMark = z.infer<typeof markSchema>;

/** One node of the document tree (structure only; `documentSchema` adds the per-type checks). */
export interface DocNode {
  type: string;
  attrs?: Record<string, unknown>;
  content?: DocNode[];
  marks?: DocMark[];
  text?: string;
}

export interface DocumentJson {
  type: 'doc';
  content?: DocNode[];
}

const nodeShape: z.ZodType<DocNode> = z.lazy(() =>
  z.object({
    type: z.string(),
    attrs: z.record(z.string(), z.unknown()).optional(),
    content: z.array(nodeShape).optional(),
    marks: z.array(markSchema).optional(),
    text: z.string().max(DOCUMENT_LIMITS.maxTextLength).optional(),
  }),
);

const BLOCKS = new Set<string>(BLOCK_NODE_TYPES);
const INLINES = new Set<string>(INLINE_NODE_TYPES);
const KNOWN = new Set<string>(NODE_TYPES);

/** Which children each container accepts (a loose version of the editor's content expressions). */
function allowedChildren(type: string): 'blocks' | 'inline' | 'items' | 'none' {
  switch (type) {
    case 'doc':
    case 'blockquote':
    case 'listItem':
      return 'blocks';
    case 'bulletList':
    case 'orderedList':
      return 'items';
    case 'paragraph':
    case 'heading':
    case 'codeBlock':
      return 'inline';
    default:
      return 'none';
  }
}

function checkTree(root: DocNode, ctx: z.RefinementCtx): void {
  let count = 0;
  let cells = 0;
  const cellIds = new Set<string>();
  const visit = (node: DocNode, path: (string | number)[], depth: number): void => {
    count += 1;
    if (depth > DOCUMENT_LIMITS.maxDepth) {
      ctx.addIssue({
        code: 'custom',
        path,
        message: `The document is nested deeper than ${DOCUMENT_LIMITS.maxDepth} levels`,
      });
      return;
    }
    if (!KNOWN.has(node.type)) {
      ctx.addIssue({ code: 'custom', path: [...path, 'type'], message: `Unknown node type "${node.type}"` });
      return;
    }
    if (node.type === 'text' && (typeof node.text !== 'string' || node.text.length === 0)) {
      ctx.addIssue({ code: 'custom', path: [...path, 'text'], message: 'A text node needs non-empty text' });
    }
    if (node.type !== 'text' && node.marks && node.marks.length > 0 && node.type !== 'inlineMath') {
      ctx.addIssue({
        code: 'custom',
        path: [...path, 'marks'],
        message: `A ${node.type} node cannot carry marks`,
      });
    }
    const attrSchema = (nodeAttrSchemas as Record<string, z.ZodType>)[node.type];
    if (attrSchema) {
      const parsed = attrSchema.safeParse(node.attrs ?? {});
      if (!parsed.success) {
        for (const issue of parsed.error.issues) {
          ctx.addIssue({
            code: 'custom',
            path: [...path, 'attrs', ...issue.path.map(String)],
            message: issue.message,
          });
        }
      } else if (node.type === 'cell') {
        cells += 1;
        const id = (parsed.data as { id: string }).id;
        if (cellIds.has(id)) {
          ctx.addIssue({
            code: 'custom',
            path: [...path, 'attrs', 'id'],
            message: `Two cells share the id ${id}`,
          });
        }
        cellIds.add(id);
      }
    }
    const kids = node.content ?? [];
    const rule = allowedChildren(node.type);
    kids.forEach((child, i) => {
      const childPath = [...path, 'content', i];
      const ok =
        rule === 'blocks'
          ? BLOCKS.has(child.type) && child.type !== 'listItem'
          : rule === 'items'
            ? child.type === 'listItem'
            : rule === 'inline'
              ? INLINES.has(child.type)
              : false;
      if (!ok && KNOWN.has(child.type)) {
        ctx.addIssue({
          code: 'custom',
          path: [...childPath, 'type'],
          message: `A ${child.type} node cannot sit inside a ${node.type} node`,
        });
        return;
      }
      visit(child, childPath, depth + 1);
    });
  };
  visit(root, [], 1);
  if (count > DOCUMENT_LIMITS.maxNodes) {
    ctx.addIssue({
      code: 'custom',
      path: [],
      message: `The document has more than ${DOCUMENT_LIMITS.maxNodes} nodes`,
    });
  }
  if (cells > DOCUMENT_LIMITS.maxCells) {
    ctx.addIssue({
      code: 'custom',
      path: [],
      message: `The document has more than ${DOCUMENT_LIMITS.maxCells} cells`,
    });
  }
}

/** A whole entry body. Issues carry the dotted path of the offending node (e.g. `content.3.attrs.kind`). */
export const documentSchema: z.ZodType<DocumentJson> = z
  .object({ type: z.literal('doc'), content: z.array(nodeShape).optional() })
  .superRefine((doc, ctx) => checkTree(doc as DocNode, ctx)) as unknown as z.ZodType<DocumentJson>;

/** The body of a new entry: one empty paragraph. */
export function emptyDocument(): DocumentJson {
  return { type: 'doc', content: [{ type: 'paragraph' }] };
}

/** A cell as it sits in the document. */
export interface DocumentCell {
  id: string;
  kind: CellKind;
  input: Record<string, unknown>;
}

/** Every cell of a document, in reading order. Malformed cell nodes are skipped. */
export function extractCells(doc: DocumentJson): DocumentCell[] {
  const out: DocumentCell[] = [];
  const walk = (node: DocNode): void => {
    if (node.type === 'cell') {
      const parsed = nodeAttrSchemas.cell.safeParse(node.attrs ?? {});
      if (parsed.success) out.push(parsed.data);
      return;
    }
    node.content?.forEach(walk);
  };
  walk(doc as DocNode);
  return out;
}

/** A one-line description of a cell for plain text, diffs and search. */
export function describeCell(cell: DocumentCell): string {
  const label = CELL_KIND_LABELS[cell.kind];
  const name = typeof cell.input.name === 'string' && cell.input.name ? ` "${cell.input.name}"` : '';
  return `[${label}${name}] ${canonicalJson(cell.input, { nonFinite: 'null' })}`;
}

/**
 * The document as plain text: one line per block (list items prefixed with "- " or "1. ",
 * headings with "#"), inline maths as `$…$`, display maths as `$$…$$`, images as
 * `[image: alt]`, cells as `describeCell`. Stable, so two revisions can be diffed line by line
 * and the text indexed for search.
 */
export function documentToPlainText(doc: DocumentJson): string {
  const lines: string[] = [];
  const inline = (node: DocNode): string => {
    if (node.type === 'text') return node.text ?? '';
    if (node.type === 'hardBreak') return '\n';
    if (node.type === 'inlineMath') return `$${String(node.attrs?.latex ?? '')}$`;
    return (node.content ?? []).map(inline).join('');
  };
  const block = (node: DocNode, prefix: string): void => {
    switch (node.type) {
      case 'paragraph':
        lines.push(prefix + inline(node));
        return;
      case 'heading':
        lines.push(`${prefix}${'#'.repeat(Number(node.attrs?.level ?? 1))} ${inline(node)}`);
        return;
      case 'codeBlock':
        lines.push(...(prefix + '```\n' + inline(node) + '\n```').split('\n'));
        return;
      case 'horizontalRule':
        lines.push(prefix + '---');
        return;
      case 'image':
        lines.push(`${prefix}[image: ${String(node.attrs?.alt ?? node.attrs?.src ?? '')}]`);
        return;
      case 'displayMath':
        lines.push(`${prefix}$$${String(node.attrs?.latex ?? '')}$$`);
        return;
      case 'cell': {
        const parsed = nodeAttrSchemas.cell.safeParse(node.attrs ?? {});
        lines.push(prefix + (parsed.success ? describeCell(parsed.data) : '[cell]'));
        return;
      }
      case 'blockquote':
        (node.content ?? []).forEach((c) => block(c, `${prefix}> `));
        return;
      case 'bulletList':
      case 'orderedList': {
        const start = Number(node.attrs?.start ?? 1);
        (node.content ?? []).forEach((item, i) => {
          const marker = node.type === 'bulletList' ? '- ' : `${start + i}. `;
          (item.content ?? []).forEach((c, j) =>
            block(c, prefix + (j === 0 ? marker : ' '.repeat(marker.length))),
          );
        });
        return;
      }
      default:
        (node.content ?? []).forEach((c) => block(c, prefix));
    }
  };
  (doc.content ?? []).forEach((n) => block(n, ''));
  return lines.join('\n');
}

export { CELL_KINDS };
