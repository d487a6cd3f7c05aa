import type { Me } from '@shared/schemas/auth';

export const teamPath = (teamId: string, section: 'library' | 'sheets' | 'print-room' | 'orders' | 'team' = 'library') =>
  `/t/${teamId}/${section}`;

export const homePath = (me: Me) => (me.activeTeamId ? teamPath(me.activeTeamId) : '/account');

/** Only same-site paths are followed after sign-in (no open redirect). */
export function safeNext(next: string | null): string | null {
  if (!next || !next.startsWith('/') || next.startsWith('//') || next.startsWith('/\\')) return null;
  return next;
}
