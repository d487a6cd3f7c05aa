// Auto-arrange runs on the shop's server: queued on BullMQ, done by any worker's threads, read back
// by the editor while they run. A run belongs to its team and sheet; another team's run is a 404.
import { randomUUID } from 'node:crypto';
import type { ArrangeResult } from '@shared/arrange/nester';
import type { ArrangeRunInput, ArrangeRunView } from '@shared/schemas/arrange';
import { AppError, notFound } from '../../lib/errors';
import type { JobQueues } from '../../jobs/queues';
import type { SheetsService } from '../sheets/sheets.service';

const jobIdOf = (id: string) => `arrange-${id}`;

export class ArrangeRunsService {
  constructor(
    private readonly sheets: SheetsService,
    private readonly queues: JobQueues,
  ) {}

  async start(teamId: string, userId: string, sheetId: string, input: ArrangeRunInput): Promise<ArrangeRunView> {
    await this.sheets.find(teamId, sheetId); // another team's sheet: 404
    const id = randomUUID();
    await this.queues.addArrange(jobIdOf(id), { teamId, sheetId, userId, input });
    return { id, state: 'waiting', progress: null, message: null };
  }

  async get(teamId: string, sheetId: string, id: string): Promise<ArrangeRunView & { result: ArrangeResult | null }> {
    // The state first, then the job: read the other way round, a run that ends in between reads as
    // done with the result it had before it ended (none).
    const state = await this.queues.arranges.getJobState(jobIdOf(id));
    const job = await this.job(teamId, sheetId, id);
    const progress = typeof job.progress === 'object' ? (job.progress as ArrangeRunView['progress']) : null;
    if (state === 'completed') return { id, state: 'done', progress, message: null, result: job.returnvalue as ArrangeResult };
    if (state === 'failed') {
      // A refusal of the nester's own is already in a maker's words; anything else is not shown raw.
      const own = job.failedReason && !/stalled|lock|Error:/i.test(job.failedReason) ? job.failedReason : null;
      return {
        id,
        state: 'failed',
        progress,
        message: own ?? 'Arranging stopped on the server before it finished; nothing was changed. Try again.',
        result: null,
      };
    }
    return { id, state: state === 'active' ? 'running' : 'waiting', progress, message: null, result: null };
  }

  /** Asks a running search to stop (it then ends with the best layout so far); a waiting one is dropped. */
  async stop(teamId: string, sheetId: string, id: string): Promise<ArrangeRunView> {
    const job = await this.job(teamId, sheetId, id);
    const state = await job.getState();
    if (state === 'completed' || state === 'failed') throw new AppError(409, 'arrange_finished', 'This arrange run has already finished.');
    await this.queues.stopArrange(jobIdOf(id));
    if (state !== 'active') {
      await job.remove().catch(() => undefined);
      return { id, state: 'failed', progress: null, message: 'Stopped before it started; nothing was changed.' };
    }
    return { id, state: 'running', progress: null, message: null };
  }

  private async job(teamId: string, sheetId: string, id: string) {
    const job = await this.queues.arranges.getJob(jobIdOf(id));
    if (!job || job.data.teamId !== teamId || job.data.sheetId !== sheetId) throw notFound('That arrange run');
    return job;
  }
}
