import { useMemo } from 'react';
import { createBrowserRouter, isRouteErrorResponse, useRouteError } from 'react-router';
import { RouterProvider } from 'react-router/dom';
import { paths } from '@/config/paths.ts';
import { SkeletonBlock } from '@/components/ui/skeleton.tsx';
import { Broken, NotFound } from '@/components/ui/status-pages.tsx';

type RouteModule = { default: React.ComponentType };
const lazy = (load: () => Promise<RouteModule>) => async () => ({ Component: (await load()).default });

function RouteError() {
  const error = useRouteError();
  if (isRouteErrorResponse(error) && error.status === 404) return <NotFound />;
  return <Broken message={error instanceof Error ? error.message : undefined} />;
}

function Loading() {
  return (
    <div className="mx-auto max-w-3xl p-10">
      <SkeletonBlock lines={4} label="Loading Bifolio" />
    </div>
  );
}

export function createAppRouter() {
  return createBrowserRouter([
    {
      HydrateFallback: Loading,
      ErrorBoundary: RouteError,
      children: [
        { path: paths.signIn.path, lazy: lazy(() => import('./routes/sign-in.tsx')) },
        { path: paths.acceptInvite.path, lazy: lazy(() => import('./routes/accept-invite.tsx')) },
        { path: paths.requestReset.path, lazy: lazy(() => import('./routes/request-reset.tsx')) },
        { path: paths.completeReset.path, lazy: lazy(() => import('./routes/complete-reset.tsx')) },
        {
          path: paths.outbox.path,
          lazy: lazy(() => import('./routes/dev/outbox.tsx')),
          children: [
            { path: paths.outboxMessage.path, lazy: lazy(() => import('./routes/dev/outbox-message.tsx')) },
          ],
        },
        {
          // Everything below needs a signed-in person.
          lazy: lazy(() => import('./routes/app-root.tsx')),
          children: [
            { path: paths.notebooks.path, lazy: lazy(() => import('./routes/notebooks.tsx')) },
            { path: paths.notebook.path, lazy: lazy(() => import('./routes/notebook.tsx')) },
            { path: paths.entry.path, lazy: lazy(() => import('./routes/entry.tsx')) },
            { path: paths.entryReview.path, lazy: lazy(() => import('./routes/entry-review.tsx')) },
            { path: paths.entryCompare.path, lazy: lazy(() => import('./routes/entry-compare.tsx')) },
            { path: paths.reviewQueue.path, lazy: lazy(() => import('./routes/review-queue.tsx')) },
            { path: paths.audit.path, lazy: lazy(() => import('./routes/audit.tsx')) },
            { path: paths.search.path, lazy: lazy(() => import('./routes/search.tsx')) },
            { path: paths.methods.path, lazy: lazy(() => import('./routes/methods.tsx')) },
            { path: paths.account.path, lazy: lazy(() => import('./routes/account.tsx')) },
            { path: paths.adminUsers.path, lazy: lazy(() => import('./routes/admin/users.tsx')) },
            { path: paths.adminInvites.path, lazy: lazy(() => import('./routes/admin/invites.tsx')) },
            { path: '*', Component: NotFound },
          ],
        },
      ],
    },
  ]);
}

export function AppRouter() {
  const router = useMemo(() => createAppRouter(), []);
  return <RouterProvider router={router} />;
}
