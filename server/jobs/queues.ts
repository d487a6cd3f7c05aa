// Background work on BullMQ over Redis: the app enqueues, workers (embedded in the app, or their own
// processes on any machine: `npm run worker`) take jobs. A worker that dies leaves its job's lock to
// expire; another worker's stalled-job check puts it back on the queue (at most `maxStalls` times,
// then it fails with a message), so no job stays "running" without a live worker.
import { Queue, QueueEvents, Worker } from 'bullmq';
import type { ConnectionOptions, Job, Processor } from 'bullmq';
import type { OutlineOptions } from '@shared/schemas/outline';
import type { ArrangeRunInput } from '@shared/schemas/arrange';
import { OutlineInputError } from '../engine/outline/errors';
import { OutlinePoolBusyError } from '../engine/outline/pool';
import type { SheetAnalysis } from '@shared/schemas/shop';
import { AppError } from '../lib/errors';

export type JobSettings = {
  redisUrl: string;
  /** Key prefix in Redis: separates deployments (and test apps) sharing one Redis. */
  prefix: string;
  /** How long a worker's lock on a job lasts without renewal; a dead worker's job is free after it. */
  lockMs: number;
  /** How often workers look for jobs whose worker died. */
  stalledMs: number;
  /** How many times a job may lose its worker before it fails. */
  maxStalls: number;
  concurrency: number;
};

export const QUEUE_NAMES = { exports: 'exports', outlines: 'outlines', arranges: 'arranges', analyses: 'analyses' } as const;

export type ExportJobData = { teamId: string; sheetId: string; exportId: string };
export type OutlineJobData = { key: string; artSha256: string; storageKey: string; options: OutlineOptions };
export type ArrangeJobData = { teamId: string; sheetId: string; userId: string; input: ArrangeRunInput };
/** A sheet version's analysis (preflight, cut length, ink coverage, and a thumbnail if it has none). */
export type AnalysisJobData = { teamId: string; sheetId: string; version: number; access: 'compute' | 'cached' };

/** The Redis key that asks a running arrange job to stop (its worker looks for it). */
export const arrangeStopKey = (prefix: string, jobId: string) => `${prefix}:arrange-stop:${jobId}`;

/** An outline job's failure carries the engine's code, so the app answers as if it had run it itself. */
export const OUTLINE_INPUT_PREFIX = 'outline-input:';
/** An analysis job's refusal (an AppError) carries its status and code the same way. */
export const APP_ERROR_PREFIX = 'app-error:';

export function connection(url: string): ConnectionOptions {
  const u = new URL(url);
  return {
    host: u.hostname,
    port: Number(u.port || 6379),
    username: u.username || undefined,
    password: u.password ? decodeURIComponent(u.password) : undefined,
    db: u.pathname.length > 1 ? Number(u.pathname.slice(1)) : 0,
    tls: u.protocol === 'rediss:' ? {} : undefined,
    // BullMQ's workers block on Redis; they must retry forever rather than fail a command.
    maxRetriesPerRequest: null,
  };
}

/** The queues the app puts work on. */
export class JobQueues {
  readonly exports: Queue<ExportJobData>;
  readonly outlines: Queue<OutlineJobData>;
  readonly arranges: Queue<ArrangeJobData>;
  readonly analyses: Queue<AnalysisJobData>;
  private readonly events = new Map<string, QueueEvents>();

  constructor(readonly settings: JobSettings) {
    this.exports = new Queue<ExportJobData>(QUEUE_NAMES.exports, { connection: connection(settings.redisUrl), prefix: settings.prefix });
    this.outlines = new Queue<OutlineJobData>(QUEUE_NAMES.outlines, { connection: connection(settings.redisUrl), prefix: settings.prefix });
    this.arranges = new Queue<ArrangeJobData>(QUEUE_NAMES.arranges, { connection: connection(settings.redisUrl), prefix: settings.prefix });
    this.analyses = new Queue<AnalysisJobData>(QUEUE_NAMES.analyses, {
      connection: connection(settings.redisUrl),
      prefix: settings.prefix,
    });
    // Every waiting request listens for its job: many at once is the normal case, not a leak.
    this.outlines.setMaxListeners(0);
    this.analyses.setMaxListeners(0);
    // Redis errors surface where a job is added or awaited; an idle queue's own errors are not news.
    this.exports.on('error', () => undefined);
    this.outlines.on('error', () => undefined);
    this.arranges.on('error', () => undefined);
    this.analyses.on('error', () => undefined);
  }

  /** One listener per queue for its jobs' ends, made when first needed. */
  private async eventsOf(name: string) {
    let events = this.events.get(name);
    if (!events) {
      events = new QueueEvents(name, { connection: connection(this.settings.redisUrl), prefix: this.settings.prefix });
      events.setMaxListeners(0);
      this.events.set(name, events);
    }
    await events.waitUntilReady();
    return events;
  }

