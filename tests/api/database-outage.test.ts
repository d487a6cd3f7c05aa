import request from 'supertest';
import { afterAll, describe, expect, it } from 'vitest';
import type { DataSource } from 'typeorm';
import { createDataSource } from '../../server/db/data-source';
import type { SheetsmithApp } from '../../server/app';
import { Client, makeUser, testApp } from '../helpers/app';
import { ownMariaDb } from '../helpers/own-mariadb';

const mariadb = await ownMariaDb('outage');
let db: DataSource | undefined;
let app: SheetsmithApp | undefined;

afterAll(async () => {
  await app?.close().catch(() => undefined);
  await db?.destroy().catch(() => undefined);
  await mariadb.stop();
});

describe('while MariaDB is unreachable', { timeout: 180_000 }, () => {
  it('every request answers 503 with Retry-After (session store included), and all is well again once it is back, without a restart', async () => {
    await mariadb.start();
    db = await createDataSource(mariadb.database, mariadb.dbEnv).initialize();
    await db.runMigrations({ transaction: 'each' });
    app = testApp(db, mariadb.dbEnv);
    const user = await makeUser(db, 'outage');
    const signedIn = new Client(app.app);
    await signedIn.signIn(user.email);
    expect((await signedIn.get('/api/me')).status).toBe(200);

    await mariadb.stop();
    const checks = {
      'health, no cookie': await request(app.app).get('/api/health'),
      'me, with a session cookie': await signedIn.get('/api/me'),
      'team list, with a session cookie': await signedIn.get(`/api/teams/1/sheets`),
      'sign-in, no cookie': await new Client(app.app).post('/api/auth/sign-in', { email: user.email, password: 'correct-horse-battery' }),
      'a write, with a session cookie': await signedIn.send('patch', '/api/me', { name: 'Renamed' }),
    };
    for (const [label, res] of Object.entries(checks)) {
      expect(res.status, label).toBe(503);
      expect(Number(res.headers['retry-after']), label).toBeGreaterThan(0);
      if (label !== 'health, no cookie')
        expect(res.body.error.message, label).toBe(
          'Sheetsmith cannot reach its database right now. Nothing was changed; try again in a moment.',
        );
    }

    await mariadb.start();
    // The pools reconnect on their own: the same app and the same session carry on.
    await expect.poll(async () => (await request(app!.app).get('/api/health')).status, { timeout: 30_000, interval: 500 }).toBe(200);
    await expect.poll(async () => (await signedIn.get('/api/me')).status, { timeout: 30_000, interval: 500 }).toBe(200);
    expect((await signedIn.get('/api/me')).body.user.email).toBe(user.email);
  });
});
