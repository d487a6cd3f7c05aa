import type { DataSource } from 'typeorm';
import type { ExportJobView, ExportRequest } from '@shared/schemas/exports';
import { documentProblems } from '@shared/sheet/bounds';
import type { Log } from '../../lib/log';
import { exportFileType, listZip, readFromZip } from '../../engine/export/bundle';
import { exportFileLabel } from '@shared/schemas/exports';
import { migrateDocument } from '@shared/sheet/document';
import { ExportInputError, exportSheet } from '../../engine/export/export';
import type { OutlinePool } from '../../engine/outline/pool';
import { OutlineInputError } from '../../engine/outline/errors';
import type { ExportJobData, JobQueues } from '../../jobs/queues';
import { AppError, notFound } from '../../lib/errors';
import type { Storage } from '../../storage/storage';
import type { SheetsService } from '../sheets/sheets.service';
import { exportInput } from './export-input';
import { SheetExport } from './sheet-export.entity';
import type { SheetAnalysisService } from '../shop/sheet-analysis.service';

/** The row stopped being "running" under the job (the maker stopped it): the job ends quietly. */
class ExportCancelled extends Error {}

/**
 * Export jobs: the request answers at once and queues a BullMQ job; a worker (embedded in an app, or
 * its own process anywhere) does the work (rasters in its outline thread pool, compositing in
 * sharp's threads) and reports progress in the row. The bundle of each sheet version is kept in
 * storage and can be downloaded again through any app.
 */
export class ExportsService {
  constructor(
    private readonly dataSource: DataSource,
    private readonly storage: Storage,
    private readonly pool: OutlinePool,
    private readonly sheets: SheetsService,
    private readonly analysis: SheetAnalysisService,
    private readonly log: Log,
    private readonly queues: JobQueues,
  ) {}

  private get rows() {
    return this.dataSource.getRepository(SheetExport);
  }

  private view(teamId: string, sheetId: string, r: SheetExport): ExportJobView {
    return {
      id: r.id,
      sheetVersion: r.sheetVersion,
      status: r.status,
      progress: r.progress,
      step: r.step,
      error: r.error,
      downloadUrl: r.status === 'done' ? `/api/teams/${teamId}/sheets/${sheetId}/exports/${r.id}/download` : null,
      files:
        r.status === 'done' && r.filesJson
          ? (JSON.parse(r.filesJson) as Array<{ name: string; size: number }>).map((f) => ({
              ...f,
              label: exportFileLabel(f.name),
              url: `/api/teams/${teamId}/sheets/${sheetId}/exports/${r.id}/files/${encodeURIComponent(f.name)}`,
            }))
          : [],
      createdAt: r.createdAt.toISOString(),
    };
  }

  async start(teamId: string, userId: string, sheetId: string, options: ExportRequest): Promise<ExportJobView> {
    const sheet = await this.sheets.find(teamId, sheetId);
    const doc = migrateDocument(JSON.parse(sheet.document));
    if (doc.pieces.length === 0) throw new AppError(422, 'empty_sheet', 'This sheet has no pieces yet: add art before exporting.');
    // Never printable, whatever the maker confirms: a piece far off the sheet or wider than it.
    const outOfBounds = documentProblems(doc);
    if (outOfBounds.length > 0)
      throw new AppError(422, 'out_of_bounds', `${outOfBounds[0].message(sheet.unit)} Fix it in the editor before exporting.`);
    const findings = await this.analysis.preflightFor(teamId, sheet, options.bleedMm);
    const errors = findings.filter((f) => f.severity === 'error');
    if (errors.length > 0 && !options.acceptErrors) {
      throw new AppError(
        409,
        'preflight_errors',
        `Preflight found ${errors.length} error${errors.length === 1 ? '' : 's'}: ${errors.map((f) => f.message).join(' ')} Fix them, or confirm to export anyway.`,
      );
    }
    const { id } = await this.rows.save(
      this.rows.create({
        teamId,
        sheetId,
        sheetVersion: sheet.version,
        status: 'running',
        optionsJson: JSON.stringify(options),
        documentJson: JSON.stringify(doc),
        findingsJson: JSON.stringify(findings.map((f) => `${f.severity.toUpperCase()}: ${f.message}`)),
        createdBy: userId,
        step: 'Waiting for a worker',
        queuePrefix: this.queues.settings.prefix,
      }),
    );
    try {
      await this.queues.addExport({ teamId, sheetId, exportId: id });
    } catch (error) {
      this.log.error({ err: error, exportId: id }, 'could not queue the export');
      await this.fail(id, 'The export could not be queued: the job service is not answering. Try again in a moment.');
    }
    return this.get(teamId, sheetId, id);
  }

