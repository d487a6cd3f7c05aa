import type { DataSource } from 'typeorm';
import type { z } from 'zod';
import type { SheetSummary } from '../../../shared/schemas/sheets';
import type { costingInputSchema, SheetAnalysis, SheetCostView, ShopSettings } from '../../../shared/schemas/shop';
import { costPerSheet, sheetCost } from '../../../shared/production/cost';
import { notFound } from '../../lib/errors';
import type { SheetsService } from '../sheets/sheets.service';
import type { SheetAnalysisService } from './sheet-analysis.service';
import type { OutlineAccess } from '../outlines/outline.service';

type Costing = z.infer<typeof costingInputSchema>;
const idOf = (v: unknown) => (v === null || v === undefined ? null : String(v));
const ownCosting = (row: { stock_id: unknown; printer_id: unknown; cutter_id: unknown; labour_minutes: unknown }): Costing => ({
  stockId: idOf(row.stock_id),
  printerId: idOf(row.printer_id),
  cutterId: idOf(row.cutter_id),
  labourMinutes: Number(row.labour_minutes),
});
const DEFAULT_SETTINGS: ShopSettings = { currency: '$', labourRatePerHour: 0, markupPercent: 100, wastePercent: 0 };

/** Stores a team's shop rates (used by the API and by the demo seed). */
export async function saveShopSettings(dataSource: DataSource, teamId: string, s: ShopSettings): Promise<void> {
  await dataSource.query(
    'INSERT INTO shop_settings (team_id, currency, labour_rate, markup_percent, waste_percent) VALUES (?,?,?,?,?) ON DUPLICATE KEY UPDATE currency = VALUES(currency), labour_rate = VALUES(labour_rate), markup_percent = VALUES(markup_percent), waste_percent = VALUES(waste_percent)',
    [teamId, s.currency, s.labourRatePerHour, s.markupPercent, s.wastePercent],
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
    const [row] = await this.dataSource.query('SELECT * FROM shop_settings WHERE team_id = ?', [teamId]);
    return row
      ? {
          currency: row.currency,
          labourRatePerHour: Number(row.labour_rate),
          markupPercent: Number(row.markup_percent),
          wastePercent: Number(row.waste_percent),
        }
      : DEFAULT_SETTINGS;
  }

  async saveSettings(teamId: string, s: ShopSettings): Promise<ShopSettings> {
    await saveShopSettings(this.dataSource, teamId, s);
    return this.settings(teamId);
  }

  /**
   * What sheets that have chosen nothing are costed on: what each one's last run used, else what
   * the team's last run used (the stock, printer and cutter the shop is using now).
   */
  private async runDefaults(teamId: string, sheetIds: string[]) {
    const query = (where: string, params: unknown[], limit = '') =>
      this.dataSource.query(
        `SELECT r.sheet_id, r.stock_id, r.printer_id, r.cutter_id FROM print_runs r JOIN stock_items s ON s.id = r.stock_id
         WHERE r.team_id = ? AND s.archived_at IS NULL AND ${where} ORDER BY r.printed_on DESC, r.id DESC ${limit}`,
        [teamId, ...params],
      ) as Promise<Array<{ sheet_id: string | null; stock_id: string; printer_id: string | null; cutter_id: string | null }>>;
    const pick = (r: { stock_id: string; printer_id: string | null; cutter_id: string | null }) => ({
      stockId: String(r.stock_id),
      printerId: r.printer_id === null ? null : String(r.printer_id),
      cutterId: r.cutter_id === null ? null : String(r.cutter_id),
    });
    const bySheet = new Map<string, ReturnType<typeof pick>>();
    if (sheetIds.length)
      for (const r of await query(`r.sheet_id IN (${sheetIds.map(() => '?').join(',')})`, sheetIds))
        if (!bySheet.has(String(r.sheet_id))) bySheet.set(String(r.sheet_id), pick(r));
    const [latest] = await query('1 = 1', [], 'LIMIT 1');
    return (sheetId: string, own: Costing): { costing: Costing; defaultsFrom: SheetCostView['defaultsFrom'] } => {
      if (own.stockId || own.printerId || own.cutterId) return { costing: own, defaultsFrom: null };
      const fromSheet = bySheet.get(sheetId);
      if (fromSheet) return { costing: { ...own, ...fromSheet }, defaultsFrom: 'sheet-run' };
      if (latest) return { costing: { ...own, ...pick(latest) }, defaultsFrom: 'team-run' };
      return { costing: own, defaultsFrom: null };
    };
  }

  private async costingOf(teamId: string, sheetId: string) {
    const [row] = await this.dataSource.query(
      'SELECT stock_id, printer_id, cutter_id, labour_minutes FROM sheets WHERE id = ? AND team_id = ?',
      [sheetId, teamId],
    );
    if (!row) throw notFound('That sheet');
    return (await this.runDefaults(teamId, [sheetId]))(sheetId, ownCosting(row));
  }

  /** Chooses what a sheet is costed on. Not part of the document: no new version, no save conflict. */
  async setCosting(teamId: string, sheetId: string, c: Costing): Promise<SheetCostView> {
    await this.sheets.find(teamId, sheetId);
    const owned = async (table: string, id: string | null, extra = '') => {
      if (id === null) return;
      const [row] = await this.dataSource.query(`SELECT id FROM ${table} WHERE id = ? AND team_id = ?${extra}`, [id, teamId]);
      if (!row) throw notFound(table === 'stock_items' ? 'That stock' : 'That machine');
    };
    await owned('stock_items', c.stockId);
    await owned('machines', c.printerId, " AND kind = 'printer'");
    await owned('machines', c.cutterId, " AND kind = 'cutter'");
    await this.dataSource.query('UPDATE sheets SET stock_id = ?, printer_id = ?, cutter_id = ?, labour_minutes = ? WHERE id = ?', [
      c.stockId,
      c.printerId,
      c.cutterId,
      c.labourMinutes,
      sheetId,
    ]);
    return this.cost(teamId, sheetId);
  }

  private async compute(
    teamId: string,
    analysis: SheetAnalysis,
    costing: Costing,
    settings: ShopSettings,
  ): Promise<Omit<SheetCostView, 'analysis'>> {
    const [stock] = costing.stockId
      ? await this.dataSource.query('SELECT name, pack_price, sheets_per_pack FROM stock_items WHERE id = ? AND team_id = ?', [
          costing.stockId,
          teamId,
        ])
      : [];
    const [printer] = costing.printerId
      ? await this.dataSource.query('SELECT name, ink_full_page FROM machines WHERE id = ? AND team_id = ?', [costing.printerId, teamId])
      : [];
    const [blade] = costing.cutterId
      ? await this.dataSource.query(
          'SELECT label, price, life_m FROM blades WHERE cutter_id = ? AND team_id = ? AND removed_on IS NULL ORDER BY id DESC LIMIT 1',
          [costing.cutterId, teamId],
        )
      : [];
    const inputs: SheetCostView['inputs'] = {
      stock: stock
        ? {
            name: stock.name,
            packPrice: Number(stock.pack_price),
            sheetsPerPack: stock.sheets_per_pack,
            perSheet: costPerSheet(Number(stock.pack_price), stock.sheets_per_pack),
          }
        : null,
      printer: printer ? { name: printer.name, inkFullPage: Number(printer.ink_full_page ?? 0) } : null,
      blade: blade ? { label: blade.label, price: Number(blade.price), lifeM: Number(blade.life_m) } : null,
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
    const rows: Array<{
      id: string;
      version: number;
      analysis_json: string | null;
      analysis_version: number | null;
      stock_id: string | null;
      printer_id: string | null;
      cutter_id: string | null;
      labour_minutes: string;
    }> = await this.dataSource.query(
      `SELECT id, version, analysis_json, analysis_version, stock_id, printer_id, cutter_id, labour_minutes FROM sheets WHERE team_id = ? AND id IN (${list.map(() => '?').join(',')})`,
      [teamId, ...list.map((s) => s.id)],
    );
    const settings = await this.settings(teamId);
    const defaults = await this.runDefaults(
      teamId,
      list.map((s) => s.id),
    );
    const byId = new Map(rows.map((r) => [String(r.id), r]));
    const out: SheetSummary[] = [];
    for (const s of list) {
      const r = byId.get(s.id);
      if (!r?.analysis_json) {
        out.push({ ...s, cost: null });
        continue;
      }
      const { cost, priced } = await this.compute(teamId, JSON.parse(r.analysis_json), defaults(s.id, ownCosting(r)).costing, settings);
      out.push({
        ...s,
        cost: {
          sheet: cost.sheet,
          perSticker: cost.perSticker,
          currency: settings.currency,
          current: r.analysis_version === r.version,
          priced,
        },
      });
    }
    return out;
  }
}
