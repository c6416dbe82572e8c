import { CELL_KIND_LABELS } from '@shared/cells/kinds.ts';
import { ENTRY_STATUS_LABELS } from '@shared/api/entries.ts';
import type { DocNode } from '@shared/editor/document.ts';
import type { AnalyzeResult } from '@shared/engine/contract.ts';
import { attachmentContentUrl } from '@server/presenters/attachment.presenter.ts';
import { presentFigure } from '@server/presenters/figure.presenter.ts';
import { formatBytes } from '@server/services/attachments/receive-upload.ts';
import type { EntryRecord } from './entry-record.ts';
import { cellsWithResults } from './entry-record.ts';
import { okResult } from './result-csv.ts';

const ESC: Record<string, string> = { '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' };
export const esc = (s: unknown) => String(s ?? '').replace(/[&<>"']/g, (c) => ESC[c]);
const num = (x: number) => (Number.isFinite(x) ? Number(x.toPrecision(6)).toString() : '—');

/** Only app-relative and http(s) addresses become links or images. */
const safeUrl = (u: unknown) => (typeof u === 'string' && (/^\/(?!\/)/.test(u) || /^https?:\/\//i.test(u)) ? u : '');

function inline(node: DocNode): string {
  if (node.type === 'text') {
    let html = esc(node.text);
    for (const mark of node.marks ?? []) {
      if (mark.type === 'bold') html = `<strong>${html}</strong>`;
      else if (mark.type === 'italic') html = `<em>${html}</em>`;
      else if (mark.type === 'underline') html = `<u>${html}</u>`;
      else if (mark.type === 'strike') html = `<s>${html}</s>`;
      else if (mark.type === 'code') html = `<code>${html}</code>`;
      else if (mark.type === 'link') {
        const href = safeUrl(mark.attrs.href);
        html = href ? `<a href="${esc(href)}">${html}</a>` : html;
      }
    }
    return html;
  }
  if (node.type === 'hardBreak') return '<br>';
  if (node.type === 'inlineMath') return `<span class="math">${esc(node.attrs?.latex)}</span>`;
  return (node.content ?? []).map(inline).join('');
}

function block(node: DocNode, outputs: EntryRecord['revision']['outputs']): string {
  const inner = () => (node.content ?? []).map((c) => block(c, outputs)).join('');
  switch (node.type) {
    case 'paragraph':
      return `<p>${inline(node)}</p>`;
    case 'heading': {
      const level = Math.min(4, Math.max(1, Number(node.attrs?.level ?? 1))) + 1;
      return `<h${level}>${inline(node)}</h${level}>`;
    }
    case 'bulletList':
      return `<ul>${inner()}</ul>`;
    case 'orderedList':
      return `<ol start="${Number(node.attrs?.start ?? 1)}">${inner()}</ol>`;
    case 'listItem':
      return `<li>${inner()}</li>`;
    case 'blockquote':
      return `<blockquote>${inner()}</blockquote>`;
    case 'codeBlock':
      return `<pre><code>${esc((node.content ?? []).map((c) => c.text ?? '').join(''))}</code></pre>`;
    case 'horizontalRule':
      return '<hr>';
    case 'image': {
      const src = safeUrl(node.attrs?.src);
      return src ? `<figure><img src="${esc(src)}" alt="${esc(node.attrs?.alt)}"></figure>` : '';
    }
    case 'displayMath':
      return `<div class="math display">${esc(node.attrs?.latex)}</div>`;
    case 'cell':
      return cellBlock(node, outputs);
    default:
      return inner();
  }
}

function cellBlock(node: DocNode, outputs: EntryRecord['revision']['outputs']): string {
  const id = String(node.attrs?.id ?? '');
  const kind = String(node.attrs?.kind ?? '') as keyof typeof CELL_KIND_LABELS;
  const input = (node.attrs?.input ?? {}) as Record<string, unknown>;
  const label = CELL_KIND_LABELS[kind] ?? 'Cell';
  const output = outputs[id];
  let body = '';
  if (kind === 'model') {
    const vars = (input.variables as { name: string; rhs: string }[] | undefined) ?? [];
    const pars = (input.parameters as { name: string; value: number }[] | undefined) ?? [];
    body = `<ul class="equations">${vars.map((v) => `<li><code>${esc(v.name)}′ = ${esc(v.rhs)}</code></li>`).join('')}</ul>`;
    if (pars.length) body += `<p class="small">Parameters: ${pars.map((p) => `${esc(p.name)} = ${num(p.value)}`).join(', ')}</p>`;
  } else if (output?.status === 'error') {
    body = `<p class="small">The last run failed: ${esc(output.error?.message)}</p>`;
  } else if (!output) {
    body = '<p class="small">Not run in this revision.</p>';
  } else {
    body = resultSummary(okResult(output));
    body += `<p class="small provenance">Input hash ${esc(output.inputHash)} · engine ${esc(output.engineVersion)} · computed ${esc(output.computedAt)}</p>`;
  }
  const name = typeof input.name === 'string' && input.name ? ` — ${esc(input.name)}` : '';
  return `<section class="cell"><h4>${esc(label)}${name}</h4>${body}</section>`;
}

function resultSummary(result: AnalyzeResult | null): string {
  if (!result) return '';
  if ('branch' in result) {
    const rows = result.branch.events.map((e) => `<tr><td>${esc(e.kind)}</td><td>${num(e.parameter)}</td><td>${Object.entries(e.state).map(([k, v]) => `${esc(k)} = ${num(v)}`).join(', ')}</td></tr>`);
    return `<p>${result.branch.points.length} points; ended: ${esc(result.branch.stopReason)}.</p>` + (rows.length ? `<table><thead><tr><th>Event</th><th>Parameter</th><th>State</th></tr></thead><tbody>${rows.join('')}</tbody></table>` : '<p>No events on this branch.</p>');
  }
  if ('curve' in result) {
    const cusps = result.curve.events.map((e) => `<li>${esc(e.kind)} at ${Object.entries(e.parameters).map(([k, v]) => `${esc(k)} = ${num(v)}`).join(', ')}</li>`);
    return `<p>${result.curve.points.length} fold points; ended: ${esc(result.curve.stopReason)}.</p>${cusps.length ? `<ul>${cusps.join('')}</ul>` : ''}`;
  }
  if ('trajectory' in result) {
    const t = result.trajectory.t;
    return `<p>${t.length} samples from t = ${num(t[0])} to t = ${num(t[t.length - 1])}; ended: ${esc(result.stopReason)}.</p>`;
  }
  return `<p>${result.equilibria.length} equilibria: ${result.equilibria.map((e) => esc(e.stability)).join(', ')}.</p>`;
}

const PRINT_CSS = `
  :root { color: #111827; font-family: 'DejaVu Serif', Georgia, serif; font-size: 11pt; line-height: 1.45; }
  body { max-width: 46rem; margin: 2rem auto; padding: 0 1rem; }
  header { border-bottom: 2px solid #111827; margin-bottom: 1rem; }
  h1 { font-size: 1.6rem; margin: 0 0 .25rem; }
  h2 { font-size: 1.2rem; margin-top: 1.6rem; border-bottom: 1px solid #d1d5db; }
  .meta, .small { color: #4b5563; font-size: .85rem; }
  code, pre, .math { font-family: 'DejaVu Sans Mono', monospace; font-size: .9em; }
  .math.display { text-align: center; margin: .75rem 0; }
  .cell { border: 1px solid #d1d5db; border-radius: 4px; padding: .5rem .75rem; margin: .75rem 0; break-inside: avoid; }
  .cell h4 { margin: 0 0 .25rem; font-size: .95rem; }
  table { border-collapse: collapse; width: 100%; font-size: .85rem; }
  th, td { border: 1px solid #d1d5db; padding: .2rem .4rem; text-align: left; vertical-align: top; }
  td.hash { font-family: 'DejaVu Sans Mono', monospace; font-size: .7rem; word-break: break-all; }
  figure { margin: 1rem 0; break-inside: avoid; } figure img { max-width: 100%; }
  figcaption { font-size: .85rem; color: #4b5563; }
  .signature { border-left: 3px solid #047857; padding-left: .5rem; margin: .5rem 0; }
  @media print {
    @page { size: A4; margin: 16mm 14mm 18mm; }
    body { margin: 0; max-width: none; }
    a { color: inherit; text-decoration: none; }
    h2 { break-after: avoid; }
    tr, .signature { break-inside: avoid; }
    .no-print { display: none; }
  }
`;

/** The printable record of a revision: one self-contained HTML page with a print stylesheet. */
export function recordHtml(record: EntryRecord, exportedAt: Date, exportedBy: string): string {
  const { entry, revision } = record;
  const doc = (revision.document.content ?? []).map((n) => block(n, revision.outputs)).join('\n');
  const figures = record.figures
    .map((f) => {
      const p = presentFigure({ ...f, createdBy: { id: f.createdById, name: '' } } as never);
      return `<figure><img src="${esc(p.svgUrl)}" alt="${esc(f.caption || 'Figure')}"><figcaption>${esc(f.caption || 'Figure')} — input hash ${esc(f.inputHash)}, SVG sha256 ${esc(f.svgSha256)}</figcaption></figure>`;
    })
    .join('');
  const attachments = record.attachments.length
    ? `<table><thead><tr><th>File</th><th>Type</th><th>Size</th><th>SHA-256</th></tr></thead><tbody>${record.attachments
        .map((a) => `<tr><td><a href="${esc(attachmentContentUrl(a))}">${esc(a.originalName)}</a></td><td>${esc(a.contentType)}</td><td>${esc(formatBytes(a.byteSize))}</td><td class="hash">${esc(a.sha256)}</td></tr>`)
        .join('')}</tbody></table>`
    : '<p class="small">No attachments.</p>';
  const measurements = record.measurements.length
    ? `<ul>${record.measurements.map((m) => `<li>${esc(m.name)}: ${m.rows.length} rows of ${esc(m.stateName)} against ${esc(m.parameterName)} (sha256 ${esc(m.sha256)})</li>`).join('')}</ul>`
    : '<p class="small">No measured data.</p>';
  const signatures = record.signatures.length
    ? record.signatures
        .map((s) => `<div class="signature"><strong>${esc(s.printedName)}</strong> — ${esc(s.meaning)} — ${esc(s.signedAt.toISOString())}<br><span class="small">Signed content hash ${esc(s.contentHash)}</span></div>`)
        .join('')
    : '<p class="small">This revision has not been signed.</p>';
  const audit = `<table><thead><tr><th>#</th><th>When (UTC)</th><th>Who</th><th>What</th><th>Event hash</th></tr></thead><tbody>${record.audit
    .map((a) => `<tr><td>${esc(a.seq)}</td><td>${esc(a.occurredAt)}</td><td>${esc(a.actorName ?? '—')}</td><td>${esc(a.action)}</td><td class="hash">${esc(a.hash)}</td></tr>`)
    .join('')}</tbody></table>`;
  const cellsRun = cellsWithResults(revision).length;
  return `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><title>${esc(revision.title)} — revision ${revision.number}</title>
<meta name="viewport" content="width=device-width, initial-scale=1"><style>${PRINT_CSS}</style></head>
<body>
<header>
  <p class="meta">${esc(record.notebookTitle)}</p>
  <h1>${esc(revision.title)}</h1>
  <p class="meta">Entry date ${esc(revision.entryDate)} · status ${esc(ENTRY_STATUS_LABELS[entry.status] ?? entry.status)} · revision ${revision.number} by ${esc(revision.author.name)} on ${esc(revision.createdAt.toISOString())}${revision.tags.length ? ` · tags ${revision.tags.map(esc).join(', ')}` : ''}</p>
  <p class="meta">Content hash <code>${esc(revision.contentHash)}</code> · ${cellsRun} cell${cellsRun === 1 ? '' : 's'} with results</p>
</header>
<main>
<section class="document">${doc}</section>
<h2>Figures</h2>${figures || '<p class="small">No figures attached to this revision.</p>'}
<h2>Attachments</h2>${attachments}
<h2>Measured data</h2>${measurements}
<h2>Signatures</h2>${signatures}
<h2>Audit trail of this entry</h2>${audit}
</main>
<footer><p class="small">Exported ${esc(exportedAt.toISOString())} by ${esc(exportedBy)}.</p></footer>
</body></html>`;
}