  /** Ends a running export as failed with a message for the maker; false when it had already ended. */
  async fail(id: string, message: string): Promise<boolean> {
    const result = await this.rows.update({ id, status: 'running' }, { status: 'failed', error: message.slice(0, 500), step: 'Failed' });
    return (result.affected ?? 0) > 0;
  }

  /** The maker stops a running export: it ends at once; a worker already on it notices at its next step. */
  async cancel(teamId: string, sheetId: string, id: string): Promise<ExportJobView> {
    const view = await this.get(teamId, sheetId, id);
    if (view.status !== 'running') throw new AppError(409, 'export_finished', 'This export has already finished.');
    await this.fail(id, 'Stopped before it finished.');
    await this.queues.removeExport(id);
    return this.get(teamId, sheetId, id);
  }

  /** Moves a running job on; throws Cancelled when the row is no longer running (stopped, or failed elsewhere). */
  private async progress(id: string, fraction: number, step: string) {
    // Only a running job moves: a late progress write never undoes "done" or "failed".
    const result = await this.rows.update({ id, status: 'running' }, { progress: Number(Math.min(1, fraction).toFixed(3)), step });
    if (result.affected === 0) throw new ExportCancelled();
  }

  /**
   * The queue job: one export from its row (the document and findings it was started with). Runs in
   * whichever worker took the job; a retry after a dead worker starts again from the beginning.
   */
  async process(data: ExportJobData, timeoutMs: number): Promise<void> {
    const { teamId, exportId: id } = data;
    const row = await this.rows.findOneBy({ id, teamId });
    if (!row || row.status !== 'running') return; // stopped, or finished by an earlier attempt
    await this.rows.update({ id, status: 'running' }, { attempts: () => 'attempts + 1', progress: 0, step: 'Starting' });
    let timer: NodeJS.Timeout | undefined;
    const limit = new Promise<never>((_, reject) => {
      timer = setTimeout(
        () =>
          reject(
            new ExportInputError(
              `The export took longer than ${Math.round(timeoutMs / 60_000) || 1} minutes and was stopped. Try a lower resolution or fewer pieces.`,
            ),
          ),
        timeoutMs,
      );
    });
    try {
      await Promise.race([this.run(row), limit]);
    } catch (error) {
      if (error instanceof ExportCancelled) return;
      const known =
        error instanceof ExportInputError || (error as { code?: string }).code === 'too-large-output' || error instanceof OutlineInputError;
      if (!known) this.log.error({ err: error, exportId: id }, 'export failed');
      await this.fail(id, known ? (error as Error).message : 'The export failed on our side. Try again.');
    } finally {
      clearTimeout(timer);
    }
  }

