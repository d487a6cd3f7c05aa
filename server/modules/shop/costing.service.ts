import type { DataSource } from 'typeorm';
import { In, IsNull } from 'typeorm';
import type { z } from 'zod';
import type { SheetSummary } from '@shared/schemas/sheets';
import type { costingInputSchema, SheetAnalysis, SheetCostView, ShopSettings } from '@shared/schemas/shop';
import { costPerSheet, sheetCost } from '@shared/production/cost';
import { notFound } from '../../lib/errors';
import type { SheetsService } from '../sheets/sheets.service';
import { Sheet } from '../sheets/sheet.entity';
import { Blade, Machine } from './machine.entity';
import { PrintRun } from './print-run.entity';
import { ShopSettingsRow } from './shop-settings.entity';
import { StockItem } from './stock-item.entity';
import type { SheetAnalysisService } from './sheet-analysis.service';
import type { OutlineAccess } from '../outlines/outline.service';

type Costing = z.infer<typeof costingInputSchema>;
const ownCosting = (sheet: Pick<Sheet, 'stockId' | 'printerId' | 'cutterId' | 'labourMinutes'>): Costing => ({
  stockId: sheet.stockId,
  printerId: sheet.printerId,
  cutterId: sheet.cutterId,
  labourMinutes: sheet.labourMinutes,
});
const DEFAULT_SETTINGS: ShopSettings = {
  currency: '$',
  labourRatePerHour: 0,
  markupPercent: 100,
  wastePercent: 0,
  defaultStockId: null,
  defaultPrinterId: null,
  defaultCutterId: null,
  currencyCode: 'USD',
  viewersSeePrices: true,
};

/** Stores a team's shop rates (used by the API and by the demo seed). */
export async function saveShopSettings(dataSource: DataSource, teamId: string, s: ShopSettings): Promise<void> {
  await dataSource.getRepository(ShopSettingsRow).upsert(
    {
      teamId,
      currency: s.currency,
      labourRate: s.labourRatePerHour,
      markupPercent: s.markupPercent,
      wastePercent: s.wastePercent,
      defaultStockId: s.defaultStockId,
      defaultPrinterId: s.defaultPrinterId,
      defaultCutterId: s.defaultCutterId,
      currencyCode: s.currencyCode,
      viewersSeePrices: s.viewersSeePrices,
    },
    ['teamId'],
  );
}

/**
 * What a sheet costs: the stock's price per sheet, ink from the print image's coverage, the
 * blade's wear share, the shop's waste allowance on those and optional labour, with a price at the
 * shop's markup. Inputs the maker has not chosen count as zero and are listed as missing; without a
 * stock the sheet is not priced at all.
 */
export class CostingService {
  constructor(
    private readonly dataSource: DataSource,
    private readonly sheets: SheetsService,
    private readonly analysis: SheetAnalysisService,
  ) {}

  async settings(teamId: string): Promise<ShopSettings> {
    const row = await this.dataSource.getRepository(ShopSettingsRow).findOneBy({ teamId });
    return row
      ? {
          currency: row.currency,
          labourRatePerHour: row.labourRate,
          markupPercent: row.markupPercent,
          wastePercent: row.wastePercent,
          defaultStockId: row.defaultStockId,
          defaultPrinterId: row.defaultPrinterId,
          defaultCutterId: row.defaultCutterId,
          currencyCode: row.currencyCode as ShopSettings['currencyCode'],
          viewersSeePrices: row.viewersSeePrices,
        }
      : DEFAULT_SETTINGS;
  }

  async saveSettings(teamId: string, s: ShopSettings): Promise<ShopSettings> {
    // The usual stock and machines must be the team's own (another team's id is a 404, as elsewhere).
    if (s.defaultStockId && !(await this.dataSource.getRepository(StockItem).existsBy({ id: s.defaultStockId, teamId })))
      throw notFound('That stock');
    for (const [id, kind] of [
      [s.defaultPrinterId, 'printer'],
      [s.defaultCutterId, 'cutter'],
    ] as const)
      if (id && !(await this.dataSource.getRepository(Machine).existsBy({ id, teamId, kind }))) throw notFound('That machine');
    await saveShopSettings(this.dataSource, teamId, s);
    return this.settings(teamId);
  }

