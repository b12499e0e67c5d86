import { Navigate, Outlet, useLocation } from 'react-router-dom';
import { useMe } from '@/features/auth/api/get-me';
import { ErrorLine, LoadingLine } from '@/components/ui/spinner';

/** Route guard: signed-out visitors go to the sign-in page, which brings them back afterwards. */
export function RequireSignedIn() {
  const me = useMe();
  const location = useLocation();
  if (me.isPending) return <LoadingLine label="Checking your session…" />;
  if (me.isError)
    return (
      <div className="p-6">
        <ErrorLine error={me.error} />
      </div>
    );
  if (me.data === null) {
    const next = `${location.pathname}${location.search}`;
    return <Navigate to={`/sign-in?next=${encodeURIComponent(next)}`} replace />;
  }
  return <Outlet />;
}