  private async run(row: SheetExport) {
    const { id, teamId } = row;
    const sheet = await this.sheets.find(teamId, row.sheetId);
    const doc = migrateDocument(JSON.parse(row.documentJson ?? sheet.document));
    const options = JSON.parse(row.optionsJson) as ExportRequest;
    const findings: string[] = row.findingsJson ? JSON.parse(row.findingsJson) : [];
    const { pieces, paper, resolved } = await exportInput(this.dataSource, this.storage, this.pool, sheet, doc, options, (done, of) =>
      this.progress(id, 0.4 * (done / of), `Outlining piece ${done} of ${of}`),
    );
    let last = 0;
    // Progress writes run one after another and are awaited before the job is marked done.
    let writes = Promise.resolve();
    let cancelled = false;
    const result = await exportSheet(
      { name: sheet.name, unit: sheet.unit, doc, pieces, paper, preflight: findings },
      resolved,
      (fraction, step) => {
        if (fraction - last >= 0.1 || fraction === 1) {
          last = fraction;
          writes = writes
            .then(() => this.progress(id, 0.4 + 0.55 * fraction, step))
            .catch((error) => {
              if (error instanceof ExportCancelled) cancelled = true;
            });
        }
      },
    );
    await writes;
    if (cancelled) throw new ExportCancelled();
    const { key } = await this.storage.put(result.zip);
    const files = JSON.stringify(await listZip(result.zip));
    await this.rows.update(
      { id, status: 'running' },
      { status: 'done', progress: 1, step: 'Ready', zipKey: key, zipName: result.zipName, filesJson: files },
    );
  }

  /**
   * Running rows whose job the queue no longer runs (it failed after its worker died too often, or
   * vanished with a wiped Redis) end as failed with the reason: no export stays "running" for ever.
   */
  async reconcile(ids?: string[]): Promise<number> {
    // Only rows queued on this app's queue (or on none: rows from before the queue): another queue's
    // jobs are not ours to judge.
    const prefix = this.queues.settings.prefix;
    const query = this.rows
      .createQueryBuilder('e')
      .select('e.id', 'id')
      .where("e.status = 'running' AND (e.queue_prefix = :prefix OR e.queue_prefix IS NULL)", { prefix });
    if (ids?.length) query.andWhere('e.id IN (:...ids)', { ids });
    else query.andWhere('e.created_at < NOW(3) - INTERVAL 5 SECOND').limit(500);
    const rows = await query.getRawMany<{ id: string }>();
    let ended = 0;
    for (const { id } of rows) {
      const job = await this.queues.exportState(String(id)).catch(() => undefined);
      if (job === undefined) continue; // Redis not answering: decide later
      // Only a job the queue has dropped or failed is dead; any other state (waiting again after its
      // worker died, active, delayed) is still on its way.
      if (job === null || job.state === 'failed') {
        this.log.warn({ exportId: id, state: job?.state ?? 'missing', reason: job?.reason }, 'running export without a live job: ended');
        const message =
          job?.reason && /stalled/i.test(job.reason)
            ? 'The export stopped because the machine working on it went away, more than once. Try again.'
            : 'The export stopped before it finished. Try again.';
        if (await this.fail(String(id), message)) ended++;
      }
    }
    return ended;
  }

  async get(teamId: string, sheetId: string, id: string): Promise<ExportJobView> {
    let row = await this.rows.findOneBy({ id, sheetId, teamId });
    if (!row) throw notFound('That export');
    if (row.status === 'running' && Date.now() - row.createdAt.getTime() > 5000 && (await this.reconcile([id])) > 0)
      row = await this.rows.findOneByOrFail({ id });
    return this.view(teamId, sheetId, row);
  }

  /** The newest export of the sheet's current version, if any. */
  async latest(teamId: string, sheetId: string): Promise<ExportJobView | null> {
    const sheet = await this.sheets.find(teamId, sheetId);
    const row = await this.rows.findOne({ where: { sheetId, teamId, sheetVersion: sheet.version }, order: { id: 'DESC' } });
    return row ? this.view(teamId, sheetId, row) : null;
  }

  async download(teamId: string, sheetId: string, id: string): Promise<{ name: string; data: Buffer }> {
    const row = await this.rows.findOneBy({ id, sheetId, teamId, status: 'done' });
    if (!row?.zipKey) throw notFound('That export');
    return { name: row.zipName ?? 'export.zip', data: await this.storage.get(row.zipKey) };
  }

  /** One file of a finished bundle, the same bytes as in the zip. */
  async downloadFile(teamId: string, sheetId: string, id: string, name: string): Promise<{ name: string; type: string; data: Buffer }> {
    const bundle = await this.download(teamId, sheetId, id);
    const data = await readFromZip(bundle.data, name);
    if (!data) throw notFound('That file');
    return { name, type: exportFileType(name), data };
  }
}
