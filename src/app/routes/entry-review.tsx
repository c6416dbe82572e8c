import { useParams } from 'react-router';
import { EntryCrumbs, EntryReviewPage } from '@/features/reviews/index.ts';
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
          <EntryCrumbs notebookId={notebookId} notebookTitle={nb.title} entryId={entryId} page="Review" />
          <EntryReviewPage notebookId={notebookId} entryId={entryId} isPi={nb.role === 'pi'} canWrite={nb.role !== 'reader'} me={{ id: session.user.id, name: session.user.name }} />
        </div>
      )}
    </NotebookGate>
  );
}