  /**
   * What sheets that have chosen nothing are costed on: what each one's last run used, else the
   * team's usual stock, printer and cutter (shop rates), else what the team's last run used.
   */
  private async runDefaults(teamId: string, sheetIds: string[]) {
    const query = (sheetIds: string[] | null) => {
      const q = this.dataSource
        .getRepository(PrintRun)
        .createQueryBuilder('r')
        .innerJoin(StockItem, 's', 's.id = r.stock_id AND s.archived_at IS NULL')
        .select(['r.sheet_id AS sheet_id', 'r.stock_id AS stock_id', 'r.printer_id AS printer_id', 'r.cutter_id AS cutter_id'])
        .where('r.team_id = :teamId', { teamId })
        .orderBy('r.printed_on', 'DESC')
        .addOrderBy('r.id', 'DESC');
      if (sheetIds) q.andWhere('r.sheet_id IN (:...sheetIds)', { sheetIds });
      else q.limit(1);
      return q.getRawMany<{ sheet_id: string | null; stock_id: string; printer_id: string | null; cutter_id: string | null }>();
    };
    const pick = (r: { stock_id: string; printer_id: string | null; cutter_id: string | null }) => ({
      stockId: String(r.stock_id),
      printerId: r.printer_id === null ? null : String(r.printer_id),
      cutterId: r.cutter_id === null ? null : String(r.cutter_id),
    });
    const bySheet = new Map<string, ReturnType<typeof pick>>();
    if (sheetIds.length)
      for (const r of await query(sheetIds)) if (!bySheet.has(String(r.sheet_id))) bySheet.set(String(r.sheet_id), pick(r));
    const [latest] = await query(null);
    const usual = await this.settings(teamId);
    return (sheetId: string, own: Costing): { costing: Costing; defaultsFrom: SheetCostView['defaultsFrom'] } => {
      if (own.stockId || own.printerId || own.cutterId) return { costing: own, defaultsFrom: null };
      const fromSheet = bySheet.get(sheetId);
      if (fromSheet) return { costing: { ...own, ...fromSheet }, defaultsFrom: 'sheet-run' };
      if (usual.defaultStockId)
        return {
          costing: { ...own, stockId: usual.defaultStockId, printerId: usual.defaultPrinterId, cutterId: usual.defaultCutterId },
          defaultsFrom: 'team-default',
        };
      if (latest) return { costing: { ...own, ...pick(latest) }, defaultsFrom: 'team-run' };
      return { costing: own, defaultsFrom: null };
    };
  }

  private async costingOf(teamId: string, sheetId: string) {
    const sheet = await this.dataSource.getRepository(Sheet).findOneBy({ id: sheetId, teamId });
    if (!sheet) throw notFound('That sheet');
    return (await this.runDefaults(teamId, [sheetId]))(sheetId, ownCosting(sheet));
  }

  /** Chooses what a sheet is costed on. Not part of the document: no new version, no save conflict. */
  async setCosting(teamId: string, sheetId: string, c: Costing): Promise<SheetCostView> {
    await this.sheets.find(teamId, sheetId);
    if (c.stockId && !(await this.dataSource.getRepository(StockItem).existsBy({ id: c.stockId, teamId }))) throw notFound('That stock');
    for (const [id, kind] of [
      [c.printerId, 'printer'],
      [c.cutterId, 'cutter'],
    ] as const)
      if (id && !(await this.dataSource.getRepository(Machine).existsBy({ id, teamId, kind }))) throw notFound('That machine');
    await this.dataSource
      .getRepository(Sheet)
      .update({ id: sheetId }, { stockId: c.stockId, printerId: c.printerId, cutterId: c.cutterId, labourMinutes: c.labourMinutes });
    return this.cost(teamId, sheetId);
  }

