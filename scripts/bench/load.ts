// npm run bench:load: the app under a small shop's worst hour, measured from outside.
// Starts the real server (its own process, so its peak RSS is its own) on a free loopback port and,
// in one run: /api/health at rest (the baseline), a sign-up storm, 20 parallel saves of different
// sheets × 10 rounds, 20 parallel 4 MP uploads with their outlines, and 50 concurrent clients on the
// list endpoints for 20 s (autocannon). /api/health is sampled throughout, so every phase prints its
// own p50/p99 beside health's p99 measured at the same time. Any error fails the run (exit 1).
import { spawn } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { createServer } from 'node:net';
import autocannon from 'autocannon';
import sharp from 'sharp';
import { env } from '../../server/config/env';
import { createDataSource } from '../../server/db/data-source';

const LIST_SECONDS = Number(process.env.BENCH_LIST_SECONDS ?? 20);

const db = await createDataSource().initialize();
await db.runMigrations({ transaction: 'each' });
await db.destroy();

const port = await new Promise<number>((resolve) => {
  const s = createServer().listen(0, '127.0.0.1', () => {
    const p = (s.address() as { port: number }).port;
    s.close(() => resolve(p));
  });
});
const base = `http://127.0.0.1:${port}`;
const app = spawn(process.execPath, ['--import', 'tsx', 'server/index.ts'], {
  env: { ...process.env, PORT: String(port), HOST: '127.0.0.1', DEMO: 'off', LOG_LEVEL: 'warn', LIMIT_SIGNUPS_PER_HOUR: '100000' },
  stdio: ['ignore', 'ignore', 'inherit'],
});
const peakRssMb = () => {
  const status = readFileSync(`/proc/${app.pid}/status`, 'utf8');
  return Number(/VmHWM:\s+(\d+) kB/.exec(status)![1]) / 1024;
};
for (let i = 0; ; i++) {
  if (i > 240) throw new Error('the app did not start');
  if ((await fetch(`${base}/api/health`).catch(() => null))?.ok) break;
  await new Promise((r) => setTimeout(r, 250));
}

// --- a tiny client: cookie jar + CSRF token, as the browser would ---
class Session {
  cookie = '';
  csrf = '';
  async call(method: string, path: string, body?: unknown, form?: FormData) {
    const headers: Record<string, string> = { accept: 'application/json' };
    if (this.cookie) headers.cookie = this.cookie;
    if (method !== 'GET') headers['x-csrf-token'] = this.csrf;
    if (body !== undefined) headers['content-type'] = 'application/json';
    const started = performance.now();
    const res = await fetch(`${base}${path}`, { method, headers, body: form ?? (body === undefined ? undefined : JSON.stringify(body)) });
    const ms = performance.now() - started;
    const set = res.headers.get('set-cookie');
    if (set) this.cookie = set.split(';')[0];
    const data = res.headers.get('content-type')?.includes('json') ? await res.json() : await res.arrayBuffer();
    if (typeof (data as { csrfToken?: string }).csrfToken === 'string') this.csrf = (data as { csrfToken: string }).csrfToken;
    return { status: res.status, data: data as any, ms }; // eslint-disable-line @typescript-eslint/no-explicit-any
  }
  async start() {
    await this.call('GET', '/api/auth/csrf');
  }
}

const quantile = (values: number[], q: number) => {
  const s = [...values].sort((a, b) => a - b);
  return s.length ? s[Math.min(s.length - 1, Math.floor(q * s.length))] : NaN;
};
const fmt = (ms: number) => `${ms.toFixed(ms < 10 ? 1 : 0)} ms`;

/** Samples /api/health one request at a time until stopped. */
function healthSampler() {
  const times: number[] = [];
  let errors = 0;
  let running = true;
  const loop = (async () => {
    while (running) {
      const t = performance.now();
      const res = await fetch(`${base}/api/health`).catch(() => null);
      if (!res?.ok) errors += 1;
      await res?.arrayBuffer();
      times.push(performance.now() - t);
      await new Promise((r) => setTimeout(r, 20));
    }
  })();
  return { stop: async () => ((running = false), await loop, { times, errors }) };
}

