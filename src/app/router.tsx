import { lazy, Suspense, type ComponentType } from 'react';
import { createBrowserRouter, Navigate, useRouteError } from 'react-router-dom';
import { ErrorLine, LoadingLine } from '@/components/ui/spinner';
import { AppLayout } from './app-layout';
import { RequireSignedIn } from './require-signed-in';

/**
 * Every page is its own chunk, loaded when its route is first visited: the shell that loads
 * before the first screen holds only the router, the layout and the session check (its size is
 * budgeted by scripts/bundle-budget.ts). The sketcher also carries the 3D canvas.
 */
function page<M>(load: () => Promise<M>, pick: (m: M) => ComponentType) {
  return async () => ({ Component: pick(await load()) });
}

const SketchPage = lazy(() =>
  import('@/features/sketch/sketch-page').then((m) => ({ default: m.SketchPage })),
);
const CalcSheetPage = lazy(() =>
  import('@/features/calc-sheet/components/calc-sheet-page').then((m) => ({
    default: m.CalcSheetPage,
  })),
);

function RouteErrorView() {
  const error = useRouteError();
  return (
    <div className="p-6 font-sans">
      <h1 className="mb-2 text-lg font-semibold text-steel-800">Something went wrong</h1>
      <ErrorLine
        error={error instanceof Error ? error : new Error('this page could not be shown')}
      />
    </div>
  );
}

/** Route table of the app (a data router, so the sketcher can guard unsaved edits with useBlocker). */
export function createAppRouter() {
  return createBrowserRouter([
    {
      path: '/sign-in',
      lazy: page(
        () => import('@/features/auth/components/sign-in-page'),
        (m) => m.SignInPage,
      ),
      errorElement: <RouteErrorView />,
    },
    {
      // Public: a share link opens without an account (outside RequireSignedIn).
      path: '/share/:token',
      lazy: page(
        () => import('@/features/share/components/public-share-page'),
        (m) => m.PublicSharePage,
      ),
      errorElement: <RouteErrorView />,
    },
    {
      path: '/sign-out',
      lazy: page(
        () => import('@/features/auth/components/sign-out-page'),
        (m) => m.SignOutPage,
      ),
      errorElement: <RouteErrorView />,
    },
    {
      path: '/forgot-password',
      lazy: page(
        () => import('@/features/auth/components/forgot-password-page'),
        (m) => m.ForgotPasswordPage,
      ),
      errorElement: <RouteErrorView />,
    },
    {
      path: '/reset-password',
      lazy: page(
        () => import('@/features/auth/components/reset-password-page'),
        (m) => m.ResetPasswordPage,
      ),
      errorElement: <RouteErrorView />,
    },
    {
      path: '/accept-invite',
      lazy: page(
        () => import('@/features/team/components/accept-invite-page'),
        (m) => m.AcceptInvitePage,
      ),
      errorElement: <RouteErrorView />,
    },
    {
      element: <RequireSignedIn />,
      errorElement: <RouteErrorView />,
      children: [
        {
          element: <AppLayout />,
          children: [
            { index: true, element: <Navigate to="/spools" replace /> },
            {
              path: '/spools',
              lazy: page(
                () => import('@/features/spools/components/spool-list-page'),
                (m) => m.SpoolListPage,
              ),
            },
            {
              path: '/spools/:spoolId',
              element: (
                <Suspense fallback={<LoadingLine label="Opening the sketcher…" />}>
                  <SketchPage />
                </Suspense>
              ),
            },
            {
              path: '/spools/:spoolId/calc-sheet',
              element: (
                <Suspense fallback={<LoadingLine label="Opening the calc sheet…" />}>
                  <CalcSheetPage />
                </Suspense>
              ),
            },
            {
              path: '/spools/:spoolId/fabrication',
              lazy: page(
                () => import('@/features/fabrication/components/fabrication-page'),
                (m) => m.FabricationPage,
              ),
            },
            {
              path: '/spools/:spoolId/revisions/:rev',
              lazy: page(
                () => import('@/features/review/components/revision-page'),
                (m) => m.RevisionPage,
              ),
            },
            {
              path: '/team',
              lazy: page(
                () => import('@/features/team/components/members-page'),
                (m) => m.MembersPage,
              ),
            },
            {
              path: '/materials',
              lazy: page(
                () => import('@/features/materials/components/materials-page'),
                (m) => m.MaterialsPage,
              ),
            },
            {
              path: '/line-list',
              lazy: page(
                () => import('@/features/line-list/components/line-list-page'),
                (m) => m.LineListPage,
              ),
            },
            {
              path: '/outbox',
              lazy: page(
                () => import('@/features/outbox/components/outbox-page'),
                (m) => m.OutboxPage,
              ),
            },
            { path: '*', element: <Navigate to="/spools" replace /> },
          ],
        },
      ],
    },
  ]);
}
