import { useEffect, useRef } from 'react';
import { Navigate, Outlet, useLocation, useNavigate } from 'react-router';
import { paths } from '@/config/paths.ts';
import { AppShell } from '@/components/ui/app-shell.tsx';
import { QueryError } from '@/components/ui/query-error.tsx';
import { SkeletonBlock } from '@/components/ui/skeleton.tsx';
import { ErrorBoundary } from '@/components/ui/status-pages.tsx';
import { useMe } from '@/features/auth/api/get-me.ts';
import { useSignOut } from '@/features/auth/api/sign-out.ts';
import { useOutboxAvailable } from '@/features/outbox/api/get-outbox.ts';

/** After moving to another page, keyboard and screen-reader users start at its content. */
function useFocusMainOnNavigation(pathname: string) {
  const first = useRef(true);
  useEffect(() => {
    if (first.current) {
      first.current = false;
      return;
    }
    document.getElementById('main')?.focus({ preventScroll: false });
  }, [pathname]);
}

/** The signed-in part of the app: sends visitors to sign-in (and back here afterwards). */
export default function AppRoot() {
  const me = useMe();
  const location = useLocation();
  const navigate = useNavigate();
  const signOut = useSignOut();
  const outbox = useOutboxAvailable();
  useFocusMainOnNavigation(location.pathname);

  if (me.isPending)
    return (
      <div className="mx-auto max-w-3xl p-10">
        <SkeletonBlock lines={4} label="Checking your session" />
      </div>
    );
  if (me.isError)
    return (
      <div className="mx-auto max-w-xl p-10">
        <QueryError error={me.error} what="your session" onRetry={() => void me.refetch()} />
      </div>
    );
  if (!me.data)
    return <Navigate to={paths.signIn.getHref(`${location.pathname}${location.search}`)} replace />;

  return (
    <AppShell
      user={me.data.user}
      showOutbox={outbox.data === true}
      signingOut={signOut.isPending}
      onSignOut={() =>
        signOut.mutate(undefined, {
          onSettled: () => void navigate(paths.signIn.getHref(), { replace: true }),
        })
      }
    >
      <ErrorBoundary key={location.pathname}>
        <Outlet context={me.data} />
      </ErrorBoundary>
    </AppShell>
  );
}
