import { PageHeader } from '@/components/ui/app-shell.tsx';
import { InviteForm } from '@/features/invites/components/invite-form.tsx';
import { InvitesTable } from '@/features/invites/components/invites-table.tsx';
import { useDocumentTitle } from '@/lib/use-document-title.ts';
import { RequireAdmin } from './require-admin.tsx';

export default function AdminInvitesRoute() {
  useDocumentTitle('Invites');
  return (
    <RequireAdmin>
      <PageHeader eyebrow="Administration" title="Invites">
        Invites sent by e-mail, and whether they were accepted.
      </PageHeader>
      <div className="grid items-start gap-8 lg:grid-cols-[minmax(0,1fr)_22rem]">
        <InvitesTable />
        <section aria-labelledby="invite-heading" className="rounded-lg border border-rule bg-surface p-6">
          <h2 id="invite-heading" className="mb-4 text-base font-semibold">
            Invite someone
          </h2>
          <InviteForm />
        </section>
      </div>
    </RequireAdmin>
  );
}
