import { spawn } from 'node:child_process';
import { createServer } from 'node:net';
import { Writable } from 'node:stream';
import request from 'supertest';
import { afterAll, describe, expect, it, vi } from 'vitest';
import type { DataSource } from 'typeorm';
import { env } from '../../server/config/env';
import { createDataSource } from '../../server/db/data-source';
import { createLog, QueryLog } from '../../server/lib/log';
import { Client, testApp, uniqueEmail } from '../helpers/app';

const BCRYPT = /\$2[aby]\$\d\d\$/;

describe('logs', () => {
  const lines: string[] = [];
  const sink = new Writable({ write: (chunk, _enc, done) => (lines.push(...String(chunk).split('\n').filter(Boolean)), done()) });
  const log = createLog({ LOG_LEVEL: 'info' }, sink);
  let db: DataSource;
  afterAll(async () => db?.destroy());

  it('a duplicate sign-up logs the failed query and the request by id, with no password, hash, e-mail or parameter', async () => {
    db = await createDataSource(env.DB_NAME, env, log).initialize();
    const seen = vi.spyOn(QueryLog.prototype, 'logQueryError');
    const sheetsmith = testApp(db, { LOG_LEVEL: 'info' }, { log });
    try {
      const email = uniqueEmail('twice');
      expect(
        (await new Client(sheetsmith.app).post('/api/auth/sign-up', { name: 'Twice', email, password: 'first-secret-words' })).status,
      ).toBe(200);
      const again = await new Client(sheetsmith.app).post('/api/auth/sign-up', { name: 'Twice', email, password: 'second-secret-words' });
      expect(again.status).toBe(409);
      // The scenario is real: the refused INSERT carried the e-mail and a bcrypt hash as parameters.
      const parameters = JSON.stringify(seen.mock.calls.map((call) => call[2]));
      expect(parameters).toMatch(BCRYPT);
      expect(parameters).toContain(email);
      await new Promise((resolve) => setImmediate(resolve));
      const entries = lines.map((line) => JSON.parse(line));
      const failed = entries.find((e) => e.msg === 'query failed');
      expect(failed?.err?.code).toBe('ER_DUP_ENTRY');
      expect(failed?.sql).toMatch(/^INSERT INTO `users`/);
      const text = lines.join('\n');
      for (const secret of ['first-secret-words', 'second-secret-words', email]) expect(text).not.toContain(secret);
      expect(text).not.toMatch(BCRYPT);
      const refused = entries.find((e) => e.msg === 'request' && e.status === 409);
      expect(refused).toMatchObject({ method: 'POST', path: '/api/auth/sign-up' });
      expect(again.headers['x-request-id']).toBe(refused.reqId);
    } finally {
      seen.mockRestore();
      await sheetsmith.close();
    }
  });

  it('tokens in paths are not logged', async () => {
    const sheetsmith = testApp(db, { LOG_LEVEL: 'info' }, { log });
    try {
      const token = 'Qm9yZGVyLXRva2VuLXRoYXQtbXVzdC1ub3QtbGVhaw';
      await request(sheetsmith.app).get(`/api/invites/${token}`);
      await new Promise((resolve) => setImmediate(resolve));
      expect(lines.join('\n')).not.toContain(token);
      expect(lines.map((l) => JSON.parse(l)).some((e) => e.path === '/api/invites/:secret')).toBe(true);
    } finally {
      await sheetsmith.close();
    }
  });
});

describe('start-up', () => {
  it('a port already in use stops the server with a clear message and exit code 1', { timeout: 60_000 }, async () => {
    const blocker = createServer();
    await new Promise<void>((resolve) => blocker.listen(0, '127.0.0.1', resolve));
    const { port } = blocker.address() as { port: number };
    try {
      const child = spawn('npx', ['--no-install', 'tsx', 'server/index.ts'], {
        env: { ...process.env, PORT: String(port), HOST: '127.0.0.1', LOG_LEVEL: 'silent' },
        stdio: ['ignore', 'pipe', 'pipe'],
      });
      let out = '';
      child.stdout.on('data', (c) => (out += c));
      child.stderr.on('data', (c) => (out += c));
      const code = await new Promise<number | null>((resolve) => child.on('exit', resolve));
      expect(code).toBe(1);
      expect(out).toContain(`could not start: port ${port} on 127.0.0.1 is already in use by another program`);
      expect(out).not.toContain('Sheetsmith is running');
    } finally {
      blocker.close();
    }
  });
});
