import type { DataSource, EntityManager } from 'typeorm';
import type { StockInput, StockView } from '../../../shared/schemas/shop';
import { costPerSheet } from '../../../shared/production/cost';
import { AppError, notFound } from '../../lib/errors';
import { inTransaction } from '../../db/transaction';

export type StockRow = {
  id: string;
  name: string;
  finish: StockInput['finish'];
  paper: StockInput['paper'];
  paper_width_mm: string;
  paper_height_mm: string;
  pack_price: string;
  sheets_per_pack: number;
  on_hand: number;
  low_at: number | null;
  printer_settings: string;
  cutter_settings: string;
  rating: number | null;
  food_safe: number;
  skin_safe: number;
  notes: string | null;
  archived_at: Date | null;
};

export const stockView = (r: StockRow): StockView => ({
  id: String(r.id),
  name: r.name,
  finish: r.finish,
  paper: r.paper,
  paperWidthMm: Number(r.paper_width_mm),
  paperHeightMm: Number(r.paper_height_mm),
  packPrice: Number(r.pack_price),
  sheetsPerPack: r.sheets_per_pack,
  costPerSheet: costPerSheet(Number(r.pack_price), r.sheets_per_pack),
  onHand: r.on_hand,
  lowAt: r.low_at,
  low: r.low_at !== null && r.on_hand <= r.low_at,
  printerSettings: JSON.parse(r.printer_settings),
  cutterSettings: JSON.parse(r.cutter_settings),
  rating: r.rating,
  foodSafe: !!r.food_safe,
  skinSafe: !!r.skin_safe,
  notes: r.notes ?? '',
  archived: r.archived_at !== null,
});

/** Refused unless confirmed: taking more sheets than the count says are on hand. */
export const stockShort = (onHand: number, wanted: number) =>
  new AppError(
    409,
    'stock_short',
    `Only ${onHand} sheet${onHand === 1 ? '' : 's'} on hand and this takes ${wanted}. Confirm to go below zero (and recount the shelf).`,
  );

const columns = (s: StockInput) => [
  s.name,
  s.finish,
  s.paper,
  s.paperWidthMm,
  s.paperHeightMm,
  s.packPrice,
  s.sheetsPerPack,
  JSON.stringify(s.printerSettings),
  JSON.stringify(s.cutterSettings),
  s.rating,
  s.foodSafe,
  s.skinSafe,
  s.notes || null,
  s.lowAt,
];

/** The team's printable stock: prices, sheets on hand and the settings that worked. */
export class StockService {
  constructor(private readonly dataSource: DataSource) {}

  async list(teamId: string, includeArchived = false): Promise<StockView[]> {
    const rows: StockRow[] = await this.dataSource.query(
      `SELECT * FROM stock_items WHERE team_id = ? ${includeArchived ? '' : 'AND archived_at IS NULL'} ORDER BY name`,
      [teamId],
    );
    return rows.map(stockView);
  }

  async row(teamId: string, id: string, manager: EntityManager = this.dataSource.manager, lock = false): Promise<StockRow> {
    const [row] = await manager.query(`SELECT * FROM stock_items WHERE id = ? AND team_id = ?${lock ? ' FOR UPDATE' : ''}`, [id, teamId]);
    if (!row) throw notFound('That stock');
    return row;
  }

  async get(teamId: string, id: string): Promise<StockView> {
    return stockView(await this.row(teamId, id));
  }

  async create(teamId: string, s: StockInput): Promise<StockView> {
    const r = await this.dataSource.query(
      'INSERT INTO stock_items (name, finish, paper, paper_width_mm, paper_height_mm, pack_price, sheets_per_pack, printer_settings, cutter_settings, rating, food_safe, skin_safe, notes, low_at, on_hand, team_id) VALUES (?,?,?,?,?,?,?,?,?,?,?,?,?,?,?,?)',
      [...columns(s), s.onHand, teamId],
    );
    return this.get(teamId, String(r.insertId));
  }

  /** Changes everything but the count on hand, which only adjustments and runs move. */
  async update(teamId: string, id: string, s: StockInput): Promise<StockView> {
    await this.row(teamId, id);
    await this.dataSource.query(
      'UPDATE stock_items SET name=?, finish=?, paper=?, paper_width_mm=?, paper_height_mm=?, pack_price=?, sheets_per_pack=?, printer_settings=?, cutter_settings=?, rating=?, food_safe=?, skin_safe=?, notes=?, low_at=? WHERE id = ? AND team_id = ?',
      [...columns(s), id, teamId],
    );
    return this.get(teamId, id);
  }

  async adjust(teamId: string, id: string, change: number, confirmNegative: boolean): Promise<StockView> {
    await inTransaction(this.dataSource, async (manager) => {
      const row = await this.row(teamId, id, manager, true);
      if (row.on_hand + change < 0 && !confirmNegative) throw stockShort(row.on_hand, -change);
      await manager.query('UPDATE stock_items SET on_hand = on_hand + ? WHERE id = ?', [change, id]);
    });
    return this.get(teamId, id);
  }

  async archive(teamId: string, id: string): Promise<void> {
    await this.row(teamId, id);
    await this.dataSource.query('UPDATE stock_items SET archived_at = CURRENT_TIMESTAMP(3) WHERE id = ?', [id]);
  }
}
