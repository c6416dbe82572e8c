import { Link, Navigate, useNavigate, useSearchParams } from 'react-router';
import { paths, safeRedirect } from '@/config/paths.ts';
import { PublicShell } from '@/components/ui/app-shell.tsx';
import { SkeletonBlock } from '@/components/ui/skeleton.tsx';
import { useMe } from '@/features/auth/api/get-me.ts';
import { SignInForm } from '@/features/auth/components/sign-in-form.tsx';
import { useDocumentTitle } from '@/lib/use-document-title.ts';

export default function SignInRoute() {
  useDocumentTitle('Sign in');
  const [params] = useSearchParams();
  const navigate = useNavigate();
  const me = useMe();
  const target = safeRedirect(params.get('redirectTo'));
  if (me.data) return <Navigate to={target} replace />;
  return (
    <PublicShell
      title="Sign in"
      intro="Your group's log of models, equilibria, folds and the people who checked them."
    >
      {me.isPending ? (
        <SkeletonBlock lines={3} label="Checking your session" />
      ) : (
        <SignInForm onSuccess={() => void navigate(target, { replace: true })} />
      )}
      <p className="mt-6 border-t border-rule pt-4 text-xs text-ink-muted">
        New here? Accounts are by invitation: ask your site administrator. Lost the invite? Ask them to send
        another, or <Link to={paths.requestReset.getHref()}>reset a password</Link>.
      </p>
    </PublicShell>
  );
}