type Phase = {
  name: string;
  p50: number;
  p99: number;
  requests: number;
  errors: number;
  healthP50: number;
  healthP95: number;
  healthP99: number;
};
const phases: Phase[] = [];
type Measured = { times: number[]; errors: number } | { p50: number; p99: number; requests: number; errors: number };
async function phase(name: string, work: () => Promise<Measured>) {
  const health = healthSampler();
  const m = await work();
  const h = await health.stop();
  const own = 'times' in m ? { p50: quantile(m.times, 0.5), p99: quantile(m.times, 0.99), requests: m.times.length } : m;
  phases.push({
    name,
    ...own,
    errors: m.errors + h.errors,
    healthP50: quantile(h.times, 0.5),
    healthP95: quantile(h.times, 0.95),
    healthP99: quantile(h.times, 0.99),
  });
  console.log(`  ${name}: done`);
}

console.log(`[bench:load] app on ${base}, pid ${app.pid}`);
// --- set-up: a maker with art and 20 sheets ---
const owner = new Session();
await owner.start();
const signedUp = await owner.call('POST', '/api/auth/sign-up', {
  name: 'Bench Owner',
  email: `owner-${Date.now()}@bench.test`,
  password: 'bench-password-1',
});
if (signedUp.status !== 200) throw new Error(`sign-up failed: ${JSON.stringify(signedUp.data)}`);
const teamId: string = signedUp.data.activeTeamId;
const disc = await sharp(
  Buffer.from('<svg xmlns="http://www.w3.org/2000/svg" width="600" height="600"><circle cx="300" cy="300" r="280" fill="#2e86c1"/></svg>'),
)
  .png()
  .toBuffer();
const upload = async (session: Session, png: Buffer, name: string) => {
  const form = new FormData();
  form.append('file', new Blob([new Uint8Array(png)], { type: 'image/png' }), name);
  return session.call('POST', `/api/teams/${teamId}/art`, undefined, form);
};
const art = (await upload(owner, disc, 'disc.png')).data.results[0].item;
const sheets: Array<{ id: string; version: number; document: any }> = []; // eslint-disable-line @typescript-eslint/no-explicit-any
for (let i = 0; i < 20; i++) sheets.push((await owner.call('POST', `/api/teams/${teamId}/sheets`, { name: `Bench sheet ${i + 1}` })).data);

// --- phases ---
await phase('health at rest (baseline)', async () => {
  await new Promise((r) => setTimeout(r, 5000));
  return { times: [], errors: 0 };
});

await phase('sign-up storm (4 loops)', async () => {
  const times: number[] = [];
  let errors = 0;
  const until = performance.now() + 8000;
  await Promise.all(
    Array.from({ length: 4 }, async (_, loop) => {
      for (let n = 0; performance.now() < until; n++) {
        const s = new Session();
        await s.start();
        const res = await s.call('POST', '/api/auth/sign-up', {
          name: 'Storm',
          email: `storm-${loop}-${n}-${Date.now()}@bench.test`,
          password: 'storm-password-1',
        });
        times.push(res.ms);
        if (res.status !== 200) errors += 1;
      }
    }),
  );
  return { times, errors };
});

await phase('20 parallel saves × 10 rounds', async () => {
  const times: number[] = [];
  let errors = 0;
  for (let round = 0; round < 10; round++) {
    await Promise.all(
      sheets.map(async (sheet, i) => {
        const pieces = Array.from({ length: 6 }, (_, k) => ({
          id: `p${k}`,
          artId: art.id,
          x: 25 + k * 22 + round,
          y: 30 + i * 2,
          rotation: (round * 15) % 360,
          width: 20,
          border: 3,
          borderColour: '#ffffff',
          locked: false,
        }));
        const res = await owner.call('PUT', `/api/teams/${teamId}/sheets/${sheet.id}`, {
          version: sheet.version,
          document: { ...sheet.document, pieces },
        });
        times.push(res.ms);
        if (res.status !== 200) errors += 1;
        else sheet.version = res.data.version;
      }),
    );
  }
  return { times, errors };
});

