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
      <div className="space-y-10">
        <section
          aria-labelledby="invite-heading"
          className="max-w-xl rounded-lg border border-rule bg-surface p-6"
        >
          <h2 id="invite-heading" className="mb-4 text-base font-semibold">
            Invite someone
          </h2>
          <InviteForm />
        </section>
        <section aria-labelledby="sent-heading">
          <h2 id="sent-heading" className="mb-3 font-serif text-xl font-bold">
            Sent invites
          </h2>
          <InvitesTable />
        </section>
      </div>
    </RequireAdmin>
  );
}
