import { describe, expect, it } from 'vitest';
import { Invite } from '../../server/modules/teams/invite.entity';
import { Membership } from '../../server/modules/accounts/membership.entity';
import { PasswordReset } from '../../server/modules/auth/password-reset.entity';
import { User } from '../../server/modules/accounts/user.entity';
import { Client, makeTeamWithRoles, makeUser, uniqueEmail, useTestApp } from '../helpers/app';
import { lastMailTo, tokenFrom } from '../helpers/outbox';

const t = useTestApp();

describe('team invites', () => {
  it('writes the invite to the outbox; the link makes a new account a member, once', async () => {
    const { team, users } = await makeTeamWithRoles(t.db);
    const admin = new Client(t.sheetsmith.app);
    await admin.signIn(users.admin.email);
    const email = uniqueEmail('newcomer');
    const created = await admin.post(`/api/teams/${team.id}/invites`, { email, role: 'member' });
    expect(created.status).toBe(201);
    // 7-day expiry
    const days = (Date.parse(created.body.expiresAt) - Date.now()) / 86_400_000;
    expect(days).toBeGreaterThan(6.99);
    expect(days).toBeLessThan(7.01);

    const mail = await lastMailTo(email);
    expect(mail.subject).toContain(team.name);
    const link = mail.links.find((l) => l.includes('/invite/'))!;
    expect(link).toMatch(/^http:\/\/127\.0\.0\.1:\d+\/invite\/[A-Za-z0-9_-]{43}$/);
    const token = tokenFrom(link);
    // Only the hash of the token is stored.
    expect(await t.db.getRepository(Invite).countBy({ tokenHash: token })).toBe(0);

    const guest = new Client(t.sheetsmith.app);
    const preview = await guest.get(`/api/invites/${token}`).expect(200);
    expect(preview.body).toMatchObject({ teamName: team.name, email, role: 'member', accountExists: false });

    const missingFields = await guest.post(`/api/invites/${token}/accept`, {});
    expect(missingFields.status).toBe(400);
    expect(Object.keys(missingFields.body.error.fields).sort()).toEqual(['name', 'password']);

    const accepted = await guest.post(`/api/invites/${token}/accept`, { name: 'New Comer', password: 'fresh-password-1' });
    expect(accepted.status).toBe(200);
    expect(accepted.body.activeTeamId).toBe(team.id);
    const user = await t.db.getRepository(User).findOneByOrFail({ email });
    expect(await t.db.getRepository(Membership).findOneBy({ teamId: team.id, userId: user.id })).toMatchObject({ role: 'member' });
    // The newcomer also got a personal studio.
    expect(accepted.body.teams).toHaveLength(2);

    const again = await new Client(t.sheetsmith.app).post(`/api/invites/${token}/accept`, { name: 'Second', password: 'fresh-password-2' });
    expect(again.status).toBe(410);
    expect((await new Client(t.sheetsmith.app).get(`/api/invites/${token}`)).status).toBe(410);
  });

  it('lets an existing user accept only when signed in as the invited e-mail', async () => {
    const { team, users } = await makeTeamWithRoles(t.db);
    const existing = await makeUser(t.db, 'existing');
    const stranger = await makeUser(t.db, 'stranger');
    const owner = new Client(t.sheetsmith.app);
    await owner.signIn(users.owner.email);
    await owner.post(`/api/teams/${team.id}/invites`, { email: existing.email, role: 'viewer' });
    const token = tokenFrom((await lastMailTo(existing.email)).links.find((l) => l.includes('/invite/'))!);

    const signedOut = await new Client(t.sheetsmith.app).post(`/api/invites/${token}/accept`, { name: 'x', password: 'long-password-x' });
    expect(signedOut.status).toBe(401);

    const wrongUser = new Client(t.sheetsmith.app);
    await wrongUser.signIn(stranger.email);
    expect((await wrongUser.post(`/api/invites/${token}/accept`, {})).status).toBe(403);

    const rightUser = new Client(t.sheetsmith.app);
    await rightUser.signIn(existing.email);
    expect((await rightUser.post(`/api/invites/${token}/accept`, {})).status).toBe(200);
    expect(await t.db.getRepository(Membership).findOneBy({ teamId: team.id, userId: existing.id })).toMatchObject({ role: 'viewer' });
    expect(await t.db.getRepository(Membership).findOneBy({ teamId: team.id, userId: stranger.id })).toBeNull();
  });

  it('refuses an expired or withdrawn invite', async () => {
    const { team, users } = await makeTeamWithRoles(t.db);
    const owner = new Client(t.sheetsmith.app);
    await owner.signIn(users.owner.email);
    const expiredEmail = uniqueEmail('late');
    await owner.post(`/api/teams/${team.id}/invites`, { email: expiredEmail, role: 'member' });
    const expiredToken = tokenFrom((await lastMailTo(expiredEmail)).links.find((l) => l.includes('/invite/'))!);
    await t.db.getRepository(Invite).update({ email: expiredEmail }, { expiresAt: new Date(Date.now() - 1000) });
    expect((await new Client(t.sheetsmith.app).get(`/api/invites/${expiredToken}`)).status).toBe(410);

    const withdrawnEmail = uniqueEmail('withdrawn');
    const created = await owner.post(`/api/teams/${team.id}/invites`, { email: withdrawnEmail, role: 'member' });
    const withdrawnToken = tokenFrom((await lastMailTo(withdrawnEmail)).links.find((l) => l.includes('/invite/'))!);
    expect((await owner.send('delete', `/api/teams/${team.id}/invites/${created.body.id}`)).status).toBe(204);
    const res = await new Client(t.sheetsmith.app).post(`/api/invites/${withdrawnToken}/accept`, {
      name: 'W',
      password: 'long-password-w',
    });
    expect(res.status).toBe(410);
    expect(await t.db.getRepository(User).countBy({ email: withdrawnEmail })).toBe(0);
  });
});

