import { lazy, Suspense } from 'react';
import { createBrowserRouter, Navigate, useRouteError } from 'react-router-dom';
import { SignInPage } from '@/features/auth/components/sign-in-page';
import { SignOutPage } from '@/features/auth/components/sign-out-page';
import { SpoolListPage } from '@/features/spools/components/spool-list-page';
import { ErrorLine, LoadingLine } from '@/components/ui/spinner';
import { AppLayout } from './app-layout';
import { RequireSignedIn } from './require-signed-in';

// The sketcher carries the 3D canvas: keep it out of the first download.
const SketchPage = lazy(() => import('@/features/sketch/sketch-page').then((m) => ({ default: m.SketchPage })));
const CalcSheetPage = lazy(() => import('@/features/calc-sheet/components/calc-sheet-page').then((m) => ({ default: m.CalcSheetPage })));

function RouteErrorView() {
  const error = useRouteError();
  return (
    <div className="p-6 font-sans">
      <h1 className="mb-2 text-lg font-semibold text-steel-800">Something went wrong</h1>
      <ErrorLine error={error instanceof Error ? error : new Error('this page could not be shown')} />
    </div>
  );
}

/** Route table of the app (a data router, so the sketcher can guard unsaved edits with useBlocker). */
export function createAppRouter() {
  return createBrowserRouter([
    { path: '/sign-in', element: <SignInPage />, errorElement: <RouteErrorView /> },
    { path: '/sign-out', element: <SignOutPage />, errorElement: <RouteErrorView /> },
    {
      element: <RequireSignedIn />,
      errorElement: <RouteErrorView />,
      children: [
        {
          element: <AppLayout />,
          children: [
            { index: true, element: <Navigate to="/spools" replace /> },
            { path: '/spools', element: <SpoolListPage /> },
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
            { path: '*', element: <Navigate to="/spools" replace /> },
          ],
        },
      ],
    },
  ]);
}
