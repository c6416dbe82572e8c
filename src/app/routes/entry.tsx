import { Link, useParams } from 'react-router';
import { QueryError } from '@/components/ui/query-error.tsx';
import { SkeletonBlock } from '@/components/ui/skeleton.tsx';
import { NotFound } from '@/components/ui/status-pages.tsx';
import { paths } from '@/config/paths.ts';
import { EntryPage } from '@/features/entries/index.ts';
import { useNotebook } from '@/features/notebooks/api/get-notebook.ts';
import { isApiError } from '@/lib/api-error.ts';
import { useDocumentTitle } from '@/lib/use-document-title.ts';

/** /notebooks/:notebookId/entries/:entryId — one entry of a notebook's log. Readers see it read-only. */
export default function EntryRoute() {
  const { notebookId = '', entryId = '' } = useParams();
  const notebook = useNotebook(notebookId);
  useDocumentTitle(notebook.data ? `Entry · ${notebook.data.title}` : 'Entry');
  if (notebook.isPending) return <SkeletonBlock lines={8} label="Loading the entry" />;
  if (notebook.isError) {
    if (isApiError(notebook.error) && (notebook.error.status === 404 || notebook.error.status === 400))
      return <NotFound />;
    return <QueryError error={notebook.error} what="the notebook" onRetry={() => void notebook.refetch()} />;
  }
  return (
    <div>
      <nav aria-label="Breadcrumb" className="mb-3 text-sm">
        <Link to={paths.notebook.getHref(notebookId)}>{notebook.data.title}</Link>
        <span className="mx-2 text-ink-muted">/</span>
        <span className="text-ink-muted">Entry</span>
      </nav>
      <EntryPage notebookId={notebookId} entryId={entryId} canWrite={notebook.data.role !== 'reader'} />
    </div>
  );
}
