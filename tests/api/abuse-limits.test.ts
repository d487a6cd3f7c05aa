import bcrypt from 'bcryptjs';
import { describe, expect, it } from 'vitest';
import { listOutbox } from '../../server/mail/mailer';
import { env } from '../../server/config/env';
import { User } from '../../server/modules/accounts/user.entity';
import { hashPassword, passwordTasksCompleted, verifyPassword } from '../../server/modules/auth/passwords';
import { Client, makeTeamWithRoles, makeUser, openDatabase, testApp, unique, uniqueEmail } from '../helpers/app';
import { afterAll, beforeAll } from 'vitest';
import type { DataSource } from 'typeorm';

const mailsTo = async (to: string) => (await listOutbox(env.outboxDir)).filter((m) => m.to.includes(to)).length;

let db: DataSource;
beforeAll(async () => {
  db = await openDatabase();
});
afterAll(async () => db?.destroy());

/** Two apps over one database with one counter prefix: what two app processes of one shop are. */
function twoProcesses(overrides: Parameters<typeof testApp>[1]) {
  const rateLimitPrefix = unique('shop');
  const a = testApp(db, overrides, { rateLimitPrefix });
  const b = testApp(db, overrides, { rateLimitPrefix });
  return { a, b, close: () => Promise.all([a.close(), b.close()]) };
}

describe('password hashing', () => {
  it('runs on worker threads and gives real bcrypt hashes (checked with bcryptjs here)', async () => {
    const before = passwordTasksCompleted();
    const hash = await hashPassword('a long enough password');
    expect(bcrypt.compareSync('a long enough password', hash)).toBe(true);
    expect(hash).toMatch(new RegExp(`^\\$2[aby]\\$${String(env.BCRYPT_COST).padStart(2, '0')}\\$`));
    expect(await verifyPassword('a long enough password', hash)).toBe(true);
    expect(await verifyPassword('a wrong password', hash)).toBe(false);
    expect(passwordTasksCompleted() - before).toBe(3);
  });
});

describe('rate limits kept in the database', () => {
  it('sign-ups per client address hold across two app processes', async () => {
    const shop = twoProcesses({ LIMIT_SIGNUPS_PER_HOUR: 2 });
    try {
      const signUp = (app: typeof shop.a, email: string) =>
        new Client(app.app).post('/api/auth/sign-up', { name: 'Maker', email, password: 'fresh-password-1' });
      expect((await signUp(shop.a, uniqueEmail('s1'))).status).toBe(200);
      expect((await signUp(shop.b, uniqueEmail('s2'))).status).toBe(200);
      const refusedEmail = uniqueEmail('s3');
      const refused = await signUp(shop.a, refusedEmail);
      expect(refused.status).toBe(429);
      expect(refused.body.error.message).toMatch(/^Too many new accounts from your network\. Wait about \d+ minutes? and try again\.$/);
      expect(Number(refused.headers['retry-after'])).toBeGreaterThan(3000);
      expect(await db.getRepository(User).countBy({ email: refusedEmail })).toBe(0);
    } finally {
      await shop.close();
    }
  });

  it('reset e-mails per address: the third in an hour is refused, sends nothing, and other addresses still work', async () => {
    const shop = twoProcesses({ LIMIT_RESETS_PER_HOUR: 2 });
    try {
      const user = await makeUser(db, 'resetter');
      const ask = (app: typeof shop.a, email: string) => new Client(app.app).post('/api/auth/password-reset', { email });
      expect((await ask(shop.a, user.email)).status).toBe(200);
      expect((await ask(shop.b, user.email)).status).toBe(200);
      expect(await mailsTo(user.email)).toBe(2);
      const refused = await ask(shop.a, user.email);
      expect(refused.status).toBe(429);
      expect(refused.body.error.message).toContain('Too many reset e-mails for that address');
      expect(await mailsTo(user.email)).toBe(2);
      // An address with no account is counted the same way, so a 429 says nothing about accounts.
      const nobody = uniqueEmail('nobody');
      expect((await ask(shop.a, nobody)).status).toBe(200);
      expect((await ask(shop.a, nobody)).status).toBe(200);
      expect((await ask(shop.a, nobody)).status).toBe(429);
      const other = await makeUser(db, 'other');
      expect((await ask(shop.b, other.email)).status).toBe(200);
    } finally {
      await shop.close();
    }
  });

  it('invites per account and per recipient are limited; the refused invite is not stored or mailed', async () => {
    const shop = twoProcesses({ LIMIT_INVITES_PER_HOUR: 4 });
    try {
      const { team, users } = await makeTeamWithRoles(db);
      const owner = new Client(shop.a.app);
      await owner.signIn(users.owner.email);
      const repeat = uniqueEmail('again');
      for (let i = 0; i < 3; i++)
        expect((await owner.post(`/api/teams/${team.id}/invites`, { email: repeat, role: 'member' })).status).toBe(201);
      const fourthToSame = await owner.post(`/api/teams/${team.id}/invites`, { email: repeat, role: 'member' });
      expect(fourthToSame.status).toBe(429);
      expect(fourthToSame.body.error.message).toContain('That address has been invited several times today');
      expect(await mailsTo(repeat)).toBe(3);
      // The refused try above still counted against the account: 4 of 4 used.
      const ownerOnB = new Client(shop.b.app);
      await ownerOnB.signIn(users.owner.email);
      const fresh = uniqueEmail('fresh');
      const overAccount = await ownerOnB.post(`/api/teams/${team.id}/invites`, { email: fresh, role: 'member' });
      expect(overAccount.status).toBe(429);
      expect(overAccount.body.error.message).toContain('You have sent a lot of invites in the last hour');
      expect(await mailsTo(fresh)).toBe(0);
      // Another admin of the team has an allowance of their own (the team's is 12 a day).
      const admin = new Client(shop.a.app);
      await admin.signIn(users.admin.email);
      expect((await admin.post(`/api/teams/${team.id}/invites`, { email: fresh, role: 'member' })).status).toBe(201);
    } finally {
      await shop.close();
    }
  });

  it('failed sign-ins are counted across two app processes', async () => {
    const shop = twoProcesses({ LOGIN_MAX_FAILURES: 3 });
    try {
      const user = await makeUser(db, 'guessed');
      const attempt = (app: typeof shop.a, password: string) =>
        new Client(app.app).post('/api/auth/sign-in', { email: user.email, password });
      expect((await attempt(shop.a, 'wrong-one-1')).status).toBe(401);
      expect((await attempt(shop.b, 'wrong-one-2')).status).toBe(401);
      expect((await attempt(shop.a, 'wrong-one-3')).status).toBe(401);
      const blocked = await attempt(shop.b, 'correct-horse-battery');
      expect(blocked.status).toBe(429);
      expect(blocked.body.error.message).toMatch(
        /^Too many failed sign-ins\. Wait about \d+ minutes? and try again, or reset your password\.$/,
      );
      // No e-mail or address is stored in the clear.
      const rows: { key: string }[] = await db.query('SELECT `key` FROM rate_limits');
      expect(rows.some((row) => row.key.includes(user.email) || row.key.includes('127.0.0.1'))).toBe(false);
    } finally {
      await shop.close();
    }
  });
});
