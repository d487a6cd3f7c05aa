import type { DataSource } from 'typeorm';
import type { ExportJobView, ExportRequest } from '../../../shared/schemas/exports';
import { documentProblems } from '../../../shared/sheet/bounds';
import type { Log } from '../../lib/log';
import { exportFileType, listZip, readFromZip } from '../../engine/export/bundle';
import { exportFileLabel } from '../../../shared/schemas/exports';
import { pieceOutlineOptions } from '../../../shared/sheet/outline-request';
import { profileLimits } from '../../../shared/sheet/preflight';
import { migrateDocument } from '../../../shared/sheet/document';
import { ExportInputError, exportSheet } from '../../engine/export/export';
import { exportPiece } from '../../engine/export/prepare';
import type { ExportOptions } from '../../engine/export/types';
import { DEFAULT_EXPORT_OPTIONS } from '../../engine/export/types';
import type { OutlinePool } from '../../engine/outline/pool';
import { AppError, notFound } from '../../lib/errors';
import type { Storage } from '../../storage/storage';
import { ArtItem } from '../art/art-item.entity';
import type { SheetsService } from './sheets.service';
import { SheetProfile } from './sheet-profile.entity';
import type { SheetAnalysisService } from '../shop/sheet-analysis.service';
import type { Finding } from '../../../shared/sheet/preflight';

type Row = { id: string; sheet_version: number; status: ExportJobView['status']; progress: string; step: string; error: string | null; zip_key: string | null; files_json: string | null; created_at: Date };

/**
 * Export jobs: the request answers at once; the work runs in the background (rasters in the outline
 * worker pool, compositing in sharp's own threads) and reports progress in its row. The bundle of
 * each sheet version is kept in storage and can be downloaded again.
 */
export class ExportsService {
  constructor(
    private readonly dataSource: DataSource,
    private readonly storage: Storage,
    private readonly pool: OutlinePool,
    private readonly sheets: SheetsService,
    private readonly analysis: SheetAnalysisService,
    private readonly log: Log,
  ) {}

  private view(teamId: string, sheetId: string, r: Row): ExportJobView {
    return {
      id: String(r.id),
      sheetVersion: r.sheet_version,
      status: r.status,
      progress: Number(r.progress),
      step: r.step,
      error: r.error,
      downloadUrl: r.status === 'done' ? `/api/teams/${teamId}/sheets/${sheetId}/exports/${r.id}/download` : null,
      files: r.status === 'done' && r.files_json
        ? (JSON.parse(r.files_json) as Array<{ name: string; size: number }>).map((f) => ({ ...f, label: exportFileLabel(f.name), url: `/api/teams/${teamId}/sheets/${sheetId}/exports/${r.id}/files/${encodeURIComponent(f.name)}` }))
        : [],
      createdAt: new Date(r.created_at).toISOString(),
    };
  }

  async start(teamId: string, userId: string, sheetId: string, options: ExportRequest): Promise<ExportJobView> {
    const sheet = await this.sheets.find(teamId, sheetId);
    const doc = migrateDocument(JSON.parse(sheet.document));
    if (doc.pieces.length === 0) throw new AppError(422, 'empty_sheet', 'This sheet has no pieces yet: add art before exporting.');
    // Never printable, whatever the maker confirms: a piece far off the sheet or wider than it.
    const outOfBounds = documentProblems(doc);
    if (outOfBounds.length > 0) throw new AppError(422, 'out_of_bounds', `${outOfBounds[0].message(sheet.unit)} Fix it in the editor before exporting.`);
    const findings = await this.analysis.preflightFor(teamId, sheet, options.bleedMm);
    const errors = findings.filter((f) => f.severity === 'error');
    if (errors.length > 0 && !options.acceptErrors) {
      throw new AppError(409, 'preflight_errors', `Preflight found ${errors.length} error${errors.length === 1 ? '' : 's'}: ${errors.map((f) => f.message).join(' ')} Fix them, or confirm to export anyway.`);
    }
    const insert = await this.dataSource.query(
      "INSERT INTO sheet_exports (team_id, sheet_id, sheet_version, status, options_json, created_by, step) VALUES (?, ?, ?, 'running', ?, ?, 'Queued')",
      [teamId, sheetId, sheet.version, JSON.stringify(options), userId],
    );
    const id = String(insert.insertId);
    void this.run(teamId, id, sheet, doc, options, findings);
    return this.get(teamId, sheetId, id);
  }

  private async progress(id: string, fraction: number, step: string) {
    // Only a running job moves: a late progress write never undoes "done" or "failed".
    await this.dataSource.query("UPDATE sheet_exports SET progress = ?, step = ? WHERE id = ? AND status = 'running'", [Math.min(1, fraction).toFixed(3), step, id]);
  }

