import { useParams } from 'react-router';
import type { Permission } from '@shared/permissions';
import { can } from '@shared/permissions';
import { useMe } from './api/me';

/** The signed-in user's role in the team of the current route, and a permission check. */
export function useTeamRole() {
  const { teamId } = useParams();
  const { data: me } = useMe();
  const membership = me?.teams.find((team) => team.teamId === teamId) ?? null;
  return {
    teamId: teamId ?? null,
    membership,
    role: membership?.role ?? null,
    can: (permission: Permission) => can(membership?.role, permission),
  };
}
