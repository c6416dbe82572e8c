import { PageHeader } from '@/components/ui/app-shell.tsx';
import { MethodsPage } from '@/features/methods/components/methods-page.tsx';
import { useDocumentTitle } from '@/lib/use-document-title.ts';

export default function MethodsRoute() {
  useDocumentTitle('Methods');
  return (
    <>
      <PageHeader eyebrow="Reference" title="Methods">
        What each computation cell works out, the conventions behind its numbers, and where the
        methods are published.
      </PageHeader>
      <MethodsPage />
    </>
  );
}
