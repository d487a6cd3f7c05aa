import { execFile } from 'node:child_process';
import { promisify } from 'node:util';
import { describe, expect, it } from 'vitest';
import { LOCAL_SESSION_SECRET, loadEnv } from '../../server/config/env';
import { DEMO_ACCOUNTS, DEMO_PASSWORD, DEMO_SHOP, DEMO_TEAM_KEY } from '../../server/db/demo/accounts';
import { seedDemo } from '../../server/db/demo/seed';
import { Membership } from '../../server/modules/accounts/membership.entity';
import { Team } from '../../server/modules/accounts/team.entity';
import { User } from '../../server/modules/accounts/user.entity';
import { Client, makeTeam, makeUser, scratchDatabase, testApp, useTestApp } from '../helpers/app';

const run = promisify(execFile);
const t = useTestApp();

describe('demo mode', () => {
  it('is on only on a laptop: loopback HOST and the local secret, unless DEMO says otherwise', () => {
    const base = { NODE_ENV: 'test' } as NodeJS.ProcessEnv;
    expect(loadEnv({ ...base }).demoMode).toBe(true);
    expect(loadEnv({ ...base, HOST: 'localhost' }).demoMode).toBe(true);
    expect(loadEnv({ ...base, DEMO: 'off' }).demoMode).toBe(false);
    expect(loadEnv({ ...base, SESSION_SECRET: 'a-secret-of-this-shop-only-0123456789' }).demoMode).toBe(false);
    expect(loadEnv({ ...base, SESSION_SECRET: 'a-secret-of-this-shop-only-0123456789', DEMO: 'on' }).demoMode).toBe(true);
    // A server others can reach never has the demo accounts, whatever DEMO says.
    expect(loadEnv({ ...base, HOST: '0.0.0.0', SESSION_SECRET: 'a-secret-of-this-shop-only-0123456789', DEMO: 'on' }).demoMode).toBe(false);
  });

  it('npm start on a laptop (production build, demo mode on, no SMTP) lists the outbox, where invites and resets go; a live shop does not', async () => {
    const laptop = testApp(t.db, { NODE_ENV: 'production', demoMode: true });
    const live = testApp(t.db, { NODE_ENV: 'production', demoMode: false });
    try {
      const listed = await new Client(laptop.app).get('/api/dev/outbox');
      expect(listed.status).toBe(200);
      expect(Array.isArray(listed.body.messages)).toBe(true);
      const hidden = await new Client(live.app).get('/api/dev/outbox');
      expect(hidden.status).toBe(404);
      expect(hidden.body.error.message).not.toMatch(/No API route|GET/);
    } finally {
      await laptop.close();
      await live.close();
    }
  });

  it('refuses to start on a non-loopback HOST with a published session secret, saying why', () => {
    expect(() => loadEnv({ NODE_ENV: 'test', HOST: '0.0.0.0' } as NodeJS.ProcessEnv)).toThrow(/SESSION_SECRET is the published default/);
    expect(() =>
      loadEnv({ NODE_ENV: 'test', HOST: '10.1.2.3', SESSION_SECRET: 'change-me-to-a-long-random-string' } as NodeJS.ProcessEnv),
    ).toThrow(/openssl rand/);
    expect(LOCAL_SESSION_SECRET.length).toBeGreaterThanOrEqual(16);
  });

  it('npm start’s seed step with DEMO=off seeds nothing and prints no password', async () => {
    const { stdout } = await run('npx', ['--no-install', 'tsx', 'scripts/seed.ts'], {
      env: { ...process.env, NODE_ENV: 'production', DEMO: 'off' },
    });
    expect(stdout).toMatch(/demo mode is off.*nothing seeded/);
    expect(stdout).not.toContain(DEMO_PASSWORD);
  });

  it('the server with demo mode off lists no demo sign-ins and refuses the demo accounts, also their old sessions', async () => {
    await seedDemo(t.db); // people and shelf only (no storage): what a laptop had before going live
    const on = new Client(t.sheetsmith.app);
    await on.signIn('owner@demo.test', DEMO_PASSWORD);
    const cookie = (await on.get('/api/me').expect(200)).request.cookies;
    const live = testApp(t.db, { demoMode: false });
    try {
      for (const account of DEMO_ACCOUNTS) {
        const refused = await new Client(live.app).post('/api/auth/sign-in', { email: account.email, password: DEMO_PASSWORD });
        expect(refused.status).toBe(401);
        expect(refused.body.error.message).toBe('That e-mail and password do not match an account.');
      }
      // The session made while demo mode was on no longer signs anyone in.
      const stale = new Client(live.app);
      stale.agent.jar.setCookies(
        String(cookie)
          .split('; ')
          .map((c) => `${c}; Path=/`),
      );
      expect((await stale.get('/api/me')).status).toBe(401);
      // No reset e-mail for them either: a server whose demo is off gives them no way in.
      expect((await new Client(live.app).post('/api/auth/password-reset', { email: 'owner@demo.test' })).status).toBe(200);
    } finally {
      await live.close();
    }
  });

  it('never writes into a team that merely has the demo shop’s name, nor takes over an account made with a demo e-mail', async () => {
    // A clean database, so the look-alike team is the first team there, as on a fresh server.
    const scratch = await scratchDatabase('demo');
    try {
      const { db } = scratch;
      const maker = await makeUser(db, 'maker');
      const own = await makeTeam(db, 'own');
      await db.getRepository(Membership).save({ teamId: own.id, userId: maker.id, role: 'owner' });
      await db.getRepository(Team).update({ id: own.id }, { name: DEMO_SHOP });
      // Someone signed up with one of the demo addresses where the demo never ran.
      const squatter = await db
        .getRepository(User)
        .save({ email: 'viewer@demo.test', name: 'Not the demo', passwordHash: maker.passwordHash });
      expect(await seedDemo(db)).toBeGreaterThan(0);
      expect(await seedDemo(db)).toBe(0);

      const members = await db.getRepository(Membership).findBy({ teamId: own.id });
      expect(members.map((m) => m.userId)).toEqual([maker.id]);
      const [{ n }] = await db.query('SELECT COUNT(*) AS n FROM stock_items WHERE team_id = ?', [own.id]);
      expect(Number(n)).toBe(0);
      const demo = await db.getRepository(Team).findOneByOrFail({ seedKey: DEMO_TEAM_KEY });
      expect(demo.id).not.toBe(own.id);
      const demoMembers = await db.getRepository(Membership).findBy({ teamId: demo.id });
      expect(demoMembers.map((m) => m.userId)).not.toContain(squatter.id);
      expect(demoMembers).toHaveLength(3);
      expect((await db.getRepository(User).findOneByOrFail({ id: squatter.id })).seedKey).toBeNull();
    } finally {
      await scratch.drop();
    }
  });
});