  /**
   * Queues an outline and waits for a worker to make it (the result lands in the cache table). One
   * job per outline key: requests from several apps for the same outline share it.
   */
  async runOutline(data: OutlineJobData, timeoutMs = 120_000): Promise<void> {
    const events = await this.eventsOf(QUEUE_NAMES.outlines);
    const job = await this.outlines.add('outline', data, {
      jobId: `outline-${data.key}`,
      removeOnComplete: true,
      removeOnFail: { age: 60 },
    });
    try {
      await job.waitUntilFinished(events, timeoutMs);
    } catch (error) {
      const message = (error as Error).message ?? '';
      if (message.startsWith(OUTLINE_INPUT_PREFIX)) {
        const { code, text } = JSON.parse(message.slice(OUTLINE_INPUT_PREFIX.length)) as { code: OutlineInputError['code']; text: string };
        throw new OutlineInputError(code, text);
      }
      if (/timed out|time out/i.test(message)) throw new OutlinePoolBusyError('The outline workers are busy. Try again in a moment.');
      throw error;
    }
  }

  /**
   * Queues a sheet version's analysis and waits for a worker to make it (it is kept on the sheet
   * row too). One job per version and access: requests from several apps share it.
   */
  async runAnalysis(data: AnalysisJobData, timeoutMs = 120_000): Promise<SheetAnalysis> {
    const events = await this.eventsOf(QUEUE_NAMES.analyses);
    const job = await this.addAnalysis(data);
    try {
      return (await job.waitUntilFinished(events, timeoutMs)) as SheetAnalysis;
    } catch (error) {
      const message = (error as Error).message ?? '';
      if (message.startsWith(APP_ERROR_PREFIX)) {
        const { status, code, text } = JSON.parse(message.slice(APP_ERROR_PREFIX.length)) as { status: number; code: string; text: string };
        throw new AppError(status, code, text);
      }
      if (/timed out|time out/i.test(message))
        throw new AppError(503, 'analysis_busy', 'The sheet checks are busy. Try again in a moment.');
      throw error;
    }
  }

  /** Queues a sheet version's analysis (one job per version and access; nobody need wait for it). */
  addAnalysis(data: AnalysisJobData) {
    return this.analyses.add('analysis', data, {
      jobId: `analysis-${data.sheetId}-${data.version}-${data.access}`,
      removeOnComplete: { age: 60 },
      removeOnFail: true, // a refusal (outlines not made yet) must not answer the next request too
    });
  }

  async addExport(data: ExportJobData) {
    // The job id is the export's id: one job per export, found again by it.
    await this.exports.add('export', data, {
      jobId: `export-${data.exportId}`,
      attempts: 1,
      removeOnComplete: { age: 24 * 3600, count: 1000 },
      removeOnFail: { age: 7 * 24 * 3600 },
    });
  }

  /** The export job's state ('active', 'waiting', 'failed', …), or null when the queue has no such job. */
  async exportState(exportId: string): Promise<{ state: string; reason?: string } | null> {
    const state = await this.exports.getJobState(`export-${exportId}`); // before the job, so a reason read after matches it
    const job = await this.exports.getJob(`export-${exportId}`);
    if (!job || state === 'unknown') return null;
    return { state, reason: job.failedReason };
  }

  async removeExport(exportId: string) {
    const job = await this.exports.getJob(`export-${exportId}`);
    await job?.remove().catch(() => undefined); // an active job is locked by its worker: it notices the cancel itself
  }

  /** Queues an arrange run; kept an hour after it ends so the editor can read its result. */
  async addArrange(jobId: string, data: ArrangeJobData) {
    await this.arranges.add('arrange', data, { jobId, attempts: 1, removeOnComplete: { age: 3600 }, removeOnFail: { age: 3600 } });
  }

  async stopArrange(jobId: string) {
    const client = await this.arranges.client;
    await client.set(arrangeStopKey(this.settings.prefix, jobId), '1', { EX: 3600 });
  }

  /** Closes the connections once they are up: closing one mid-handshake leaves ioredis a rejected command. */
  async close() {
    await Promise.allSettled([
      this.exports.waitUntilReady(),
      this.outlines.waitUntilReady(),
      this.arranges.waitUntilReady(),
      this.analyses.waitUntilReady(),
      ...[...this.events.values()].map((e) => e.waitUntilReady()),
    ]);
    await this.arranges.close();
    await this.analyses.close();
    await Promise.all([...this.events.values()].map((e) => e.close()));
    await this.outlines.close();
    await this.exports.close();
  }
}

/** A worker for one queue with the deployment's lock, stall and concurrency settings. */
export function startWorker<T>(
  name: string,
  settings: JobSettings,
  processor: Processor<T>,
  onFailed: (job: Job<T> | undefined, error: Error) => void,
  workerName?: string,
) {
  const worker = new Worker<T>(name, processor, {
    connection: connection(settings.redisUrl),
    prefix: settings.prefix,
    concurrency: settings.concurrency,
    lockDuration: settings.lockMs,
    stalledInterval: settings.stalledMs,
    maxStalledCount: settings.maxStalls,
    name: workerName,
  });
  worker.on('failed', (job, error) => onFailed(job, error));
  // Redis errors are logged by the caller's handler; without one Node would throw them.
  worker.on('error', () => undefined);
  return worker;
}
