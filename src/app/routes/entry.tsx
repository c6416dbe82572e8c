import { Link, useParams } from 'react-router';
import { paths } from '@/config/paths.ts';
import { EntryPage } from '@/features/entries/index.ts';
import { useNotebook } from '@/features/notebooks/api/get-notebook.ts';
import { useDocumentTitle } from '@/lib/use-document-title.ts';
import { NotebookGate } from './notebook-gate.tsx';

/** /notebooks/:notebookId/entries/:entryId — one entry of a notebook's log. Readers see it read-only. */
export default function EntryRoute() {
  const { notebookId = '', entryId = '' } = useParams();
  const notebook = useNotebook(notebookId);
  useDocumentTitle(notebook.data ? `Entry · ${notebook.data.title}` : 'Entry');
  return (
    <NotebookGate notebookId={notebookId} loadingLabel="Loading the entry">
      {(nb) => (
        <div>
          <nav aria-label="Breadcrumb" className="mb-3 text-sm">
            <Link to={paths.notebook.getHref(notebookId)}>{nb.title}</Link>
            <span className="mx-2 text-ink-muted">/</span>
            <span className="text-ink-muted">Entry</span>
          </nav>
          <EntryPage notebookId={notebookId} entryId={entryId} canWrite={nb.role !== 'reader'} />
        </div>
      )}
    </NotebookGate>
  );
}
