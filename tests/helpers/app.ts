import type { Response } from 'superagent';
import { randomBytes } from 'node:crypto';
import bcrypt from 'bcryptjs';
import request from 'supertest';
import { afterAll, beforeAll } from 'vitest';
import { OutlinePool } from '../../server/engine/outline/pool';
import type { SheetsmithApp } from '../../server/app';
import type TestAgent from 'supertest/lib/agent';
import type { DataSource } from 'typeorm';
import type { Role } from '@shared/permissions';
import type { Env } from '../../server/config/env';
import { env as baseEnv } from '../../server/config/env';
import { createApp } from '../../server/app';
import type { AppOptions } from '../../server/app';
import { createDataSource } from '../../server/db/data-source';
import { User } from '../../server/modules/accounts/user.entity';
import { Team } from '../../server/modules/accounts/team.entity';
import { Membership } from '../../server/modules/accounts/membership.entity';

export const TEST_PASSWORD = 'correct-horse-battery';
// Hashed once per test file at the production cost, so fixtures do not pay it per user.
let passwordHash: string | null = null;

export async function openDatabase(): Promise<DataSource> {
  return createDataSource().initialize();
}

/**
 * A database of its own for a test that needs a clean slate (first ids, no other suite's rows),
 * migrated like production; dropped again by `drop()`. test.sh lets the test user make them.
 */
export async function scratchDatabase(label: string): Promise<{ db: DataSource; drop: () => Promise<void> }> {
  const name = `${baseEnv.DB_NAME}_${label}_${randomBytes(3).toString('hex')}`;
  const admin = await createDataSource().initialize();
  await admin.query(`CREATE DATABASE \`${name}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`);
  const db = await createDataSource(name).initialize();
  await db.runMigrations({ transaction: 'each' });
  return {
    db,
    drop: async () => {
      await db.destroy();
      await admin.query(`DROP DATABASE IF EXISTS \`${name}\``);
      await admin.destroy();
    },
  };
}

export function testApp(dataSource: DataSource, overrides: Partial<Env> = {}, extra: Partial<AppOptions> = {}) {
  // Each app counts rate limits under its own prefix, so test files sharing a database do not add up.
  // … and its own job queues in the shared Redis, worked by its own embedded worker.
  return createApp({ env: { ...baseEnv, ...overrides }, dataSource, rateLimitPrefix: unique('t'), queuePrefix: unique('tq'), ...extra });
}

/**
 * One test database connection and one app for a test file, closed after it. `pool` gives the file
 * its own single-thread outline pool; `extra` adds app options that need the connection.
 */
export function useTestApp(options: { pool?: boolean; overrides?: Partial<Env>; extra?: (db: DataSource) => Partial<AppOptions> } = {}) {
  const t = {} as { db: DataSource; sheetsmith: SheetsmithApp; pool?: OutlinePool };
  beforeAll(async () => {
    t.db = await openDatabase();
    if (options.pool) t.pool = new OutlinePool(undefined, 1);
    t.sheetsmith = testApp(t.db, options.overrides, { ...(t.pool ? { outlinePool: t.pool } : {}), ...options.extra?.(t.db) });
  });
  afterAll(async () => {
    await t.sheetsmith?.close();
    await t.pool?.close();
    await t.db?.destroy();
  });
  return t;
}

export const unique = (label: string) => `${label}-${randomBytes(4).toString('hex')}`;
export const uniqueEmail = (label: string) => `${unique(label)}@example.test`;

/** Inserts a user straight into the database (no HTTP), optionally as a member of a team. */
export async function makeUser(dataSource: DataSource, label = 'user', membership?: { teamId: string; role: Role }) {
  passwordHash ??= await bcrypt.hash(TEST_PASSWORD, 12);
  const user = await dataSource.getRepository(User).save({ email: uniqueEmail(label), name: label, passwordHash });
  if (membership) await dataSource.getRepository(Membership).save({ ...membership, userId: user.id });
  return user;
}

export async function makeTeam(dataSource: DataSource, label = 'team') {
  return dataSource.getRepository(Team).save({ name: unique(label), personal: false });
}

/** A team with one user per role. */
export async function makeTeamWithRoles(dataSource: DataSource) {
  const team = await makeTeam(dataSource);
  const users = {} as Record<Role, User>;
  for (const role of ['owner', 'admin', 'member', 'viewer'] as const) {
    users[role] = await makeUser(dataSource, role, { teamId: team.id, role });
  }
  return { team, users };
}

/** A supertest agent that keeps cookies and sends the session's CSRF token on every write. */
export class Client {
  readonly agent: TestAgent;
  csrf = '';

  constructor(app: Parameters<typeof request.agent>[0]) {
    this.agent = request.agent(app);
  }

  async refreshCsrf() {
    const res = await this.agent.get('/api/auth/csrf').expect(200);
    this.csrf = res.body.csrfToken;
    return this.csrf;
  }

  get(path: string) {
    return this.agent.get(path);
  }

  async send(method: 'post' | 'put' | 'patch' | 'delete', path: string, body?: object) {
    if (!this.csrf) await this.refreshCsrf();
    const res = await this.agent[method](path).set('x-csrf-token', this.csrf).send(body);
    if (typeof res.body?.csrfToken === 'string') this.csrf = res.body.csrfToken;
    return res;
  }

  post(path: string, body?: object) {
    return this.send('post', path, body);
  }

  async signIn(email: string, password = TEST_PASSWORD) {
    const res = await this.post('/api/auth/sign-in', { email, password });
    if (res.status !== 200) throw new Error(`sign-in failed for ${email}: ${res.status} ${JSON.stringify(res.body)}`);
    return res;
  }
}

/** A supertest parser that keeps any response body as raw bytes (images, zips, PDFs). */
export const binary = (res: Response, cb: (err: Error | null, body: Buffer) => void) => {
  const parts: Buffer[] = [];
  res.on('data', (c: Buffer) => parts.push(c));
  res.on('end', () => cb(null, Buffer.concat(parts)));
};
