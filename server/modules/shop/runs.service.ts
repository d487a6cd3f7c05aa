import sharp from 'sharp';
import type { DataSource } from 'typeorm';
import type { z } from 'zod';
import type { PrintRunInput, PrintRunView, runListQuerySchema } from '../../../shared/schemas/shop';
import { cutterSettingsSchema, printerSettingsSchema } from '../../../shared/schemas/shop';
import { AppError, notFound, validationError } from '../../lib/errors';
import type { Storage } from '../../storage/storage';
import type { SheetsService } from '../sheets/sheets.service';
import type { MachinesService } from './machines.service';
import type { SheetAnalysisService } from './sheet-analysis.service';
import type { StockService } from './stock.service';
import { stockShort } from './stock.service';
import { inTransaction } from '../../db/transaction';

const today = () => new Date().toISOString().slice(0, 10);
const PHOTO_MAX_PIXELS = 40_000_000;

/**
 * Print runs: what was printed and cut, on what, and how it came out. Recording one takes the
 * sheets from stock and adds the sheet's cut length × copies to the fitted blade, in one
 * transaction with the run itself: if any part fails, none of it is kept.
 */
export class RunsService {
  constructor(
    private readonly dataSource: DataSource,
    private readonly storage: Storage,
    private readonly sheets: SheetsService,
    private readonly stock: StockService,
    private readonly machines: MachinesService,
    private readonly analysis: SheetAnalysisService,
  ) {}

  async record(teamId: string, userId: string, input: PrintRunInput): Promise<PrintRunView> {
    const sheet = await this.sheets.find(teamId, input.sheetId);
    // Computed before the transaction: it may outline art, which must not hold row locks.
    const { cutLengthMm, pieces } = await this.analysis.analyse(teamId, sheet);
    if (pieces === 0) throw validationError({ sheetId: 'This sheet has no pieces to print' }, 'This sheet has no pieces to print.');
    const runCut = cutLengthMm * input.copies;
    const id = await inTransaction(this.dataSource, async (manager) => {
      const stock = await this.stock.row(teamId, input.stockId, manager, true);
      // Retired things stay for the runs that used them, but take no new runs.
      if (stock.archived_at)
        throw validationError({ stockId: 'This stock is retired: pick stock from the shelf' }, 'This stock is retired.');
      if (input.printerId && (await this.machines.machineIn(manager, teamId, input.printerId, 'printer')).archived_at)
        throw validationError({ printerId: 'This printer is retired: pick another' }, 'This printer is retired.');
      let bladeId: string | null = null;
      if (input.cutterId) {
        if ((await this.machines.machineIn(manager, teamId, input.cutterId, 'cutter')).archived_at)
          throw validationError({ cutterId: 'This cutter is retired: pick another' }, 'This cutter is retired.');
        const blade = await this.machines.fittedBlade(manager, input.cutterId);
        if (!blade)
          throw validationError(
            { cutterId: 'This cutter has no blade logged: fit one first' },
            'This cutter has no blade logged: fit one first.',
          );
        bladeId = String(blade.id);
      }
      if (stock.on_hand < input.copies && !input.confirmNegativeStock) throw stockShort(stock.on_hand, input.copies);
      await manager.query('UPDATE stock_items SET on_hand = on_hand - ? WHERE id = ?', [input.copies, stock.id]);
      if (bladeId) await manager.query('UPDATE blades SET cut_length_mm = cut_length_mm + ? WHERE id = ?', [runCut, bladeId]);
      const settings = {
        printer: input.printerSettings ?? printerSettingsSchema.parse(JSON.parse(stock.printer_settings)),
        cutter: input.cutterSettings ?? cutterSettingsSchema.parse(JSON.parse(stock.cutter_settings)),
      };
      const r = await manager.query(
        'INSERT INTO print_runs (team_id, sheet_id, sheet_name, sheet_version, copies, wasted, stock_id, printer_id, cutter_id, blade_id, settings_json, result, notes, cut_length_mm, printed_on, created_by) VALUES (?,?,?,?,?,?,?,?,?,?,?,?,?,?,?,?)',
        [
          teamId,
          sheet.id,
          sheet.name,
          sheet.version,
          input.copies,
          input.wasted ?? (input.result === 'good' ? 0 : input.copies),
          stock.id,
          input.printerId,
          input.cutterId,
          bladeId,
          JSON.stringify(settings),
          input.result,
          input.notes || null,
          runCut,
          input.printedOn ?? today(),
          userId,
        ],
      );
      return String(r.insertId);
    });
    return this.get(teamId, id);
  }

