import type { ReactNode } from 'react';
import type { Notebook } from '@shared/api/notebooks.ts';
import { QueryError } from '@/components/ui/query-error.tsx';
import { SkeletonBlock } from '@/components/ui/skeleton.tsx';
import { NotFound } from '@/components/ui/status-pages.tsx';
import { useNotebook } from '@/features/notebooks/api/get-notebook.ts';
import { isApiError } from '@/lib/api-error.ts';

/**
 * Loads a notebook for the pages inside it. The API answers 404 both for notebooks that don't
 * exist and for those the caller doesn't belong to (and 400 for a malformed id): all show "not found".
 */
export function NotebookGate({
  notebookId,
  loadingLabel,
  children,
}: {
  notebookId: string;
  loadingLabel: string;
  children: (notebook: Notebook) => ReactNode;
}) {
  const notebook = useNotebook(notebookId);
  if (notebook.isPending) return <SkeletonBlock lines={6} label={loadingLabel} />;
  if (notebook.isError) {
    if (isApiError(notebook.error) && (notebook.error.status === 404 || notebook.error.status === 400))
      return <NotFound />;
    return <QueryError error={notebook.error} what="the notebook" onRetry={() => void notebook.refetch()} />;
  }
  return <>{children(notebook.data)}</>;
}
