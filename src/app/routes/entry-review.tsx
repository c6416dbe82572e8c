import { Link, useParams } from 'react-router';
import { paths } from '@/config/paths.ts';
import { EntryReviewPage } from '@/features/reviews/index.ts';
import { useNotebook } from '@/features/notebooks/api/get-notebook.ts';
import { useDocumentTitle } from '@/lib/use-document-title.ts';
import { NotebookGate } from './notebook-gate.tsx';
import { useSession } from './use-session.ts';

/** /notebooks/:notebookId/entries/:entryId/review — the PI's review of one entry. */
export default function EntryReviewRoute() {
  const { notebookId = '', entryId = '' } = useParams();
  const session = useSession();
  const notebook = useNotebook(notebookId);
  useDocumentTitle(notebook.data ? `Review · ${notebook.data.title}` : 'Review');
  return (
    <NotebookGate notebookId={notebookId} loadingLabel="Loading the review">
      {(nb) => (
        <div>
          <nav aria-label="Breadcrumb" className="mb-3 text-sm">
            <Link to={paths.notebook.getHref(notebookId)}>{nb.title}</Link>
            <span className="mx-2 text-ink-muted">/</span>
            <Link to={paths.entry.getHref(notebookId, entryId)}>Entry</Link>
            <span className="mx-2 text-ink-muted">/</span>
            <span className="text-ink-muted">Review</span>
          </nav>
          <EntryReviewPage notebookId={notebookId} entryId={entryId} isPi={nb.role === 'pi'} me={{ id: session.user.id, name: session.user.name }} />
        </div>
      )}
    </NotebookGate>
  );
}
