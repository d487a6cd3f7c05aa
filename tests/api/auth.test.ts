import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { User } from '../../server/modules/accounts/user.entity';
import { Membership } from '../../server/modules/accounts/membership.entity';
import { Team } from '../../server/modules/accounts/team.entity';
import { Client, TEST_PASSWORD, makeUser, testApp, unique, uniqueEmail, useTestApp } from '../helpers/app';

const t = useTestApp();

describe('health', () => {
  it('reports the app and the database up', async () => {
    const res = await request(t.sheetsmith.app).get('/api/health').expect(200);
    expect(res.body).toMatchObject({ app: 'up', database: 'up' });
  });
});

describe('sign-up', () => {
  it('creates the account, a personal studio it owns, and signs in', async () => {
    const client = new Client(t.sheetsmith.app);
    const email = uniqueEmail('maker');
    // E-mails are stored trimmed and lower-cased, so "ADA@…" and "ada@…" are one account.
    const res = await client.post('/api/auth/sign-up', {
      name: 'Ada Pennywhistle',
      email: ` ${email.toUpperCase()}`,
      password: 'long-enough-pw',
    });
    expect(res.status).toBe(200);
    expect(res.body.user).toMatchObject({ email, name: 'Ada Pennywhistle', unit: 'in' });
    expect(res.body.teams).toHaveLength(1);
    expect(res.body.teams[0]).toMatchObject({ role: 'owner', personal: true, teamName: "Ada Pennywhistle's studio" });

    const stored = await t.db.getRepository(User).findOneByOrFail({ email });
    // bcrypt, cost 12 (modular crypt format "$2b$12$…")
    expect(stored.passwordHash).toMatch(/^\$2[aby]\$12\$/);
    const memberships = await t.db.getRepository(Membership).findBy({ userId: stored.id });
    expect(memberships.map((m) => m.role)).toEqual(['owner']);

    await client.get('/api/me').expect(200);
  });

  it('refuses a taken e-mail with a field message and creates nothing', async () => {
    const existing = await makeUser(t.db, 'taken');
    const name = unique('Second Comer');
    const res = await new Client(t.sheetsmith.app).post('/api/auth/sign-up', { name, email: existing.email, password: 'long-enough-pw' });
    expect(res.status).toBe(409);
    expect(res.body.error.fields.email).toMatch(/already exists/);
    // The transaction rolled back: no personal studio was left behind for the refused sign-up.
    expect(await t.db.getRepository(Team).countBy({ name: `${name}'s studio` })).toBe(0);
  });

  it('answers bad fields with 400 and one message per field (zod)', async () => {
    const res = await new Client(t.sheetsmith.app).post('/api/auth/sign-up', { name: '', email: 'not-an-email', password: 'short' });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('validation_failed');
    expect(Object.keys(res.body.error.fields).sort()).toEqual(['email', 'name', 'password']);
    expect(res.body.error.fields.password).toBe('Use at least 10 characters');
    expect(res.body.error.fields.email).toMatch(/e-mail address like/);
  });

  it('answers a malformed JSON body with 400, not 500', async () => {
    const client = new Client(t.sheetsmith.app);
    await client.refreshCsrf();
    const res = await client.agent
      .post('/api/auth/sign-up')
      .set('x-csrf-token', client.csrf)
      .set('content-type', 'application/json')
      .send('{"name": ');
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('validation_failed');
  });
});

