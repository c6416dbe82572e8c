import type { SearchEventKind, SearchHit, SearchQuery, SnippetPart } from '@shared/api/search.ts';
import { splitMathsFragment } from '@shared/editor/inline-maths.ts';
import type { ActingContext } from '@server/services/entries/service-context.ts';

/** Markers ts_headline puts around matched words; control characters never found in the indexed text. */
const START = '\u0002';
const STOP = '\u0003';
/** Between the fragments of one snippet. */
const FRAGMENT_DELIMITER = ' … ';

/** Plain-text parts of marked text, matched words flagged. */
function markedParts(text: string): SnippetPart[] {
  const parts: SnippetPart[] = [];
  const re = new RegExp(`${START}([^${STOP}]*)${STOP}`, 'g');
  let last = 0;
  for (const m of text.matchAll(re)) {
    if (m.index > last) parts.push({ text: text.slice(last, m.index), hit: false });
    parts.push({ text: m[1], hit: true });
    last = m.index + m[0].length;
  }
  if (last < text.length) parts.push({ text: text.slice(last), hit: false });
  return parts.map((p) => ({ ...p, text: p.text.replaceAll(START, '').replaceAll(STOP, '') }));
}

/**
 * Splits a ts_headline result (or the start of the search text) into parts: matched words flagged,
 * whole formulas as `maths` parts (a hit inside one flags the formula), a formula cut at a
 * fragment's edge as readable text, never as half of its LaTeX.
 */
