import { can, isRole, type Action, type Role } from '@shared/model/permissions';
import { useMe } from './api/get-me';

/** The signed-in member's role, or null while loading / signed out / not a known role. */
export function useRole(): Role | null {
  const { data } = useMe();
  return data && isRole(data.role) ? data.role : null;
}

/** True when the signed-in member may perform `action` (the client only hides; the server enforces). */
export function useCan(action: Action): boolean {
  return can(useRole(), action);
}
