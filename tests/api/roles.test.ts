import { describe, expect, it } from 'vitest';
import type { Permission, Role } from '@shared/permissions';
import { PERMISSIONS } from '@shared/permissions';
import { requirePermission, teamScope } from '../../server/middleware/auth';
import { Team } from '../../server/modules/accounts/team.entity';
import { Client, makeTeamWithRoles, makeUser, useTestApp, uniqueEmail } from '../helpers/app';

// The role table written out by hand, independently of shared/permissions.ts: if someone edits
// the shared table, this test says which cell changed.
const EXPECTED: Record<Permission, Record<Role, boolean>> = {
  'team.view': { owner: true, admin: true, member: true, viewer: true },
  'team.settings': { owner: true, admin: true, member: false, viewer: false },
  'team.members': { owner: true, admin: true, member: false, viewer: false },
  'team.delete': { owner: true, admin: false, member: false, viewer: false },
  'library.manage': { owner: true, admin: true, member: false, viewer: false },
  'library.contribute': { owner: true, admin: true, member: true, viewer: false },
  'sheets.edit': { owner: true, admin: true, member: true, viewer: false },
  'shop.record': { owner: true, admin: true, member: true, viewer: false },
  'shop.manage': { owner: true, admin: true, member: false, viewer: false },
  'orders.view': { owner: true, admin: true, member: true, viewer: true },
  'orders.quote': { owner: true, admin: true, member: true, viewer: false },
  'orders.payments': { owner: true, admin: true, member: false, viewer: false },
  'orders.money': { owner: true, admin: true, member: true, viewer: false },
};
const ROLE_LIST: Role[] = ['owner', 'admin', 'member', 'viewer'];

// A probe route per permission, guarded by the same middleware the real routes use. Library and
// sheet routes arrive with their issues; until then the probe stands in for their guard.
const t = useTestApp({
  extra: (dataSource) => ({
    extraApi: (api) => {
      api.post('/teams/:teamId/probe/:permission', teamScope(dataSource), (req, res, next) =>
        requirePermission(req.params.permission as Permission)(req, res, (error?: unknown) =>
          error ? next(error) : res.json({ allowed: true }),
        ),
      );
    },
  }),
});

describe('the role table', () => {
  it('covers every permission the product defines', () => {
    expect(Object.keys(EXPECTED).sort()).toEqual(Object.keys(PERMISSIONS).sort());
  });

  it('lets each role do exactly what the table says, through the permission middleware', async () => {
    const { team, users } = await makeTeamWithRoles(t.db);
    for (const role of ROLE_LIST) {
      const client = new Client(t.sheetsmith.app);
      await client.signIn(users[role].email);
      for (const permission of Object.keys(EXPECTED) as Permission[]) {
        const res = await client.post(`/api/teams/${team.id}/probe/${permission}`);
        const expected = EXPECTED[permission][role] ? 200 : 403;
        expect({ role, permission, status: res.status }).toEqual({ role, permission, status: expected });
        if (expected === 403) expect(res.body.error.code).toBe('forbidden');
      }
    }
  });

  it('enforces the table on the real team routes for every role', async () => {
    for (const role of ROLE_LIST) {
      const { team, users } = await makeTeamWithRoles(t.db);
      const client = new Client(t.sheetsmith.app);
      await client.signIn(users[role].email);

      const view = await client.get(`/api/teams/${team.id}`);
      expect(view.status).toBe(200);
      expect(view.body.members).toHaveLength(4);

      const rename = await client.send('patch', `/api/teams/${team.id}`, { name: `Renamed by ${role}` });
      expect(rename.status).toBe(EXPECTED['team.settings'][role] ? 200 : 403);

      const invite = await client.post(`/api/teams/${team.id}/invites`, { email: uniqueEmail('inv'), role: 'viewer' });
      expect(invite.status).toBe(EXPECTED['team.members'][role] ? 201 : 403);

      const demote = await client.send('patch', `/api/teams/${team.id}/members/${users.viewer.id}`, { role: 'member' });
      expect(demote.status).toBe(EXPECTED['team.members'][role] ? 200 : 403);

      const remove = await client.send('delete', `/api/teams/${team.id}`);
      expect(remove.status).toBe(EXPECTED['team.delete'][role] ? 204 : 403);
      expect(await t.db.getRepository(Team).existsBy({ id: team.id })).toBe(!EXPECTED['team.delete'][role]);
    }
  });

  it('keeps admins from touching owners and keeps one owner in every team', async () => {
    const { team, users } = await makeTeamWithRoles(t.db);
    const admin = new Client(t.sheetsmith.app);
    await admin.signIn(users.admin.email);
    expect((await admin.send('patch', `/api/teams/${team.id}/members/${users.owner.id}`, { role: 'viewer' })).status).toBe(403);
    expect((await admin.send('patch', `/api/teams/${team.id}/members/${users.member.id}`, { role: 'owner' })).status).toBe(403);
    expect((await admin.post(`/api/teams/${team.id}/invites`, { email: uniqueEmail('o'), role: 'owner' })).status).toBe(403);

    const owner = new Client(t.sheetsmith.app);
    await owner.signIn(users.owner.email);
    const leave = await owner.send('delete', `/api/teams/${team.id}/members/${users.owner.id}`);
    expect(leave.status).toBe(409);
  });
});

describe('cross-team access', () => {
  it('answers 404 for another team, the same as for a team that does not exist', async () => {
    const mine = await makeTeamWithRoles(t.db);
    const theirs = await makeTeamWithRoles(t.db);
    const client = new Client(t.sheetsmith.app);
    await client.signIn(mine.users.owner.email);

    const other = await client.get(`/api/teams/${theirs.team.id}`);
    const missing = await client.get('/api/teams/999999999');
    expect(other.status).toBe(404);
    expect(missing.status).toBe(404);
    expect(other.body.error.code).toBe('not_found');
    expect(other.body.error.message).toBe(missing.body.error.message);

    expect((await client.send('patch', `/api/teams/${theirs.team.id}`, { name: 'Hijacked' })).status).toBe(404);
    expect((await client.post(`/api/teams/${theirs.team.id}/invites`, { email: uniqueEmail('x'), role: 'member' })).status).toBe(404);
    expect((await client.send('delete', `/api/teams/${theirs.team.id}/members/${theirs.users.viewer.id}`)).status).toBe(404);
    expect((await client.send('put', '/api/me/active-team', { teamId: theirs.team.id })).status).toBe(404);
    expect((await t.db.getRepository(Team).findOneByOrFail({ id: theirs.team.id })).name).toBe(theirs.team.name);
  });

  it('lets a user in several teams switch between them', async () => {
    const a = await makeTeamWithRoles(t.db);
    const b = await makeTeamWithRoles(t.db);
    const user = await makeUser(t.db, 'both', { teamId: a.team.id, role: 'member' });
    await t.db.query('INSERT INTO memberships (team_id, user_id, role) VALUES (?, ?, ?)', [b.team.id, user.id, 'viewer']);
    const client = new Client(t.sheetsmith.app);
    await client.signIn(user.email);
    const switched = await client.send('put', '/api/me/active-team', { teamId: b.team.id });
    expect(switched.status).toBe(200);
    expect(switched.body.activeTeamId).toBe(b.team.id);
    expect((await client.get('/api/me')).body.activeTeamId).toBe(b.team.id);
  });
});
