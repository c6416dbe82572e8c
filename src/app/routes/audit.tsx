import { useSearchParams } from 'react-router';
import { PageHeader } from '@/components/ui/app-shell.tsx';
import { AuditLog } from '@/features/audit/index.ts';
import { useDocumentTitle } from '@/lib/use-document-title.ts';

/**
 * /audit?entryId=&notebookId=&actorId= — the audit trail of one entry, one notebook or one
 * person (the server decides who may see which).
 */
export default function AuditRoute() {
  const [search] = useSearchParams();
  const scope = {
    notebookId: search.get('notebookId') ?? undefined,
    entryId: search.get('entryId') ?? undefined,
    actorId: search.get('actorId') ?? undefined,
  };
  useDocumentTitle('Audit trail');
  const what = scope.entryId
    ? 'on this entry'
    : scope.notebookId
      ? 'in this notebook'
      : scope.actorId
        ? 'by this person'
        : 'on the whole site (administrators only)';
  return (
    <div>
      <PageHeader title="Audit trail">Every recorded action {what}, newest first. The trail is append-only: nothing in it can be changed.</PageHeader>
      <AuditLog key={search.toString()} scope={scope} />
    </div>
  );
}
