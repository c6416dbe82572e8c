import { useParams } from 'react-router';
import { QueryError } from '@/components/ui/query-error.tsx';
import { SkeletonBlock } from '@/components/ui/skeleton.tsx';
import { NotFound } from '@/components/ui/status-pages.tsx';
import { EntryLog } from '@/features/entries/index.ts';
import { MembersPanel } from '@/features/members/components/members-panel.tsx';
import { useNotebook } from '@/features/notebooks/api/get-notebook.ts';
import { NotebookOverview } from '@/features/notebooks/components/notebook-overview.tsx';
import { isApiError } from '@/lib/api-error.ts';
import { useDocumentTitle } from '@/lib/use-document-title.ts';
import { useSession } from './use-session.ts';

export default function NotebookRoute() {
  const { notebookId = '' } = useParams();
  const { user } = useSession();
  const notebook = useNotebook(notebookId);
  useDocumentTitle(notebook.data?.title ?? (notebook.isError ? 'Not found' : 'Notebook'));

  if (notebook.isPending) return <SkeletonBlock lines={6} label="Loading the notebook" />;
  if (notebook.isError) {
    // The API answers 404 for notebooks the caller doesn't belong to, and for malformed ids (400).
    if (isApiError(notebook.error) && (notebook.error.status === 404 || notebook.error.status === 400))
      return <NotFound />;
    return <QueryError error={notebook.error} what="the notebook" onRetry={() => void notebook.refetch()} />;
  }
  const nb = notebook.data;
  return (
    <div className="grid gap-8 lg:grid-cols-[minmax(0,1fr)_20rem]">
      <div className="min-w-0 space-y-10">
        <NotebookOverview notebook={nb} />
        <EntryLog notebookId={nb.id} canWrite={nb.role !== 'reader'} />
      </div>
      <aside>
        <MembersPanel
          notebookId={nb.id}
          notebookTitle={nb.title}
          canManage={nb.role === 'pi'}
          currentUserId={user.id}
        />
      </aside>
    </div>
  );
}