  private async run(teamId: string, id: string, sheet: Awaited<ReturnType<SheetsService['find']>>, doc: ReturnType<typeof migrateDocument>, options: ExportRequest, findings: Finding[]) {
    try {
      const profile = sheet.profileId ? await this.dataSource.getRepository(SheetProfile).findOneBy({ id: sheet.profileId }) : null;
      const arts = new Map((await this.dataSource.getRepository(ArtItem).findBy({ teamId })).filter((a) => doc.pieces.some((p) => p.artId === a.id)).map((a) => [a.id, a]));
      const bytes = new Map<string, Buffer>();
      const pieces = [];
      for (const [i, piece] of doc.pieces.entries()) {
        const art = arts.get(piece.artId);
        if (!art) throw new ExportInputError(`Piece ${i + 1} uses art that is no longer in the team.`);
        if (!bytes.has(art.id)) bytes.set(art.id, await this.storage.get(art.storageKey));
        // The same request the editor's outline was made from, at the export's resolution.
        const request = pieceOutlineOptions(art, piece, { ...profileLimits(profile), dpi: options.dpi });
        pieces.push(await exportPiece(piece, art.name, request, options.bleedMm, (o) => this.pool.run(bytes.get(art.id)!, o)));
        await this.progress(id, 0.4 * ((i + 1) / doc.pieces.length), `Outlining piece ${i + 1} of ${doc.pieces.length}`);
      }
      const paper = profile
        ? { paperWidthMm: profile.paperWidthMm, paperHeightMm: profile.paperHeightMm, areaXMm: profile.areaXMm, areaYMm: profile.areaYMm }
        : { paperWidthMm: 215.9, paperHeightMm: 279.4, areaXMm: (215.9 - doc.printArea.width) / 2, areaYMm: (279.4 - doc.printArea.height) / 2 };
      let last = 0;
      // Progress writes run one after another and are awaited before the job is marked done.
      let writes = Promise.resolve();
      // The profile says how its cutter finds the print: the cut layer's spot colour and any printed marks.
      const resolved: ExportOptions = {
        ...options,
        spotColour: options.spotColour ?? profile?.spotColour ?? DEFAULT_EXPORT_OPTIONS.spotColour,
        marks: profile && profile.regMarkShape !== 'none' ? { shape: profile.regMarkShape, sizeMm: profile.regMarkSizeMm, offsetMm: profile.regMarkOffsetMm } : null,
      };
      const result = await exportSheet({ name: sheet.name, unit: sheet.unit, doc, pieces, paper, preflight: findings.map((f) => `${f.severity.toUpperCase()}: ${f.message}`) }, resolved, (fraction, step) => {
        if (fraction - last >= 0.1 || fraction === 1) {
          last = fraction;
          writes = writes.then(() => this.progress(id, 0.4 + 0.55 * fraction, step)).catch(() => undefined);
        }
      });
      await writes;
      const { key } = await this.storage.put(result.zip);
      const files = JSON.stringify(await listZip(result.zip));
      await this.dataSource.query("UPDATE sheet_exports SET status = 'done', progress = 1, step = 'Ready', zip_key = ?, zip_name = ?, files_json = ? WHERE id = ?", [key, result.zipName, files, id]);
    } catch (error) {
      const message = error instanceof ExportInputError || (error as { code?: string }).code ? (error as Error).message : 'The export failed on our side. Try again.';
      if (!(error instanceof ExportInputError)) this.log.error({ err: error, exportId: id }, 'export failed');
      await this.dataSource.query("UPDATE sheet_exports SET status = 'failed', error = ?, step = 'Failed' WHERE id = ?", [message.slice(0, 500), id]);
    }
  }

  async get(teamId: string, sheetId: string, id: string): Promise<ExportJobView> {
    const [row] = await this.dataSource.query('SELECT * FROM sheet_exports WHERE id = ? AND sheet_id = ? AND team_id = ?', [id, sheetId, teamId]);
    if (!row) throw notFound('That export');
    return this.view(teamId, sheetId, row);
  }

  /** The newest export of the sheet's current version, if any. */
  async latest(teamId: string, sheetId: string): Promise<ExportJobView | null> {
    const sheet = await this.sheets.find(teamId, sheetId);
    const [row] = await this.dataSource.query('SELECT * FROM sheet_exports WHERE sheet_id = ? AND team_id = ? AND sheet_version = ? ORDER BY id DESC LIMIT 1', [sheetId, teamId, sheet.version]);
    return row ? this.view(teamId, sheetId, row) : null;
  }

  async download(teamId: string, sheetId: string, id: string): Promise<{ name: string; data: Buffer }> {
    const [row] = await this.dataSource.query("SELECT zip_key, zip_name FROM sheet_exports WHERE id = ? AND sheet_id = ? AND team_id = ? AND status = 'done'", [id, sheetId, teamId]);
    if (!row) throw notFound('That export');
    return { name: row.zip_name, data: await this.storage.get(row.zip_key) };
  }

  /** One file of a finished bundle, the same bytes as in the zip. */
  async downloadFile(teamId: string, sheetId: string, id: string, name: string): Promise<{ name: string; type: string; data: Buffer }> {
    const bundle = await this.download(teamId, sheetId, id);
    const data = await readFromZip(bundle.data, name);
    if (!data) throw notFound('That file');
    return { name, type: exportFileType(name), data };
  }
}