describe('password reset', () => {
  async function requestReset(email: string) {
    const res = await new Client(t.sheetsmith.app).post('/api/auth/password-reset', { email });
    expect(res.status).toBe(200);
    const link = (await lastMailTo(email)).links.find((l) => l.includes('/reset-password/'))!;
    return tokenFrom(link);
  }

  it('resets once: the new password works, the old one and the link stop working', async () => {
    const user = await makeUser(t.db, 'forgetful');
    const token = await requestReset(user.email);
    const row = await t.db.getRepository(PasswordReset).findOneByOrFail({ userId: user.id });
    // 1-hour expiry
    expect(Math.abs(row.expiresAt.getTime() - Date.now() - 3_600_000)).toBeLessThan(60_000);

    const client = new Client(t.sheetsmith.app);
    expect((await client.get(`/api/auth/password-reset/${token}`)).body.email).toBe(user.email);
    expect((await client.post(`/api/auth/password-reset/${token}`, { password: 'brand-new-password' })).status).toBe(200);
    expect((await client.post(`/api/auth/password-reset/${token}`, { password: 'another-new-password' })).status).toBe(410);

    expect(
      (await new Client(t.sheetsmith.app).post('/api/auth/sign-in', { email: user.email, password: 'brand-new-password' })).status,
    ).toBe(200);
    expect(
      (await new Client(t.sheetsmith.app).post('/api/auth/sign-in', { email: user.email, password: 'another-new-password' })).status,
    ).toBe(401);
  });

  it('refuses an expired link and leaves the password unchanged', async () => {
    const user = await makeUser(t.db, 'slow');
    const token = await requestReset(user.email);
    await t.db.getRepository(PasswordReset).update({ userId: user.id }, { expiresAt: new Date(Date.now() - 1000) });
    const before = (await t.db.getRepository(User).findOneByOrFail({ id: user.id })).passwordHash;
    const res = await new Client(t.sheetsmith.app).post(`/api/auth/password-reset/${token}`, { password: 'too-late-password' });
    expect(res.status).toBe(410);
    expect(res.body.error.code).toBe('token_invalid');
    expect((await t.db.getRepository(User).findOneByOrFail({ id: user.id })).passwordHash).toBe(before);
  });

  it('answers the same for an unknown e-mail and sends nothing', async () => {
    const email = uniqueEmail('nobody');
    const res = await new Client(t.sheetsmith.app).post('/api/auth/password-reset', { email });
    expect(res.status).toBe(200);
    await expect(lastMailTo(email)).rejects.toThrow(/no e-mail/);
  });

  it('answers a malformed token with 400 and field messages', async () => {
    const res = await new Client(t.sheetsmith.app).post('/api/auth/password-reset/bad!token', { password: 'x' });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toMatchObject({ 'params.token': 'That link is not valid', password: 'Use at least 10 characters' });
  });
});
