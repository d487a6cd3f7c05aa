import type { Env } from '../config/env';
import type { Log } from '../lib/log';
import type { ExportsService } from '../modules/exports/exports.service';
import { UnrecoverableError } from 'bullmq';
import { OutlineInputError } from '../engine/outline/errors';
import type { OutlineService } from '../modules/outlines/outline.service';
import type { AnalysisJobData, ArrangeJobData, ExportJobData, JobSettings, OutlineJobData } from './queues';
import { APP_ERROR_PREFIX, arrangeStopKey, OUTLINE_INPUT_PREFIX, QUEUE_NAMES, startWorker } from './queues';
import { AppError } from '../lib/errors';
import type { SheetAnalysisService } from '../modules/shop/sheet-analysis.service';
import type { ArrangeResult } from '@shared/arrange/nester';
import { ArrangeInputError } from '@shared/arrange/nester';
import { arrangeInThreads } from '../engine/arrange/parallel';
import type { JobQueues } from './queues';

export const jobSettingsFrom = (env: Env, prefix = env.QUEUE_PREFIX): JobSettings => ({
  redisUrl: env.REDIS_URL,
  prefix,
  lockMs: env.JOB_LOCK_SECONDS * 1000,
  stalledMs: env.JOB_STALLED_SECONDS * 1000,
  maxStalls: env.JOB_MAX_STALLS,
  concurrency: env.WORKER_CONCURRENCY,
});

/**
 * The export worker: takes export jobs and runs them with `exports.process`. A job that fails in
 * the queue itself (its worker died more often than allowed) ends its row with a message.
 */
export function startExportWorker(exports: ExportsService, settings: JobSettings, env: Env, log: Log, name: string) {
  return startWorker<ExportJobData>(
    QUEUE_NAMES.exports,
    settings,
    (job) => exports.process(job.data, env.EXPORT_TIMEOUT_SECONDS * 1000),
    (job, error) => {
      log.warn({ err: error, jobId: job?.id }, 'export job failed in the queue');
      if (job) void exports.reconcile([job.data.exportId]).catch(() => undefined);
    },
    name,
  );
}

/** The outline worker: makes outlines into the cache; unusable art fails the job with the engine's code and message. */
export function startOutlineWorker(outlines: OutlineService, settings: JobSettings, log: Log, name: string, concurrency: number) {
  return startWorker<OutlineJobData>(
    QUEUE_NAMES.outlines,
    { ...settings, concurrency },
    async (job) => {
      try {
        await outlines.make(job.data);
      } catch (error) {
        if (error instanceof OutlineInputError)
          throw new UnrecoverableError(`${OUTLINE_INPUT_PREFIX}${JSON.stringify({ code: error.code, text: error.message })}`);
        throw error;
      }
    },
    (job, error) => {
      if (!(error.message ?? '').startsWith(OUTLINE_INPUT_PREFIX)) log.warn({ err: error, jobId: job?.id }, 'outline job failed');
    },
    name,
  );
}

/**
 * The analysis worker: checks a sheet version (preflight, cut length, ink coverage from its print
 * image at 150 DPI) and draws its thumbnail when it has none. A refusal (outlines not made yet, a
 * sheet that is gone) ends the job with its status and message for the app to answer with.
 */
export function startAnalysisWorker(analysis: SheetAnalysisService, settings: JobSettings, log: Log, name: string) {
  return startWorker<AnalysisJobData>(
    QUEUE_NAMES.analyses,
    settings,
    async (job) => {
      try {
        return await analysis.analyseNow(job.data.teamId, job.data.sheetId, job.data.access);
      } catch (error) {
        if (error instanceof AppError)
          throw new UnrecoverableError(
            `${APP_ERROR_PREFIX}${JSON.stringify({ status: error.status, code: error.code, text: error.message })}`,
          );
        throw error;
      }
    },
    (job, error) => {
      if (!(error.message ?? '').startsWith(APP_ERROR_PREFIX)) log.warn({ err: error, jobId: job?.id }, 'analysis job failed');
    },
    name,
  );
}

/**
 * The arrange worker: runs the nester on `threads` worker threads (one seed each), reports each new
 * best as the job's progress, and stops with the best so far when asked (a Redis key the app sets)
 * or when the run has had its time and half a minute more.
 */
export function startArrangeWorker(queues: JobQueues, settings: JobSettings, log: Log, name: string, threads: number) {
  return startWorker<ArrangeJobData>(
    QUEUE_NAMES.arranges,
    { ...settings, concurrency: 1 },
    async (job): Promise<ArrangeResult> => {
      const { items, options, locked } = job.data.input;
      const started = Date.now();
      const run = arrangeInThreads(items, options, locked, threads, (best) => {
        void job
          .updateProgress({ placed: best.placed, sheets: best.sheets, areaUsed: best.areaUsed[0] ?? 0, elapsedMs: Date.now() - started })
          .catch(() => undefined);
      });
      const client = await queues.arranges.client;
      const watch = setInterval(() => {
        if (Date.now() - started > options.timeMs + 30_000) run.stop();
        void client.get(arrangeStopKey(settings.prefix, job.id!)).then(
          (flag) => flag && run.stop(),
          () => undefined,
        );
      }, 250);
      try {
        return await run.done;
      } catch (error) {
        if (error instanceof ArrangeInputError) throw new UnrecoverableError(error.message);
        throw error;
      } finally {
        clearInterval(watch);
      }
    },
    (job, error) => {
      if (!(error instanceof UnrecoverableError)) log.warn({ err: error, jobId: job?.id }, 'arrange job failed');
    },
    name,
  );
}
