// npm run worker: a job worker of its own, for this machine or another one that reaches the same
// MariaDB, Redis and file storage. WORKER_CONCURRENCY jobs at once; CPU-heavy steps use an outline
// thread pool sized to the cores (OUTLINE_THREADS); arrange runs use ARRANGE_THREADS threads. Stops cleanly on SIGTERM or Ctrl-C: the job in
// hand is finished first (or, if the process is killed, taken up again by another worker).
import { hostname } from 'node:os';
import { env } from '../server/config/env';
import { createDataSource } from '../server/db/data-source';
import { OutlinePool } from '../server/engine/outline/pool';
import { JobQueues } from '../server/jobs/queues';
import { jobSettingsFrom, startAnalysisWorker, startArrangeWorker, startExportWorker, startOutlineWorker } from '../server/jobs/workers';
import { defaultThreads } from '../server/engine/arrange/parallel';
import { createLog } from '../server/lib/log';
import { OutlineService } from '../server/modules/outlines/outline.service';
import { ExportsService } from '../server/modules/exports/exports.service';
import { ProfilesService } from '../server/modules/sheets/profiles.service';
import { SheetsService } from '../server/modules/sheets/sheets.service';
import { SheetAnalysisService } from '../server/modules/shop/sheet-analysis.service';
import { createStorage } from '../server/storage/create';

const log = createLog(env);
const dataSource = await createDataSource(env.DB_NAME, env, log).initialize();
const storage = createStorage(env);
const pool = new OutlinePool(
  { maxInputPixels: env.OUTLINE_MAX_PIXELS, maxOutputPixels: env.OUTLINE_MAX_OUTPUT_PIXELS },
  env.OUTLINE_THREADS || undefined,
);
const settings = jobSettingsFrom(env);
const queues = new JobQueues(settings);
const sheets = new SheetsService(dataSource, storage, new ProfilesService(dataSource));
const outlines = new OutlineService(dataSource, storage, pool);
const analysis = new SheetAnalysisService(dataSource, storage, outlines);
const exportsService = new ExportsService(dataSource, storage, pool, sheets, analysis, log, queues);
const name = `${hostname()}:${process.pid}`;
const workers = [
  startExportWorker(exportsService, settings, env, log, name),
  startOutlineWorker(outlines, settings, log, name, Math.max(2, pool.size)),
  startArrangeWorker(queues, settings, log, name, env.ARRANGE_THREADS || defaultThreads()),
  startAnalysisWorker(analysis, settings, log, name),
];
await Promise.all(workers.map((w) => w.waitUntilReady()));
log.info({ name, concurrency: settings.concurrency, prefix: settings.prefix }, 'worker ready');
console.log(`[sheetsmith] worker ${name} ready (${settings.concurrency} at once)`);

let stopping = false;
const stop = async (signal: string) => {
  if (stopping) return;
  stopping = true;
  log.info({ signal }, 'worker stopping');
  await Promise.all(workers.map((w) => w.close()));
  await queues.close();
  await pool.close();
  await dataSource.destroy();
  process.exit(0);
};
process.on('SIGTERM', () => void stop('SIGTERM'));
process.on('SIGINT', () => void stop('SIGINT'));
