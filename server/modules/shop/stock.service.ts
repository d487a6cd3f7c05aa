import type { DataSource, EntityManager } from 'typeorm';
import { IsNull } from 'typeorm';
import type { StockInput, StockView } from '@shared/schemas/shop';
import { costPerSheet } from '@shared/production/cost';
import { AppError, notFound } from '../../lib/errors';
import { inTransaction } from '../../db/transaction';
import { StockItem } from './stock-item.entity';

const stockView = (s: StockItem): StockView => ({
  id: s.id,
  name: s.name,
  finish: s.finish,
  paper: s.paper,
  paperWidthMm: s.paperWidthMm,
  paperHeightMm: s.paperHeightMm,
  packPrice: s.packPrice,
  sheetsPerPack: s.sheetsPerPack,
  costPerSheet: costPerSheet(s.packPrice, s.sheetsPerPack),
  onHand: s.onHand,
  lowAt: s.lowAt,
  low: s.lowAt !== null && s.onHand <= s.lowAt,
  printerSettings: JSON.parse(s.printerSettings),
  cutterSettings: JSON.parse(s.cutterSettings),
  rating: s.rating,
  foodSafe: s.foodSafe,
  skinSafe: s.skinSafe,
  notes: s.notes ?? '',
  archived: s.archivedAt !== null,
});

/** Refused unless confirmed: taking more sheets than the count says are on hand. */
export const stockShort = (onHand: number, wanted: number) =>
  new AppError(
    409,
    'stock_short',
    `Only ${onHand} sheet${onHand === 1 ? '' : 's'} on hand and this takes ${wanted}. Confirm to go below zero (and recount the shelf).`,
  );

/** Everything a maker edits; the count on hand moves only by adjustments and runs. */
const fieldsOf = (s: StockInput): Partial<StockItem> => ({
  name: s.name,
  finish: s.finish,
  paper: s.paper,
  paperWidthMm: s.paperWidthMm,
  paperHeightMm: s.paperHeightMm,
  packPrice: s.packPrice,
  sheetsPerPack: s.sheetsPerPack,
  printerSettings: JSON.stringify(s.printerSettings),
  cutterSettings: JSON.stringify(s.cutterSettings),
  rating: s.rating,
  foodSafe: s.foodSafe,
  skinSafe: s.skinSafe,
  notes: s.notes || null,
  lowAt: s.lowAt,
});

/** The team's printable stock: prices, sheets on hand and the settings that worked. */
export class StockService {
  constructor(private readonly dataSource: DataSource) {}

  async list(teamId: string, includeArchived = false): Promise<StockView[]> {
    const rows = await this.dataSource
      .getRepository(StockItem)
      .find({ where: { teamId, ...(includeArchived ? {} : { archivedAt: IsNull() }) }, order: { name: 'ASC' } });
    return rows.map(stockView);
  }

  /** The team's stock item; `lock` holds it (FOR UPDATE) for the rest of the transaction. */
  async row(teamId: string, id: string, manager: EntityManager = this.dataSource.manager, lock = false): Promise<StockItem> {
    const query = manager.getRepository(StockItem).createQueryBuilder('s').where('s.id = :id AND s.team_id = :teamId', { id, teamId });
    const row = await (lock ? query.setLock('pessimistic_write') : query).getOne();
    if (!row) throw notFound('That stock');
    return row;
  }

  async get(teamId: string, id: string): Promise<StockView> {
    return stockView(await this.row(teamId, id));
  }

  async create(teamId: string, s: StockInput): Promise<StockView> {
    const repo = this.dataSource.getRepository(StockItem);
    const saved = await repo.save(repo.create({ ...fieldsOf(s), onHand: s.onHand, teamId }));
    return this.get(teamId, saved.id);
  }

  async update(teamId: string, id: string, s: StockInput): Promise<StockView> {
    await this.row(teamId, id);
    await this.dataSource.getRepository(StockItem).update({ id, teamId }, fieldsOf(s));
    return this.get(teamId, id);
  }

  async adjust(teamId: string, id: string, change: number, confirmNegative: boolean): Promise<StockView> {
    await inTransaction(this.dataSource, async (manager) => {
      const row = await this.row(teamId, id, manager, true);
      if (row.onHand + change < 0 && !confirmNegative) throw stockShort(row.onHand, -change);
      await manager.getRepository(StockItem).increment({ id }, 'onHand', change);
    });
    return this.get(teamId, id);
  }

  async archive(teamId: string, id: string): Promise<void> {
    await this.row(teamId, id);
    await this.dataSource.getRepository(StockItem).update({ id }, { archivedAt: new Date() });
  }
}
