import { useParams } from 'react-router';
import { PublicShell } from '@/components/ui/app-shell.tsx';
import { CompleteResetForm } from '@/features/auth/components/complete-reset-form.tsx';
import { useDocumentTitle } from '@/lib/use-document-title.ts';

export default function CompleteResetRoute() {
  useDocumentTitle('Choose a new password');
  const { token = '' } = useParams();
  return (
    <PublicShell
      title="Choose a new password"
      intro="Other sessions signed in with the old password will be signed out."
    >
      <CompleteResetForm token={token} />
    </PublicShell>
  );
}