describe('sign-in and sign-out', () => {
  it('signs in, regenerating the session id, and signs out', async () => {
    const user = await makeUser(t.db, 'signin');
    const client = new Client(t.sheetsmith.app);
    const before = await client.agent.get('/api/auth/csrf');
    const cookieBefore = String(before.headers['set-cookie']);
    const res = await client.signIn(user.email);
    const cookieAfter = String(res.headers['set-cookie']);
    expect(cookieAfter).toMatch(/sheetsmith\.sid=/);
    expect(cookieAfter).toMatch(/HttpOnly/i);
    expect(cookieAfter).toMatch(/SameSite=Lax/i);
    // No session fixation: the pre-sign-in session id is not the signed-in one.
    const sid = (cookie: string) => /sheetsmith\.sid=([^;]+)/.exec(cookie)?.[1];
    expect(sid(cookieAfter)).toBeDefined();
    expect(sid(cookieAfter)).not.toBe(sid(cookieBefore));

    const me = await client.get('/api/me').expect(200);
    expect(me.body.user.email).toBe(user.email);

    const out = await client.post('/api/auth/sign-out');
    expect(out.status).toBe(204);
    await client.get('/api/me').expect(401);
  });

  it('gives one generic message for a wrong password and for an unknown e-mail', async () => {
    const user = await makeUser(t.db, 'wrongpw');
    const wrongPassword = await new Client(t.sheetsmith.app).post('/api/auth/sign-in', { email: user.email, password: 'nope-nope-nope' });
    const unknownEmail = await new Client(t.sheetsmith.app).post('/api/auth/sign-in', {
      email: uniqueEmail('ghost'),
      password: TEST_PASSWORD,
    });
    expect(wrongPassword.status).toBe(401);
    expect(unknownEmail.status).toBe(401);
    expect(wrongPassword.body).toEqual(unknownEmail.body);
    expect(wrongPassword.body.error.code).toBe('bad_credentials');
  });

  it('answers 401 for protected routes when signed out', async () => {
    const res = await request(t.sheetsmith.app).get('/api/me');
    expect(res.status).toBe(401);
    expect(res.body.error.code).toBe('unauthenticated');
  });

  it('keeps the session across a server restart (sessions live in MariaDB)', async () => {
    const user = await makeUser(t.db, 'restart');
    const first = testApp(t.db);
    const client = new Client(first.app);
    const res = await client.signIn(user.email);
    const cookie = String(res.headers['set-cookie']).split(';')[0];
    await first.close();

    const second = testApp(t.db);
    try {
      const me = await request(second.app).get('/api/me').set('cookie', cookie);
      expect(me.status).toBe(200);
      expect(me.body.user.email).toBe(user.email);
    } finally {
      await second.close();
    }
  });
});

describe('CSRF protection', () => {
  it('rejects a state-changing request without the token, and with a wrong one', async () => {
    const user = await makeUser(t.db, 'csrf');
    const client = new Client(t.sheetsmith.app);
    await client.signIn(user.email);

    const missing = await client.agent.patch('/api/me').send({ name: 'Changed' });
    expect(missing.status).toBe(403);
    expect(missing.body.error.code).toBe('csrf_invalid');
    const wrong = await client.agent.patch('/api/me').set('x-csrf-token', 'f'.repeat(64)).send({ name: 'Changed' });
    expect(wrong.status).toBe(403);
    expect((await t.db.getRepository(User).findOneByOrFail({ id: user.id })).name).toBe('csrf');

    const ok = await client.send('patch', '/api/me', { name: 'Changed' });
    expect(ok.status).toBe(200);
    expect((await t.db.getRepository(User).findOneByOrFail({ id: user.id })).name).toBe('Changed');
  });

  it('rejects a sign-in posted without a token (login CSRF)', async () => {
    const user = await makeUser(t.db, 'logincsrf');
    const res = await request(t.sheetsmith.app).post('/api/auth/sign-in').send({ email: user.email, password: TEST_PASSWORD });
    expect(res.status).toBe(403);
  });
});

describe('sign-in throttling', () => {
  it('blocks an e-mail after the set number of failures, even with the right password, with Retry-After', async () => {
    const throttled = testApp(t.db, { LOGIN_MAX_FAILURES: 3, LOGIN_BLOCK_SECONDS: 600 });
    try {
      const user = await makeUser(t.db, 'throttle');
      const client = new Client(throttled.app);
      for (let i = 0; i < 3; i++) {
        const res = await client.post('/api/auth/sign-in', { email: user.email, password: 'wrong-password' });
        expect(res.status).toBe(401);
      }
      const blocked = await client.post('/api/auth/sign-in', { email: user.email, password: TEST_PASSWORD });
      expect(blocked.status).toBe(429);
      expect(blocked.body.error.code).toBe('too_many_attempts');
      expect(Number(blocked.headers['retry-after'])).toBeGreaterThan(500);

      // Another account from the same address is not locked by those failures.
      const other = await makeUser(t.db, 'throttle-other');
      await new Client(throttled.app).signIn(other.email);
    } finally {
      await throttled.close();
    }
  });
});
