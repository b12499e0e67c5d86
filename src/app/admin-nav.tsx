import { NavLink } from 'react-router-dom';
import { useMe } from '@/features/auth/api/get-me';
import { cn } from '@/lib/cn';

const linkClass = ({ isActive }: { isActive: boolean }) =>
  cn('rounded px-2 py-1 hover:bg-steel-700', isActive && 'bg-steel-700 text-white');

/**
 * Header links to the team's own pages, for the roles that may use them. Reads the actions the
 * server lists in /api/me (not the permission table), so the shell stays small.
 */
export function AdminNav() {
  const allowed = new Set(useMe().data?.permissions ?? []);
  const manageTeam = allowed.has('team:manage');
  const manageMaterials = allowed.has('materials:manage');
  const importSpools = allowed.has('spool:edit');
  const readOutbox = allowed.has('outbox:read');
  return (
    <>
      {importSpools ? (
        <NavLink to="/line-list" className={linkClass}>
          Line-list import
        </NavLink>
      ) : null}
      {manageTeam ? (
        <NavLink to="/team" className={linkClass}>
          Members
        </NavLink>
      ) : null}
      {manageMaterials ? (
        <NavLink to="/materials" className={linkClass}>
          Materials
        </NavLink>
      ) : null}
      {readOutbox ? (
        <NavLink to="/outbox" className={linkClass}>
          Outbox
        </NavLink>
      ) : null}
    </>
  );
}
