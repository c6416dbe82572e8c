import { PublicShell } from '@/components/ui/app-shell.tsx';
import { RequestResetForm } from '@/features/auth/components/request-reset-form.tsx';
import { useDocumentTitle } from '@/lib/use-document-title.ts';

export default function RequestResetRoute() {
  useDocumentTitle('Reset your password');
  return (
    <PublicShell
      title="Reset your password"
      intro="Give the address you sign in with; we will mail you a link to choose a new password."
    >
      <RequestResetForm />
    </PublicShell>
  );
}