export function snippetParts(headline: string): SnippetPart[] {
  const parts: SnippetPart[] = [];
  headline.split(FRAGMENT_DELIMITER).forEach((fragment, i) => {
    if (i > 0) parts.push({ text: FRAGMENT_DELIMITER, hit: false });
    for (const segment of splitMathsFragment(fragment)) {
      // Heading marks of the plain text ("## Aim") say nothing in a one-line snippet.
      if (segment.kind === 'text') parts.push(...markedParts(segment.text.replace(/(^|\s)#{1,6}(?= )/g, '$1').replace(/ {2,}/g, ' ')));
      else parts.push({ text: segment.latex.replaceAll(START, '').replaceAll(STOP, ''), hit: segment.latex.includes(START), maths: true });
    }
  });
  // Neighbouring plain parts of the same kind read as one.
  const merged: SnippetPart[] = [];
  for (const p of parts) {
    const last = merged[merged.length - 1];
    if (p.text === '') continue;
    if (last && !last.maths && !p.maths && last.hit === p.hit) last.text += p.text;
    else merged.push({ ...p });
  }
  return merged;
}

interface Row {
  id: string;
  notebook_id: string;
  notebook_title: string;
  title: string;
  entry_date: string;
  tags: string[];
  status: SearchHit['status'];
  author_id: string;
  author_name: string;
  rank: number;
  headline: string;
  events: { kind: SearchEventKind; cellId: string; parameters: Record<string, number> }[] | null;
}

/**
 * Full-text and content search over the entries of the caller's notebooks. Text: the entry's
 * generated tsvector (title, tags, head revision text) matched with websearch_to_tsquery, ranked by
 * ts_rank, snippets by ts_headline. Content: JSONB queries over the head revision's stored outputs
 * (branch events, fold-curve cusps), optionally bounded in the parameter and tied to the branch
 * cell's continuation parameter (read from the document).
 */
export async function searchEntries(ctx: ActingContext, query: SearchQuery): Promise<SearchHit[]> {
  const args: unknown[] = [ctx.actor.id];
  const arg = (v: unknown) => {
    args.push(v);
    return `$${args.length}`;
  };
  const where: string[] = ['e.head_revision_id IS NOT NULL'];
  const q = query.q ? arg(query.q) : null;
  const tsq = q ? `websearch_to_tsquery('english', ${q})` : null;
  if (tsq) where.push(`e.search_vector @@ ${tsq}`);
  if (query.notebookId) where.push(`e.notebook_id = ${arg(query.notebookId)}`);
  if (query.author) where.push(`e.author_id = ${arg(query.author)}`);
  if (query.status) where.push(`e.status = ${arg(query.status)}`);
  if (query.tag) where.push(`lower(${arg(query.tag)}) = ANY (SELECT lower(t) FROM unnest(e.tags) AS t)`);
  if (query.from) where.push(`e.entry_date >= ${arg(query.from)}`);
  if (query.to) where.push(`e.entry_date <= ${arg(query.to)}`);

  let eventsSql = 'NULL::jsonb';
  if (query.contains) {
    const kind = arg(query.contains);
    const conditions = [`o.value->>'status' = 'ok'`, `ev->>'kind' = ${kind}`];
    let source: string;
    let parameters: string;
    if (query.contains === 'cusp') {
      source = `jsonb_array_elements(CASE WHEN jsonb_typeof(o.value->'result'->'curve'->'events') = 'array' THEN o.value->'result'->'curve'->'events' ELSE '[]'::jsonb END)`;
      parameters = `ev->'parameters'`;
    } else {
      source = `jsonb_array_elements(CASE WHEN jsonb_typeof(o.value->'result'->'branch'->'events') = 'array' THEN o.value->'result'->'branch'->'events' ELSE '[]'::jsonb END)`;
      // The branch's parameter name lives in its cell's input in the document.
      const paramName = `(jsonb_path_query_first(r.document, '$.** ? (@.type == "cell" && @.attrs.id == $id).attrs.input.task.parameter', jsonb_build_object('id', o.key)) #>> '{}')`;
      parameters = `jsonb_build_object(COALESCE(${paramName}, 'parameter'), ev->'parameter')`;
      if (query.min !== undefined) conditions.push(`(ev->>'parameter')::float8 >= ${arg(query.min)}`);
      if (query.max !== undefined) conditions.push(`(ev->>'parameter')::float8 <= ${arg(query.max)}`);
      if (query.parameter) conditions.push(`${paramName} = ${arg(query.parameter)}`);
    }
    eventsSql = `(SELECT jsonb_agg(jsonb_build_object('kind', ev->>'kind', 'cellId', o.key, 'parameters', ${parameters}))
                    FROM jsonb_each(r.outputs) o, LATERAL ${source} ev
                   WHERE ${conditions.join(' AND ')})`;
  }

  const rank = tsq ? `ts_rank(e.search_vector, ${tsq})` : '0';
  const headline = tsq
    ? `ts_headline('english', e.search_text, ${tsq}, 'StartSel=${START}, StopSel=${STOP}, MaxWords=30, MinWords=12, MaxFragments=2, FragmentDelimiter="${FRAGMENT_DELIMITER}"')`
    : `left(e.search_text, 200)`;
  const limit = arg(query.limit);
  const sql = `
    SELECT * FROM (
      SELECT e.id, e.notebook_id, n.title AS notebook_title, e.title, e.entry_date::text AS entry_date, e.tags, e.status,
             u.id AS author_id, u.name AS author_name, ${rank}::float8 AS rank, ${headline} AS headline, ${eventsSql} AS events,
             e.created_at
        FROM entry e
        JOIN membership m ON m.notebook_id = e.notebook_id AND m.user_id = $1
        JOIN notebook n ON n.id = e.notebook_id
        JOIN app_user u ON u.id = e.author_id
        JOIN revision r ON r.id = e.head_revision_id
       WHERE ${where.join(' AND ')}
    ) found
    ${query.contains ? 'WHERE found.events IS NOT NULL' : ''}
    ORDER BY ${tsq ? 'rank DESC, ' : ''}entry_date DESC, created_at DESC
    LIMIT ${limit}`;
  const rows = (await ctx.manager.query(sql, args)) as Row[];
  return rows.map((r) => ({
    entryId: r.id,
    notebook: { id: r.notebook_id, title: r.notebook_title },
    title: r.title,
    entryDate: r.entry_date,
    tags: r.tags,
    status: r.status,
    author: { id: r.author_id, name: r.author_name },
    rank: r.rank,
    snippet: snippetParts(r.headline),
    events: r.events ?? [],
  }));
}
