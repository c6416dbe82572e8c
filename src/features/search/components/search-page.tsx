import { useId, useState, type FormEvent } from 'react';
import { Link } from 'react-router';
import { ENTRY_STATUSES, ENTRY_STATUS_LABELS } from '@shared/api/entries.ts';
import { SEARCH_EVENT_KINDS, SEARCH_EVENT_LABELS, type SearchHit, type SearchQueryInput } from '@shared/api/search.ts';
import { Button } from '@/components/ui/button.tsx';
import { KatexFormula } from '@/components/ui/katex-formula.tsx';
import { getEntryQueryOptions } from '@/features/entries/api/get-entry.ts';
import { usePrefetchOnIntent } from '@/lib/prefetch.ts';
import { latexToText } from '@shared/editor/inline-maths.ts';
import { isApiError } from '@/lib/api-error.ts';
import { useSearchEntries } from '../api/search-entries.ts';

/**
 * Search across the person's notebooks: words and phrases, status, tag, dates, and what the
 * results contain (a fold, Hopf point, branch point or cusp; folds within a parameter range).
 * `entryHref` builds the link to an entry (from the app's paths module).
 */
export function SearchPage(props: { entryHref: (notebookId: string, entryId: string) => string }) {
  const [draft, setDraft] = useState<Record<string, string>>({});
  const [query, setQuery] = useState<SearchQueryInput | null>(null);
  const results = useSearchEntries(query ?? {}, query !== null);
  const id = useId();
  const field = (name: string) => ({ id: `${id}-${name}`, value: draft[name] ?? '', onChange: (e: { target: { value: string } }) => setDraft((d) => ({ ...d, [name]: e.target.value })) });
  const submit = (e: FormEvent) => {
    e.preventDefault();
    const q: Record<string, string> = {};
    for (const [k, v] of Object.entries(draft)) if (v.trim()) q[k] = v.trim();
    setQuery(q as SearchQueryInput);
  };
  const problems = isApiError(results.error) ? results.error.fields : [];
  const input = 'w-full rounded border border-rule-strong px-2 py-1 text-sm';
  const label = 'block text-xs font-medium text-ink-muted';

  return (
    <div className="space-y-4">
      <form role="search" aria-label="Search entries" onSubmit={submit} className="grid gap-3 sm:grid-cols-4">
        <div className="sm:col-span-4">
          <label className={label} htmlFor={`${id}-q`}>
            Words or "a phrase" (-word leaves it out)
          </label>
          <input className={input} type="search" {...field('q')} />
        </div>
        <div>
          <label className={label} htmlFor={`${id}-status`}>Status</label>
          <select className={input} {...field('status')}>
            <option value="">Any</option>
            {ENTRY_STATUSES.map((s) => (
              <option key={s} value={s}>{ENTRY_STATUS_LABELS[s]}</option>
            ))}
          </select>
        </div>
        <div>
          <label className={label} htmlFor={`${id}-tag`}>Tag</label>
          <input className={input} {...field('tag')} />
        </div>
        <div>
          <label className={label} htmlFor={`${id}-from`}>From</label>
          <input className={input} type="date" {...field('from')} />
        </div>
        <div>
          <label className={label} htmlFor={`${id}-to`}>To</label>
          <input className={input} type="date" {...field('to')} />
        </div>
        <div>
          <label className={label} htmlFor={`${id}-contains`}>Results contain</label>
          <select className={input} {...field('contains')}>
            <option value="">Anything</option>
            {SEARCH_EVENT_KINDS.map((k) => (
              <option key={k} value={k}>{SEARCH_EVENT_LABELS[k]}</option>
            ))}
          </select>
        </div>
        <div>
          <label className={label} htmlFor={`${id}-parameter`}>On a branch in (parameter)</label>
          <input className={input} {...field('parameter')} />
        </div>
        <div>
          <label className={label} htmlFor={`${id}-min`}>Parameter from</label>
          <input className={input} inputMode="decimal" {...field('min')} />
        </div>
        <div>
          <label className={label} htmlFor={`${id}-max`}>Parameter to</label>
          <input className={input} inputMode="decimal" {...field('max')} />
        </div>
        <div className="sm:col-span-4">
          <Button type="submit" busy={results.isFetching}>Search</Button>
        </div>
      </form>
      {problems.length > 0 && (
        <ul role="alert" className="text-sm text-unstable">
          {problems.map((p) => (
            <li key={p.path}>{p.path}: {p.message}</li>
          ))}
        </ul>
      )}
      {results.data && (
        <section aria-label="Search results">
          <p className="text-sm text-ink-muted">{results.data.results.length === 0 ? 'Nothing found.' : `${results.data.results.length} entries`}</p>
          <ol className="mt-2 space-y-3">
            {results.data.results.map((hit) => (
              <SearchResult key={hit.entryId} hit={hit} href={props.entryHref(hit.notebook.id, hit.entryId)} />
            ))}
          </ol>
        </section>
      )}
    </div>
  );
}

function SearchResult({ hit, href }: { hit: SearchHit; href: string }) {
  const prefetch = usePrefetchOnIntent();
  return (
    <li className="rounded-lg border border-rule bg-surface p-3">
      <Link to={href} {...prefetch((qc) => qc.prefetchQuery(getEntryQueryOptions(hit.notebook.id, hit.entryId)))} className="font-serif text-lg font-bold text-accent underline">
        {hit.title}
      </Link>
      <p className="text-xs text-ink-muted">
        {hit.notebook.title} · {hit.entryDate} · {hit.author.name} · {ENTRY_STATUS_LABELS[hit.status]}
      </p>
      <p className="mt-1 text-sm">
        <SnippetText parts={hit.snippet} />
      </p>
      {hit.events.length > 0 && (
        <p className="mt-1 text-xs text-ink-muted">
          {hit.events.map((e) => `${e.kind} at ${Object.entries(e.parameters).map(([k, v]) => `${k} = ${Number(v.toPrecision(5))}`).join(', ')}`).join('; ')}
        </p>
      )}
    </li>
  );
}

/**
 * A search snippet: matched words marked, formulas typeset (a formula KaTeX cannot read, or one
 * holding a matched word, still reads as words rather than LaTeX).
 */
export function SnippetText({ parts }: { parts: SearchHit['snippet'] }) {
  return (
    <>
      {parts.map((part, i) => {
        const content = part.maths ? <KatexFormula latex={part.text} fallback={latexToText(part.text)} /> : part.text;
        return part.hit ? <mark key={i}>{content}</mark> : <span key={i}>{content}</span>;
      })}
    </>
  );
}
