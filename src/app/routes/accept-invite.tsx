import { Link, useNavigate, useParams } from 'react-router';
import { paths } from '@/config/paths.ts';
import { PublicShell } from '@/components/ui/app-shell.tsx';
import { FormAlert } from '@/components/ui/form.tsx';
import { QueryError } from '@/components/ui/query-error.tsx';
import { SkeletonBlock } from '@/components/ui/skeleton.tsx';
import { useInvite } from '@/features/auth/api/get-invite.ts';
import { AcceptInviteForm } from '@/features/auth/components/accept-invite-form.tsx';
import { isApiError } from '@/lib/api-error.ts';
import { formatDateTime } from '@/lib/format.ts';
import { useDocumentTitle } from '@/lib/use-document-title.ts';

export default function AcceptInviteRoute() {
  useDocumentTitle('Accept your invite');
  const { token = '' } = useParams();
  const invite = useInvite(token);
  const navigate = useNavigate();
  return (
    <PublicShell
      title="Join Bifolio"
      intro={
        invite.data
          ? `You were invited as ${invite.data.name}. Choose a password to finish; the link works until ${formatDateTime(invite.data.expiresAt)}.`
          : undefined
      }
    >
      {invite.isPending && <SkeletonBlock lines={4} label="Checking the invite" />}
      {invite.isError &&
        (isApiError(invite.error) && invite.error.status === 404 ? (
          <div className="space-y-4">
            <FormAlert>
              This invite link is not valid: it may have expired or been used already. Ask your administrator
              to send a new one.
            </FormAlert>
            <Link to={paths.signIn.getHref()} className="text-sm">
              Go to sign-in
            </Link>
          </div>
        ) : (
          <QueryError error={invite.error} what="the invite" onRetry={() => void invite.refetch()} />
        ))}
      {invite.data && (
        <AcceptInviteForm
          token={token}
          email={invite.data.email}
          name={invite.data.name}
          onSuccess={() => void navigate(paths.notebooks.getHref(), { replace: true })}
        />
      )}
    </PublicShell>
  );
}
