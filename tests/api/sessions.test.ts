import { describe, expect, it } from 'vitest';
import { Client, TEST_PASSWORD, makeUser, testApp, useTestApp } from '../helpers/app';
import { lastMailTo, tokenFrom } from '../helpers/outbox';

// ASVS 4.0 §3.3.3: a password change or reset ends the other sessions; §3.3.2: idle and absolute
// session timeouts. Each case signs the same person in twice, like a laptop and a shop computer.
const t = useTestApp();

async function twoSessions() {
  const user = await makeUser(t.db, 'twice');
  const laptop = new Client(t.sheetsmith.app);
  const shop = new Client(t.sheetsmith.app);
  await laptop.signIn(user.email);
  await shop.signIn(user.email);
  expect((await shop.get('/api/me')).status).toBe(200);
  return { user, laptop, shop };
}

const sleep = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));

describe('sessions', () => {
  it('a password change ends every other session; the one that changed it carries on', async () => {
    const { user, laptop, shop } = await twoSessions();
    const changed = await laptop.post('/api/me/password', { currentPassword: TEST_PASSWORD, newPassword: 'a-brand-new-passphrase' });
    expect(changed.status).toBe(204);
    expect((await shop.get('/api/me')).status).toBe(401);
    expect((await laptop.get('/api/me')).status).toBe(200);
    // The ended session cannot write either, and signing in again works with the new password.
    await shop.refreshCsrf();
    expect((await shop.send('patch', '/api/me', { name: 'Mallory' })).status).toBe(401);
    await shop.signIn(user.email, 'a-brand-new-passphrase');
    expect((await shop.get('/api/me')).body.user.name).toBe('twice');
  });

  it('a password reset ends every session of the account', async () => {
    const { user, laptop, shop } = await twoSessions();
    await new Client(t.sheetsmith.app).post('/api/auth/password-reset', { email: user.email });
    const token = tokenFrom((await lastMailTo(user.email)).links.find((l) => l.includes('/reset-password/'))!);
    expect(
      (await new Client(t.sheetsmith.app).post(`/api/auth/password-reset/${token}`, { password: 'reset-to-something-new' })).status,
    ).toBe(200);
    expect((await laptop.get('/api/me')).status).toBe(401);
    expect((await shop.get('/api/me')).status).toBe(401);
  });

  it('"sign out everywhere" ends this session and every other', async () => {
    const { laptop, shop } = await twoSessions();
    expect((await laptop.post('/api/me/sign-out-everywhere')).status).toBe(204);
    expect((await laptop.get('/api/me')).status).toBe(401);
    expect((await shop.get('/api/me')).status).toBe(401);
  });

  it('ends after the idle timeout, and after the absolute lifetime however busy', async () => {
    const user = await makeUser(t.db, 'timeouts');
    // Values below the configurable minimum, straight into the app, so the test waits seconds.
    const idleApp = testApp(t.db, { SESSION_IDLE_SECONDS: 2 });
    const absoluteApp = testApp(t.db, { SESSION_ABSOLUTE_SECONDS: 3 });
    try {
      const idle = new Client(idleApp.app);
      await idle.signIn(user.email);
      await sleep(1000);
      expect((await idle.get('/api/me')).status).toBe(200); // use renews it
      await sleep(3200);
      expect((await idle.get('/api/me')).status).toBe(401);

      const busy = new Client(absoluteApp.app);
      await busy.signIn(user.email);
      for (let i = 0; i < 3; i++) {
        await sleep(900);
        expect((await busy.get('/api/me')).status).toBe(200);
      }
      await sleep(600);
      expect((await busy.get('/api/me')).status).toBe(401);
    } finally {
      await idleApp.close();
      await absoluteApp.close();
    }
  });
});
