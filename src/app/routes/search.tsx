import { PageHeader } from '@/components/ui/app-shell.tsx';
import { paths } from '@/config/paths.ts';
import { SearchPage } from '@/features/search/index.ts';
import { useDocumentTitle } from '@/lib/use-document-title.ts';

/** /search — full-text search over the entries of every notebook the person belongs to. */
export default function SearchRoute() {
  useDocumentTitle('Search');
  return (
    <div>
      <PageHeader title="Search the log">
        Words in titles, tags and text, filtered by author, status, tag, dates, or by what the results contain.
      </PageHeader>
      <SearchPage entryHref={(notebookId, entryId) => paths.entry.getHref(notebookId, entryId)} />
    </div>
  );
}
