import { lazy, Suspense } from 'react';
import { Link, NavLink, Outlet, useNavigate } from 'react-router-dom';
import { useMe } from '@/features/auth/api/get-me';
import { cn } from '@/lib/cn';
import { AdminNav } from './admin-nav';

// The count's query and schemas load with their own chunk, not with the shell.
const WaitingCount = lazy(() =>
  import('@/features/review/components/waiting-list').then((m) => ({ default: m.WaitingCount })),
);

const roleLabel: Record<string, string> = {
  designer: 'Designer',
  checker: 'Checker',
  fabricator: 'Fabricator',
  lead: 'Lead',
  admin: 'Team admin',
};

/** The frame around every signed-in screen: brand, navigation, who is signed in, sign-out. */
export function AppLayout() {
  const { data: me } = useMe();
  const navigate = useNavigate();
  return (
    <div className="flex h-screen flex-col font-sans print:block print:h-auto">
      <header className="flex h-11 shrink-0 print:hidden items-center gap-4 border-b border-steel-700 bg-steel-800 px-4 text-steel-100">
        <Link
          to="/spools"
          className="flex items-center gap-2 text-base font-semibold tracking-wide text-white"
        >
          <span aria-hidden className="inline-block h-3 w-3 rotate-45 border-2 border-copper-400" />
          Spoolwright
        </Link>
        <nav className="flex gap-1 text-sm">
          <NavLink
            to="/spools"
            end
            className={({ isActive }) =>
              cn('rounded px-2 py-1 hover:bg-steel-700', isActive && 'bg-steel-700 text-white')
            }
          >
            Spool register
          </NavLink>
          {me?.role ? (
            <Suspense fallback={null}>
              <WaitingCount />
            </Suspense>
          ) : null}
          <AdminNav />
        </nav>
        <div className="ml-auto flex items-center gap-3 text-sm" data-testid="whoami">
          {me ? (
            <>
              <span className="text-steel-100">{me.user.name || me.user.email}</span>
              {me.team ? <span className="text-steel-300">{me.team.name}</span> : null}
              <span
                data-testid="role"
                className="rounded bg-steel-700 px-1.5 py-px text-xs uppercase tracking-wide text-copper-400"
              >
                {me.role ? (roleLabel[me.role] ?? me.role) : 'no team'}
              </span>
            </>
          ) : null}
          <button
            type="button"
            className="rounded border border-steel-600 px-2 py-0.5 text-xs text-steel-100 hover:bg-steel-700 hover:text-white"
            onClick={() => void navigate('/sign-out')}
          >
            Sign out
          </button>
        </div>
      </header>
      <div className="min-h-0 flex-1 print:min-h-fit">
        <Outlet />
      </div>
    </div>
  );
}
