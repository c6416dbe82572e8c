import { useParams } from 'react-router';
import type { Notebook } from '@shared/api/notebooks.ts';
// Not from the feature's index: that also exports the entry page, which would bring the editor's chunk to this page.
import { EntryLog } from '@/features/entries/components/entry-log.tsx';
import { MembersPanel } from '@/features/members/components/members-panel.tsx';
import { useNotebook } from '@/features/notebooks/api/get-notebook.ts';
import { NotebookOverview } from '@/features/notebooks/components/notebook-overview.tsx';
import { useDocumentTitle } from '@/lib/use-document-title.ts';
import { NotebookGate } from './notebook-gate.tsx';
import { useSession } from './use-session.ts';

function NotebookPage({ notebook }: { notebook: Notebook }) {
  const { user } = useSession();
  return (
    <div className="grid gap-8 lg:grid-cols-[minmax(0,1fr)_20rem]">
      <div className="min-w-0 space-y-10">
        <NotebookOverview notebook={notebook} />
        <EntryLog notebookId={notebook.id} canWrite={notebook.role !== 'reader'} />
      </div>
      <aside>
        <MembersPanel
          notebookId={notebook.id}
          notebookTitle={notebook.title}
          canManage={notebook.role === 'pi'}
          currentUserId={user.id}
        />
      </aside>
    </div>
  );
}

export default function NotebookRoute() {
  const { notebookId = '' } = useParams();
  const notebook = useNotebook(notebookId);
  useDocumentTitle(notebook.data?.title ?? (notebook.isError ? 'Not found' : 'Notebook'));
  return (
    <NotebookGate notebookId={notebookId} loadingLabel="Loading the notebook">
      {(nb) => <NotebookPage notebook={nb} />}
    </NotebookGate>
  );
}
