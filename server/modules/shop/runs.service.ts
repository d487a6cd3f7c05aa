import sharp from 'sharp';
import type { DataSource } from 'typeorm';
import type { z } from 'zod';
import type { PrintRunInput, PrintRunView, runListQuerySchema } from '@shared/schemas/shop';
import { cutterSettingsSchema, printerSettingsSchema } from '@shared/schemas/shop';
import { AppError, notFound, validationError } from '../../lib/errors';
import type { Storage } from '../../storage/storage';
import type { SheetsService } from '../sheets/sheets.service';
import type { MachinesService } from './machines.service';
import type { SheetAnalysisService } from './sheet-analysis.service';
import type { StockService } from './stock.service';
import { stockShort } from './stock.service';
import { inTransaction } from '../../db/transaction';
import { User } from '../accounts/user.entity';
import { Blade, Machine } from './machine.entity';
import { PrintRun } from './print-run.entity';
import { StockItem } from './stock-item.entity';

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
      if (stock.archivedAt)
        throw validationError({ stockId: 'This stock is retired: pick stock from the shelf' }, 'This stock is retired.');
      if (input.printerId && (await this.machines.machineIn(manager, teamId, input.printerId, 'printer')).archivedAt)
        throw validationError({ printerId: 'This printer is retired: pick another' }, 'This printer is retired.');
      let bladeId: string | null = null;
      if (input.cutterId) {
        if ((await this.machines.machineIn(manager, teamId, input.cutterId, 'cutter')).archivedAt)
          throw validationError({ cutterId: 'This cutter is retired: pick another' }, 'This cutter is retired.');
        const blade = await this.machines.fittedBlade(manager, input.cutterId);
        if (!blade)
          throw validationError(
            { cutterId: 'This cutter has no blade logged: fit one first' },
            'This cutter has no blade logged: fit one first.',
          );
        bladeId = String(blade.id);
      }
      // The orders module comes after this one (it prices from the shop), so its table is read by name here.
      if (
        input.orderId &&
        !(await manager
          .createQueryBuilder()
          .select('o.id')
          .from('orders', 'o')
          .where('o.id = :id AND o.team_id = :teamId', { id: input.orderId, teamId })
          .getRawOne())
      )
        throw notFound('That order');
      if (stock.onHand < input.copies && !input.confirmNegativeStock) throw stockShort(stock.onHand, input.copies);
      await manager.getRepository(StockItem).decrement({ id: stock.id }, 'onHand', input.copies);
      if (bladeId) await manager.getRepository(Blade).increment({ id: bladeId }, 'cutLengthMm', runCut);
      const settings = {
        printer: input.printerSettings ?? printerSettingsSchema.parse(JSON.parse(stock.printerSettings)),
        cutter: input.cutterSettings ?? cutterSettingsSchema.parse(JSON.parse(stock.cutterSettings)),
      };
      const runs = manager.getRepository(PrintRun);
      const run = await runs.save(
        runs.create({
          teamId,
          sheetId: sheet.id,
          sheetName: sheet.name,
          sheetVersion: sheet.version,
          copies: input.copies,
          wasted: input.wasted ?? (input.result === 'good' ? 0 : input.copies),
          stockId: stock.id,
          printerId: input.printerId,
          cutterId: input.cutterId,
          bladeId,
          settingsJson: JSON.stringify(settings),
          result: input.result,
          notes: input.notes || null,
          cutLengthMm: runCut,
          printedOn: input.printedOn ?? today(),
          createdBy: userId,
          orderId: input.orderId,
        }),
      );
      return run.id;
    });
    return this.get(teamId, id);
  }

  async list(teamId: string, q: z.infer<typeof runListQuerySchema>): Promise<PrintRunView[]> {
    const query = this.dataSource
      .getRepository(PrintRun)
      .createQueryBuilder('r')
      .leftJoin(StockItem, 's', 's.id = r.stock_id')
      .leftJoin(Machine, 'p', 'p.id = r.printer_id')
      .leftJoin(Machine, 'c', 'c.id = r.cutter_id')
      .leftJoin(Blade, 'b', 'b.id = r.blade_id')
      .leftJoin(User, 'u', 'u.id = r.created_by')
      .select('r.*')
      .addSelect("DATE_FORMAT(r.printed_on, '%Y-%m-%d')", 'day')
      .addSelect('s.name', 'stock_name')
      .addSelect('p.name', 'printer_name')
      .addSelect('c.name', 'cutter_name')
      .addSelect('b.label', 'blade_label')
      .addSelect('u.name', 'by_name')
      .where('r.team_id = :teamId', { teamId });
    if (q.from) query.andWhere('r.printed_on >= :from', { from: q.from });
    if (q.to) query.andWhere('r.printed_on <= :to', { to: q.to });
    if (q.result) query.andWhere('r.result = :result', { result: q.result });
    if (q.stockId) query.andWhere('r.stock_id = :stockId', { stockId: q.stockId });
    if (q.cutterId) query.andWhere('r.cutter_id = :cutterId', { cutterId: q.cutterId });
    if (q.sheetId) query.andWhere('r.sheet_id = :sheetId', { sheetId: q.sheetId });
    if (q.orderId) query.andWhere('r.order_id = :orderId', { orderId: q.orderId });
    const rows = await query.orderBy('r.printed_on', 'DESC').addOrderBy('r.id', 'DESC').limit(1000).getRawMany();
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
        orderId: r.order_id === null ? null : String(r.order_id),
      } satisfies PrintRunView;
    });
  }

  async get(teamId: string, id: string): Promise<PrintRunView> {
    if (!(await this.dataSource.getRepository(PrintRun).existsBy({ id, teamId }))) throw notFound('That print run');
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
    await this.dataSource.getRepository(PrintRun).update({ id, teamId }, { photoKey: key });
    return this.get(teamId, id);
  }

  async photo(teamId: string, id: string): Promise<Buffer> {
    const row = await this.dataSource.getRepository(PrintRun).findOneBy({ id, teamId });
    if (!row?.photoKey) throw notFound('That photo');
    return this.storage.get(row.photoKey);
  }
}
