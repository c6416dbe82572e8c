import { useState } from 'react';
import { PageHeader } from '@/components/ui/app-shell.tsx';
import { Button } from '@/components/ui/button.tsx';
import { Dialog } from '@/components/ui/dialog.tsx';
import { InviteForm } from '@/features/invites/components/invite-form.tsx';
import { UsersTable } from '@/features/users/components/users-table.tsx';
import { useDocumentTitle } from '@/lib/use-document-title.ts';
import { useSession } from '../use-session.ts';
import { RequireAdmin } from './require-admin.tsx';

function UsersPage() {
  const { user } = useSession();
  const [inviting, setInviting] = useState(false);
  return (
    <>
      <PageHeader
        eyebrow="Administration"
        title="People"
        actions={<Button onClick={() => setInviting(true)}>Invite someone</Button>}
      >
        Everyone with an account. Deactivated people can no longer sign in; what they wrote stays in the
        record.
      </PageHeader>
      <UsersTable currentUserId={user.id} />
      <Dialog
        open={inviting}
        onClose={() => setInviting(false)}
        title="Invite someone"
        description="They receive a link by e-mail to choose a password."
      >
        <InviteForm onDone={() => setInviting(false)} />
      </Dialog>
    </>
  );
}

export default function AdminUsersRoute() {
  useDocumentTitle('People');
  return (
    <RequireAdmin>
      <UsersPage />
    </RequireAdmin>
  );
}
