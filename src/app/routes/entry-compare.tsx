import { useParams, useSearchParams } from 'react-router';
import { EntryComparePage, EntryCrumbs } from '@/features/reviews/index.ts';
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
          <EntryCrumbs notebookId={notebookId} notebookTitle={nb.title} entryId={entryId} page="Compare" />
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
