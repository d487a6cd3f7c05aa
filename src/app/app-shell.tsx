import { NavLink, Outlet, useNavigate, useNavigation, useParams } from 'react-router';
import { ROLE_LABELS } from '@shared/permissions';
import { Logo } from '../components/logo';
import { useMe, useSignOut, useSwitchTeam } from '../features/auth/api/me';
import { teamPath } from './paths';

const navClass = ({ isActive }: { isActive: boolean }) =>
  `rounded-full px-4 py-2 font-bold transition ${isActive ? 'bg-ink text-paper' : 'text-ink hover:bg-paper-deep'}`;

/** The signed-in frame: logo, team switch, the workspaces, account and sign-out. */
export function AppShell() {
  const { data: me } = useMe();
  const { teamId = me?.activeTeamId ?? '' } = useParams();
  const navigate = useNavigate();
  const navigation = useNavigation();
  const switchTeam = useSwitchTeam();
  const signOut = useSignOut();
  if (!me) return null;
  const current = me.teams.find((team) => team.teamId === teamId);

  return (
    <div className="flex min-h-screen flex-col bg-paper">
      <a href="#main" className="sr-only focus:not-sr-only focus:absolute focus:left-2 focus:top-2 focus:rounded focus:bg-white focus:p-2">
        Skip to content
      </a>
      <header className="border-b-2 border-paper-edge bg-white">
        <div className="mx-auto flex max-w-7xl flex-wrap items-center gap-4 px-4 py-3">
          <NavLink to={teamPath(teamId)} aria-label="Sheetsmith home">
            <Logo />
          </NavLink>
          <label className="flex items-center gap-2 text-sm font-bold text-ink-soft">
            <span>Team</span>
            <select
              aria-label="Switch team"
              value={teamId}
              onChange={async (event) => {
                const me2 = await switchTeam.mutateAsync(event.target.value);
                navigate(teamPath(me2.activeTeamId ?? event.target.value));
              }}
              className="rounded-lg border-2 border-paper-edge bg-paper px-2 py-1 font-bold text-ink"
            >
              {me.teams.map((team) => (
                <option key={team.teamId} value={team.teamId}>
                  {team.teamName}
                </option>
              ))}
            </select>
            {current && (
              <span className="rounded-full bg-sage-light px-2 py-0.5 text-xs text-sage-deep" data-testid="role-badge">
                {ROLE_LABELS[current.role]}
              </span>
            )}
          </label>
          <nav aria-label="Workspaces" className="flex gap-1">
            <NavLink to={teamPath(teamId, 'library')} className={navClass}>
              Art library
            </NavLink>
            <NavLink to={teamPath(teamId, 'sheets')} className={navClass}>
              Sheets
            </NavLink>
            <NavLink to={teamPath(teamId, 'print-room')} className={navClass}>
              Print room
            </NavLink>
            <NavLink to={teamPath(teamId, 'orders')} className={navClass}>
              Orders
            </NavLink>
            <NavLink to={teamPath(teamId, 'team')} className={navClass}>
              Team
            </NavLink>
          </nav>
          <div className="ml-auto flex items-center gap-3">
            <NavLink to="/account" className="text-sm font-bold text-ink-soft hover:text-ink" data-testid="account-link">
              {me.user.name}
            </NavLink>
            <button
              type="button"
              onClick={async () => {
                await signOut.mutateAsync();
                navigate('/sign-in', { replace: true });
              }}
              className="rounded-full border-2 border-paper-edge px-3 py-1 text-sm font-bold text-ink hover:border-ink"
            >
              Sign out
            </button>
          </div>
        </div>
      </header>
      {/* A page whose code is still on its way (the sheet editor, the first time) shows that it is coming. */}
      <div className="h-1" role="status">
        {navigation.state === 'loading' && (
          <>
            <span className="sr-only">Opening the page…</span>
            <div className="h-1 w-full animate-pulse bg-peel" />
          </>
        )}
      </div>
      <main id="main" className="mx-auto w-full max-w-7xl flex-1 px-4 py-6">
        <Outlet />
      </main>
    </div>
  );
}
