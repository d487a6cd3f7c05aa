// npm run bench:queue: 200 outline jobs through two worker processes (npm run worker) on the
// project's Redis, against the floor measured in the same run: the same 200 outlines made in this
// process's own thread pool. Prints jobs per second and the p50 / p95 latency from enqueue to result.
// Needs MariaDB and Redis running (scripts/bench-queue.sh starts them and a fresh bench database).
import { spawn } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import sharp from 'sharp';
import { outlineOptionsSchema } from '@shared/schemas/outline';
import { env } from '../../server/config/env';
import { createDataSource } from '../../server/db/data-source';
import { OutlinePool } from '../../server/engine/outline/pool';
import { JobQueues } from '../../server/jobs/queues';
import { jobSettingsFrom } from '../../server/jobs/workers';
import { outlineCacheKey } from '../../server/modules/outlines/outline.service';
import { createStorage } from '../../server/storage/create';

const JOBS = Number(process.env.BENCH_JOBS ?? 200);
const prefix = `bench-${randomBytes(3).toString('hex')}`;
const dataSource = await createDataSource(env.DB_NAME, env).initialize();
const storage = createStorage(env);
const art = await sharp(
  Buffer.from(
    '<svg xmlns="http://www.w3.org/2000/svg" width="1000" height="1000"><circle cx="500" cy="500" r="420" fill="#5b8c5a"/><rect x="380" y="80" width="240" height="200" fill="#e07a5f"/></svg>',
  ),
)
  .png()
  .toBuffer();
const { key: storageKey } = await storage.put(art);
const sha = (await import('node:crypto')).createHash('sha256').update(art).digest('hex');
// 200 distinct requests (widths 30.0–49.9 mm), so nothing is answered from the cache.
const requests = Array.from({ length: JOBS }, (_, i) => outlineOptionsSchema.parse({ width: 30 + i / 10, border: 3, dpi: 150 }));
/** Runs `fn` over every item with at most `limit` in flight (the pool refuses more than 64 waiting). */
async function limited<T>(items: T[], limit: number, fn: (item: T) => Promise<number>): Promise<number[]> {
  const out: number[] = [];
  let next = 0;
  await Promise.all(
    Array.from({ length: limit }, async () => {
      while (next < items.length) out.push(await fn(items[next++]));
    }),
  );
  return out;
}
const pct = (xs: number[], p: number) => [...xs].sort((a, b) => a - b)[Math.min(xs.length - 1, Math.floor(p * xs.length))];

// Floor: this process's own pool (one core left to the rest, as in an app).
const pool = new OutlinePool();
let t0 = performance.now();
const local = await limited(requests, 48, async (o) => {
  const s = performance.now();
  await pool.run(art, o);
  return performance.now() - s;
});
const localMs = performance.now() - t0;
await pool.close();

// Two worker processes on the queue.
const workerEnv = { ...process.env, QUEUE_PREFIX: prefix, LOG_LEVEL: 'silent', OUTLINE_THREADS: '1' };
const workers = [0, 1].map(() =>
  spawn(process.execPath, ['--import', 'tsx', 'scripts/worker.ts'], { env: workerEnv, stdio: ['ignore', 'pipe', 'inherit'] }),
);
await Promise.all(
  workers.map((w) => new Promise<void>((resolve) => w.stdout!.on('data', (c) => String(c).includes('ready') && resolve()))),
);
const queues = new JobQueues(jobSettingsFrom(env, prefix));
t0 = performance.now();
const queued = await limited(requests, 48, async (o) => {
  const s = performance.now();
  await queues.runOutline({ key: outlineCacheKey(sha, o), artSha256: sha, storageKey, options: o }, 600_000);
  return performance.now() - s;
});
const queuedMs = performance.now() - t0;
await queues.close();
for (const w of workers) w.kill('SIGTERM');
await dataSource.query('DELETE FROM outline_cache WHERE art_sha256 = ?', [sha]);
await dataSource.destroy();

console.log(`queue benchmark: ${JOBS} outline jobs (1 MP art, 150 DPI), 48 in flight, same machine`);
console.log(
  `in-process pool (floor):      ${(JOBS / (localMs / 1000)).toFixed(1)} jobs/s, p50 ${pct(local, 0.5).toFixed(0)} ms, p95 ${pct(local, 0.95).toFixed(0)} ms`,
);
console.log(
  `queue, 2 worker processes:     ${(JOBS / (queuedMs / 1000)).toFixed(1)} jobs/s, p50 ${pct(queued, 0.5).toFixed(0)} ms, p95 ${pct(queued, 0.95).toFixed(0)} ms`,
);
console.log(`ratio (queue / floor) in throughput: ${(localMs / queuedMs).toFixed(2)}`);
process.exit(0);
