import { Link, useParams, useSearchParams } from 'react-router';
import { paths } from '@/config/paths.ts';
import { EntryComparePage } from '@/features/reviews/index.ts';
import { useNotebook } from '@/features/notebooks/api/get-notebook.ts';
import { useDocumentTitle } from '@/lib/use-document-title.ts';
import { NotebookGate } from './notebook-gate.tsx';

/** /notebooks/:notebookId/entries/:entryId/compare?from=&to= — any two revisions compared. */
export default function EntryCompareRoute() {
  const { notebookId = '', entryId = '' } = useParams();
  const [search, setSearch] = useSearchParams();
  const notebook = useNotebook(notebookId);
  useDocumentTitle(notebook.data ? `Compare · ${notebook.data.title}` : 'Compare');
  return (
    <NotebookGate notebookId={notebookId} loadingLabel="Loading the revisions">
      {(nb) => (
        <div>
          <nav aria-label="Breadcrumb" className="mb-3 text-sm">
            <Link to={paths.notebook.getHref(notebookId)}>{nb.title}</Link>
            <span className="mx-2 text-ink-muted">/</span>
            <Link to={paths.entry.getHref(notebookId, entryId)}>Entry</Link>
            <span className="mx-2 text-ink-muted">/</span>
            <span className="text-ink-muted">Compare</span>
          </nav>
          <EntryComparePage
            notebookId={notebookId}
            entryId={entryId}
            fromId={search.get('from')}
            toId={search.get('to')}
            onChange={(from, to) => setSearch({ from, to }, { replace: true })}
          />
        </div>
      )}
    </NotebookGate>
  );
}