  private async compute(
    teamId: string,
    analysis: SheetAnalysis,
    costing: Costing,
    settings: ShopSettings,
  ): Promise<Omit<SheetCostView, 'analysis'>> {
    const stock = costing.stockId ? await this.dataSource.getRepository(StockItem).findOneBy({ id: costing.stockId, teamId }) : null;
    const printer = costing.printerId ? await this.dataSource.getRepository(Machine).findOneBy({ id: costing.printerId, teamId }) : null;
    const blade = costing.cutterId
      ? await this.dataSource
          .getRepository(Blade)
          .findOne({ where: { cutterId: costing.cutterId, teamId, removedOn: IsNull() }, order: { id: 'DESC' } })
      : null;
    const inputs: SheetCostView['inputs'] = {
      stock: stock
        ? {
            name: stock.name,
            packPrice: stock.packPrice,
            sheetsPerPack: stock.sheetsPerPack,
            perSheet: costPerSheet(stock.packPrice, stock.sheetsPerPack),
          }
        : null,
      printer: printer ? { name: printer.name, inkFullPage: printer.inkFullPage ?? 0 } : null,
      blade: blade ? { label: blade.label, price: blade.price, lifeM: blade.lifeM } : null,
      labourRatePerHour: settings.labourRatePerHour,
      markupPercent: settings.markupPercent,
      wastePercent: settings.wastePercent,
      currency: settings.currency,
    };
    const missing = [!inputs.stock && 'stock', !inputs.printer && 'printer', !inputs.blade && 'cutter blade'].filter(
      (m): m is string => !!m,
    );
    const cost = sheetCost({
      stockPerSheet: inputs.stock?.perSheet ?? 0,
      coverage: analysis.coverage.total,
      printAreaShare: analysis.printAreaShare,
      inkFullPage: inputs.printer?.inkFullPage ?? 0,
      cutLengthMm: analysis.cutLengthMm,
      bladePrice: inputs.blade?.price ?? 0,
      bladeLifeM: inputs.blade?.lifeM ?? 0,
      labourMinutes: costing.labourMinutes,
      labourRatePerHour: settings.labourRatePerHour,
      pieces: analysis.pieces,
      markupPercent: settings.markupPercent,
      wastePercent: settings.wastePercent,
    });
    return { costing, inputs, cost, missing, priced: inputs.stock !== null, defaultsFrom: null };
  }

  async cost(teamId: string, sheetId: string, access: OutlineAccess = 'compute'): Promise<SheetCostView> {
    const sheet = await this.sheets.find(teamId, sheetId);
    const analysis = await this.analysis.analyse(teamId, sheet, access);
    const { costing, defaultsFrom } = await this.costingOf(teamId, sheetId);
    return { analysis, ...(await this.compute(teamId, analysis, costing, await this.settings(teamId))), defaultsFrom };
  }

  /** Adds each sheet's cost from its last analysis (marked stale when the sheet changed since). */
  async attach(teamId: string, list: SheetSummary[]): Promise<SheetSummary[]> {
    if (list.length === 0) return list;
    const rows = await this.dataSource.getRepository(Sheet).find({
      where: { teamId, id: In(list.map((s) => s.id)) },
      select: {
        id: true,
        version: true,
        analysisJson: true,
        analysisVersion: true,
        stockId: true,
        printerId: true,
        cutterId: true,
        labourMinutes: true,
      },
    });
    const settings = await this.settings(teamId);
    const defaults = await this.runDefaults(
      teamId,
      list.map((s) => s.id),
    );
    const byId = new Map(rows.map((r) => [r.id, r]));
    const out: SheetSummary[] = [];
    for (const s of list) {
      const r = byId.get(s.id);
      if (!r?.analysisJson) {
        out.push({ ...s, cost: null });
        continue;
      }
      const { cost, priced } = await this.compute(teamId, JSON.parse(r.analysisJson), defaults(s.id, ownCosting(r)).costing, settings);
      out.push({
        ...s,
        cost: {
          sheet: cost.sheet,
          perSticker: cost.perSticker,
          currency: settings.currency,
          current: r.analysisVersion === r.version,
          priced,
        },
      });
    }
    return out;
  }
}