const bigArt = await Promise.all(
  Array.from({ length: 20 }, (_, i) =>
    sharp(
      Buffer.from(
        `<svg xmlns="http://www.w3.org/2000/svg" width="2000" height="2000"><defs><filter id="f"><feGaussianBlur stdDeviation="12"/></filter></defs><g filter="url(#f)"><ellipse cx="1000" cy="1000" rx="${700 + i * 10}" ry="800" fill="hsl(${i * 18}, 60%, 50%)"/></g><circle cx="${800 + i * 7}" cy="900" r="200" fill="#fff" opacity="0.6"/></svg>`,
      ),
    )
      .png()
      .toBuffer(),
  ),
);
await phase('20 parallel 4 MP uploads + outlines', async () => {
  const times: number[] = [];
  let errors = 0;
  await Promise.all(
    bigArt.map(async (png, i) => {
      const t = performance.now();
      const up = await upload(owner, png, `watercolour-${i + 1}.png`);
      if (up.status !== 201) return void (errors += 1);
      const outlined = await owner.call('GET', `/api/teams/${teamId}/art/${up.data.results[0].item.id}/outline?width=2in&border=3mm`);
      if (outlined.status !== 200) errors += 1;
      times.push(performance.now() - t);
    }),
  );
  return { times, errors };
});

await phase(`50 clients on the list endpoints, ${LIST_SECONDS} s`, async () => {
  const headers = { cookie: owner.cookie, accept: 'application/json' };
  const result = await autocannon({
    url: base,
    connections: 50,
    duration: LIST_SECONDS,
    requests: [
      { method: 'GET', path: `/api/teams/${teamId}/art?q=water`, headers },
      { method: 'GET', path: `/api/teams/${teamId}/sheets`, headers },
      { method: 'GET', path: `/api/teams/${teamId}/collections`, headers },
      { method: 'GET', path: `/api/teams/${teamId}/art`, headers },
    ],
  });
  // autocannon's own latency histogram (per request, over all connections).
  return {
    p50: result.latency.p50,
    p99: result.latency.p99,
    requests: result.requests.total,
    errors: result.errors + result.timeouts + result.non2xx,
  };
});

const rss = peakRssMb();
app.kill('SIGTERM');

const idle = phases[0];
console.log(`\n[bench:load] ${env.DB_NAME}, 2 cores; latencies from the client side\n`);
console.log('| phase | requests | errors | p50 | p99 | /api/health p50 | p95 | p99 | health p95 ÷ at rest |');
console.log('|---|---|---|---|---|---|---|---|---|');
for (const p of phases) {
  console.log(
    `| ${p.name} | ${p.requests || '-'} | ${p.errors} | ${p.requests ? fmt(p.p50) : '-'} | ${p.requests ? fmt(p.p99) : '-'} | ${fmt(p.healthP50)} | ${fmt(p.healthP95)} | ${fmt(p.healthP99)} | ${(p.healthP95 / idle.healthP95).toFixed(2)} |`,
  );
}
console.log(`\nApp peak RSS (VmHWM): ${rss.toFixed(0)} MB`);
const errors = phases.reduce((n, p) => n + p.errors, 0);
const storm = phases.find((p) => p.name.startsWith('sign-up storm'))!;
const stormRatio = storm.healthP95 / idle.healthP95;
console.log(`Errors: ${errors} (must be 0). Health p95 during the sign-up storm: ${stormRatio.toFixed(2)} × at rest (must be ≤ 3).`);
process.exit(errors === 0 && stormRatio <= 3 ? 0 : 1);