  async list(teamId: string, q: z.infer<typeof runListQuerySchema>): Promise<PrintRunView[]> {
    const where = ['r.team_id = ?'];
    const args: unknown[] = [teamId];
    const filter = (value: unknown, sql: string) => {
      if (!value) return;
      where.push(sql);
      args.push(value);
    };
    filter(q.from, 'r.printed_on >= ?');
    filter(q.to, 'r.printed_on <= ?');
    filter(q.result, 'r.result = ?');
    filter(q.stockId, 'r.stock_id = ?');
    filter(q.cutterId, 'r.cutter_id = ?');
    filter(q.sheetId, 'r.sheet_id = ?');
    const rows = await this.dataSource.query(
      `SELECT r.*, DATE_FORMAT(r.printed_on, '%Y-%m-%d') AS day, s.name AS stock_name, p.name AS printer_name, c.name AS cutter_name, b.label AS blade_label, u.name AS by_name
       FROM print_runs r
       LEFT JOIN stock_items s ON s.id = r.stock_id LEFT JOIN machines p ON p.id = r.printer_id LEFT JOIN machines c ON c.id = r.cutter_id
       LEFT JOIN blades b ON b.id = r.blade_id LEFT JOIN users u ON u.id = r.created_by
       WHERE ${where.join(' AND ')} ORDER BY r.printed_on DESC, r.id DESC LIMIT 1000`,
      args,
    );
    return rows.map((r: Record<string, never>) => {
      const settings = JSON.parse(r.settings_json);
      const ref = (id: unknown, name: unknown) => (id === null ? null : { id: String(id), name: String(name ?? 'Removed') });
      return {
        id: String(r.id),
        sheet: { id: r.sheet_id === null ? null : String(r.sheet_id), name: r.sheet_name, version: r.sheet_version },
        copies: r.copies,
        wasted: r.wasted,
        stock: ref(r.stock_id, r.stock_name),
        printer: ref(r.printer_id, r.printer_name),
        cutter: ref(r.cutter_id, r.cutter_name),
        blade: r.blade_id === null ? null : { id: String(r.blade_id), label: r.blade_label ?? 'Removed' },
        printerSettings: settings.printer,
        cutterSettings: settings.cutter,
        result: r.result,
        notes: r.notes ?? '',
        photoUrl: r.photo_key ? `/api/teams/${teamId}/print-runs/${r.id}/photo` : null,
        cutLengthM: Number(r.cut_length_mm) / 1000,
        printedOn: r.day,
        by: r.by_name ?? 'Former member',
      } satisfies PrintRunView;
    });
  }

  async get(teamId: string, id: string): Promise<PrintRunView> {
    const [row] = await this.dataSource.query('SELECT printed_on FROM print_runs WHERE id = ? AND team_id = ?', [id, teamId]);
    if (!row) throw notFound('That print run');
    const run = (await this.list(teamId, {})).find((r) => r.id === id);
    if (!run) throw notFound('That print run');
    return run;
  }

  /** A photo of the printed sheet: any image sharp reads, stored as a JPEG at most 1600 px across. */
  async attachPhoto(teamId: string, id: string, bytes: Buffer): Promise<PrintRunView> {
    await this.get(teamId, id);
    let jpeg: Buffer;
    try {
      jpeg = await sharp(bytes, { limitInputPixels: PHOTO_MAX_PIXELS })
        .rotate()
        .resize(1600, 1600, { fit: 'inside', withoutEnlargement: true })
        .jpeg({ quality: 82 })
        .toBuffer();
    } catch {
      throw new AppError(422, 'unreadable_image', 'That file is not a photo we can read (JPEG, PNG or WebP, at most 40 megapixels).');
    }
    const { key } = await this.storage.put(jpeg);
    await this.dataSource.query('UPDATE print_runs SET photo_key = ? WHERE id = ? AND team_id = ?', [key, id, teamId]);
    return this.get(teamId, id);
  }

  async photo(teamId: string, id: string): Promise<Buffer> {
    const [row] = await this.dataSource.query('SELECT photo_key FROM print_runs WHERE id = ? AND team_id = ?', [id, teamId]);
    if (!row?.photo_key) throw notFound('That photo');
    return this.storage.get(row.photo_key);
  }
}
