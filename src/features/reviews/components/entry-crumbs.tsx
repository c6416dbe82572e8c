import { Link } from 'react-router';
import { paths } from '@/config/paths.ts';

/** "Notebook / Entry / <page>": where a page about one entry sits. */
export function EntryCrumbs({ notebookId, notebookTitle, entryId, page }: { notebookId: string; notebookTitle: string; entryId: string; page: string }) {
  return (
    <nav aria-label="Breadcrumb" className="mb-3 text-sm">
      <Link to={paths.notebook.getHref(notebookId)}>{notebookTitle}</Link>
      <span className="mx-2 text-ink-muted">/</span>
      <Link to={paths.entry.getHref(notebookId, entryId)}>Entry</Link>
      <span className="mx-2 text-ink-muted">/</span>
      <span className="text-ink-muted">{page}</span>
    </nav>
  );
}
