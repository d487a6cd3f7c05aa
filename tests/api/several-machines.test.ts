import { spawn } from 'node:child_process';
import type { ChildProcess } from 'node:child_process';
import { createServer } from 'node:net';
import { Queue } from 'bullmq';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { connection } from '../../server/jobs/queues';
import { makeTeamWithRoles, openDatabase, TEST_PASSWORD, unique } from '../helpers/app';
import type { DataSource } from 'typeorm';
import { startS3Fake } from '../helpers/s3-fake';
import { testPiece } from '../helpers/sheets';

// Two app processes and two worker processes, as two machines of a shop would run them, on one
// MariaDB (the test database), one Redis (the project's own) and one S3 bucket (s3rver on loopback).
const freePort = () =>
  new Promise<number>((resolve) => {
    const s = createServer();
    s.listen(0, '127.0.0.1', () => {
      const { port } = s.address() as { port: number };
      s.close(() => resolve(port));
    });
  });

type Proc = { child: ChildProcess; out: string[]; name: string };

/** A fetch client with its own cookie jar (one session), for any of the apps. */
class Browser {
  cookie = '';
  csrf = '';
  async call(base: string, method: string, path: string, body?: unknown) {
    const res = await fetch(`${base}${path}`, {
      method,
      headers: { cookie: this.cookie, 'content-type': 'application/json', ...(this.csrf ? { 'x-csrf-token': this.csrf } : {}) },
      body: body === undefined ? undefined : JSON.stringify(body),
    });
    const set = res.headers.getSetCookie();
    if (set.length) this.cookie = set.map((c) => c.split(';')[0]).join('; ');
    return res;
  }
  async signIn(base: string, email: string) {
    this.csrf = (await (await this.call(base, 'GET', '/api/auth/csrf')).json()).csrfToken;
    const res = await this.call(base, 'POST', '/api/auth/sign-in', { email, password: TEST_PASSWORD });
    const body = await res.json();
    if (body.csrfToken) this.csrf = body.csrfToken;
    return res.status;
  }
}

