import { PageHeader } from '@/components/ui/app-shell.tsx';
import { CreateNotebookButton } from '@/features/notebooks/components/create-notebook-dialog.tsx';
import { NotebookList } from '@/features/notebooks/components/notebook-list.tsx';
import { useDocumentTitle } from '@/lib/use-document-title.ts';
import { useSession } from './use-session.ts';

export default function NotebooksRoute() {
  useDocumentTitle('Notebooks');
  const { user } = useSession();
  return (
    <>
      <PageHeader
        eyebrow={`Signed in as ${user.name}`}
        title="Your notebooks"
        actions={<CreateNotebookButton />}
      >
        Each notebook is one study: a model, the analyses run on it, and the people who work on it.
      </PageHeader>
      <NotebookList />
    </>
  );
}
