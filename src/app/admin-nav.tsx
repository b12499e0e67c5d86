import { NavLink } from 'react-router-dom';
import { useCan } from '@/features/auth/use-can';
import { cn } from '@/lib/cn';

const linkClass = ({ isActive }: { isActive: boolean }) => cn('rounded px-2 py-1 hover:bg-steel-700', isActive && 'bg-steel-700 text-white');

/** Header links to the team's own pages, for the roles that may use them. */
export function AdminNav() {
  const manageTeam = useCan('team:manage');
  const manageMaterials = useCan('materials:manage');
  const importSpools = useCan('spool:edit');
  const readOutbox = useCan('outbox:read');
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