describe('several machines: two apps and two workers on one MariaDB, Redis and S3 bucket', { timeout: 180_000 }, () => {
  let db: DataSource;
  let fake: Awaited<ReturnType<typeof startS3Fake>>;
  const procs: Proc[] = [];
  let apps: string[] = [];
  const prefix = unique('multi');
  let shared: NodeJS.ProcessEnv;

  const start = (name: string, args: string[], extra: NodeJS.ProcessEnv, ready: RegExp) => {
    const child = spawn(process.execPath, ['--import', 'tsx', ...args], {
      env: { ...shared, ...extra },
      stdio: ['ignore', 'pipe', 'pipe'],
    });
    const proc: Proc = { child, out: [], name };
    child.stdout!.on('data', (c) => proc.out.push(String(c)));
    child.stderr!.on('data', (c) => proc.out.push(String(c)));
    procs.push(proc);
    return new Promise<Proc>((resolve, reject) => {
      const timer = setTimeout(() => reject(new Error(`${name} did not start: ${proc.out.join('')}`)), 60_000);
      const check = () => {
        if (ready.test(proc.out.join(''))) {
          clearTimeout(timer);
          resolve(proc);
        }
      };
      child.stdout!.on('data', check);
      child.on('exit', (code) => code !== null && code !== 0 && reject(new Error(`${name} exited ${code}: ${proc.out.join('')}`)));
    });
  };

  beforeAll(async () => {
    db = await openDatabase();
    fake = await startS3Fake('sheetsmith-multi');
    shared = {
      ...process.env,
      NODE_ENV: 'test',
      LOG_LEVEL: process.env.MULTI_LOG ?? 'silent',
      HOST: '127.0.0.1',
      DEMO: 'off',
      SESSION_SECRET: 'several-machines-test-secret-0123456789',
      STORAGE_DRIVER: 's3',
      S3_ENDPOINT: fake.settings.endpoint,
      S3_BUCKET: fake.settings.bucket,
      S3_ACCESS_KEY_ID: 'S3RVER',
      S3_SECRET_ACCESS_KEY: 'S3RVER',
      S3_FORCE_PATH_STYLE: 'true',
      QUEUE_PREFIX: prefix,
      WORKERS_EMBEDDED: 'false',
      OUTLINE_THREADS: '1',
      // Short locks so a killed worker's job is taken up again within seconds (defaults: 30 s / 15 s),
      // yet long enough that a busy CI machine does not take a live worker for a dead one.
      JOB_LOCK_SECONDS: '15',
      JOB_STALLED_SECONDS: '2',
      JOB_MAX_STALLS: '2',
    };
    const ports = [await freePort(), await freePort()];
    await Promise.all(ports.map((port, i) => start(`app ${i}`, ['server/index.ts'], { PORT: String(port) }, /Sheetsmith is running/)));
    apps = ports.map((p) => `http://127.0.0.1:${p}`);
    await Promise.all([0, 1].map((i) => start(`worker ${i}`, ['scripts/worker.ts'], {}, /worker .* ready/)));
  }, 120_000);

  afterAll(async () => {
    for (const p of procs) if (p.child.exitCode === null) p.child.kill('SIGKILL');
    await fake?.close();
    await db?.destroy();
  });

  it('a session made on app A works on app B; an export queued on A is done by a worker, survives that worker’s kill -9, and downloads from B; the sheet’s checks and thumbnail are a worker’s job too', async () => {
    const { team, users } = await makeTeamWithRoles(db);
    const maker = new Browser();
    expect(await maker.signIn(apps[0], users.member.email)).toBe(200);
    // The same cookie on the other app: sessions live in MariaDB, not in a process.
    const me = await maker.call(apps[1], 'GET', '/api/me');
    expect(me.status).toBe(200);
    expect((await me.json()).user.email).toBe(users.member.email);

    // Art uploaded through B lands in the bucket; a sheet of 30 pieces is saved through A.
    const png = await sharp(
      Buffer.from(
        '<svg xmlns="http://www.w3.org/2000/svg" width="900" height="900"><circle cx="450" cy="450" r="420" fill="#7d3c98"/></svg>',
      ),
    )
      .png()
      .toBuffer();
    const form = new FormData();
    form.append('file', new Blob([png], { type: 'image/png' }), 'plum.png');
    const uploaded = await fetch(`${apps[1]}/api/teams/${team.id}/art`, {
      method: 'POST',
      headers: { cookie: maker.cookie, 'x-csrf-token': maker.csrf },
      body: form,
    });
    expect(uploaded.status).toBe(201);
    const art = (await uploaded.json()).results[0].item;
    const sheet = await (await maker.call(apps[0], 'POST', `/api/teams/${team.id}/sheets`, { name: 'Two machines' })).json();
    const pieces = Array.from({ length: 30 }, (_, i) =>
      testPiece(`m${i}`, art.id, 25 + (i % 5) * 30, 25 + Math.floor(i / 5) * 35, { width: 25 }),
    );
    const saved = await maker.call(apps[0], 'PUT', `/api/teams/${team.id}/sheets/${sheet.id}`, {
      version: sheet.version,
      document: { ...sheet.document, pieces },
    });
    expect(saved.status).toBe(200);

    const started = await (
      await maker.call(apps[0], 'POST', `/api/teams/${team.id}/sheets/${sheet.id}/exports`, {
        dpi: 300,
        formats: ['png', 'pdf'],
        acceptErrors: true,
      })
    ).json();
    expect(started.status).toBe('running');
    const jobUrl = `/api/teams/${team.id}/sheets/${sheet.id}/exports/${started.id}`;
    // Wait until a worker is well into it, then kill that worker without warning.
    const queue = new Queue('exports', { connection: connection(process.env.REDIS_URL ?? 'redis://127.0.0.1:6390'), prefix });
    let holder: string | undefined;
    for (let i = 0; i < 200 && !holder; i++) {
      const job = await queue.getJob(`export-${started.id}`);
      const view = await (await maker.call(apps[1], 'GET', jobUrl)).json();
      if (job?.processedBy && view.progress > 0.05) holder = job.processedBy;
      else await new Promise((r) => setTimeout(r, 100));
    }
    expect(holder).toBeDefined();
    const victim = procs.find((p) => p.name.startsWith('worker') && holder!.endsWith(`:${p.child.pid}`))!;
    expect(victim).toBeDefined();
    victim.child.kill('SIGKILL');

    // The other worker takes the job up again once the dead one's lock runs out, and finishes it.
    let done: { status: string; files: Array<{ name: string; url: string }>; error: string | null } | undefined;
    for (let i = 0; i < 360; i++) {
      const view = await (await maker.call(apps[1], 'GET', jobUrl)).json();
      if (view.status !== 'running') {
        done = view;
        break;
      }
      await new Promise((r) => setTimeout(r, 250));
    }
    if (done?.error)
      console.log(
        procs
          .map(
            (p) =>
              `--- ${p.name}\n${p.out
                .join('')
                .split('\n')
                .filter((l) => /warn|error|stalled|export/i.test(l))
                .slice(-15)
                .join('\n')}`,
          )
          .join('\n'),
      );
    expect(done?.error ?? null).toBeNull();
    expect(done?.status).toBe('done');
    const [row] = await db.query('SELECT attempts FROM sheet_exports WHERE id = ?', [started.id]);
    expect(row.attempts).toBeGreaterThanOrEqual(2); // the first attempt died with its worker
    const job = await queue.getJob(`export-${started.id}`);
    expect(job?.processedBy).not.toBe(holder);
    await queue.close();

    // The print image, downloaded through B, comes out of the bucket.
    const file = done!.files.find((f) => f.name.endsWith('-print.png'))!;
    const res = await maker.call(apps[1], 'GET', file.url);
    expect(res.status).toBe(200);
    const bytes = Buffer.from(await res.arrayBuffer());
    expect((await sharp(bytes).metadata()).width).toBe(Math.round((171.45 / 25.4) * 300));

    // The sheet's checks are a job too, done by the worker left standing (neither app runs one).
    // The sheet was saved without a thumbnail (the editor sends one; the API here did not), so the
    // same job draws one from the print image it renders for the ink coverage.
    const [before] = await db.query('SELECT version, thumbnail_key FROM sheets WHERE id = ?', [sheet.id]);
    expect(before.thumbnail_key).toBeNull();
    const checked = await maker.call(apps[1], 'GET', `/api/teams/${team.id}/sheets/${sheet.id}/analysis`);
    expect(checked.status).toBe(200);
    expect((await checked.json()).pieces).toBe(30);
    const analyses = new Queue('analyses', { connection: connection(process.env.REDIS_URL ?? 'redis://127.0.0.1:6390'), prefix });
    const analysisJob = await analyses.getJob(`analysis-${sheet.id}-${before.version}-compute`);
    await analyses.close();
    const survivor = procs.find((p) => p.name.startsWith('worker') && p.child.exitCode === null && p.child.signalCode === null)!;
    expect(analysisJob?.processedBy).toMatch(new RegExp(`:${survivor.child.pid}$`));
    const thumb = await maker.call(apps[0], 'GET', `/api/teams/${team.id}/sheets/${sheet.id}/thumbnail`);
    expect(thumb.status).toBe(200);
    expect((await sharp(Buffer.from(await thumb.arrayBuffer())).metadata()).width).toBe(240);
  });
});
