// From order to production: the order's die-cut singles laid out over the fewest sheets by the
// nester (on worker threads, quarter turns: each single is sold on its own), each sheet made in the
// library and linked to the order; and what the order cost, from the print runs logged against it.
import type { DataSource } from 'typeorm';
import type { ArrangeItem } from '@shared/arrange/nester';
import type { Piece } from '@shared/sheet/document';
import { newPieceId } from '@shared/sheet/commands';
import { AppError, conflict } from '../../lib/errors';
import { arrangeInThreads } from '../../engine/arrange/parallel';
import { ArtItem } from '../art/art-item.entity';
import type { OutlineService } from '../outlines/outline.service';
import type { ProfilesService } from '../sheets/profiles.service';
import { Sheet } from '../sheets/sheet.entity';
import type { SheetsService } from '../sheets/sheets.service';
import type { CostingService } from '../shop/costing.service';
import type { SheetAnalysisService } from '../shop/sheet-analysis.service';
import { PrintRun } from '../shop/print-run.entity';
import { Customer } from './customer.entity';
import { Order } from './order.entity';
import type { OrderActor, OrdersService } from './orders.service';
import { SINGLES_BORDER_MM } from './pricing';

/** The most sheets one order's singles may take (more is a job for several orders). */
const MAX_ORDER_SHEETS = 40;

export class OrderProduction {
  constructor(
    private readonly dataSource: DataSource,
    private readonly orders: OrdersService,
    private readonly outlines: OutlineService,
    private readonly profiles: ProfilesService,
    private readonly sheets: SheetsService,
    private readonly costing: CostingService,
    private readonly analysis: SheetAnalysisService,
    private readonly options: { seconds: number; threads?: number } = { seconds: 3 },
  ) {}

  /** Lays the order's singles out over the fewest sheets and makes them, linked to the order. */
  async makeSheets(actor: OrderActor, orderId: string): Promise<{ sheetIds: string[]; placed: number; requested: number }> {
    const order = await this.orders.order(actor.teamId, orderId);
    if (!['approved', 'deposit', 'paid', 'making'].includes(order.state))
      throw conflict('Sheets are made for an order once the buyer has approved its proof.');
    if (await this.dataSource.getRepository(Sheet).existsBy({ orderId }))
      throw conflict('This order already has its sheets: open them from the order, or delete them to make them again.');
    const lines = (await this.orders.lines(orderId)).filter((l) => l.kind === 'singles');
    if (lines.length === 0) throw conflict('This order has no die-cut singles to lay out: its sheets are printed as they are.');
    const profile = await this.profiles.defaultFor(actor.teamId);
    const limits = { minFeatureMm: profile.minFeatureMm, bridgeWidthMm: profile.bridgeWidthMm };
    const pieceOf = new Map<string, Omit<Piece, 'id' | 'x' | 'y' | 'rotation'>>();
    const items: ArrangeItem[] = [];
    for (const line of lines) {
      const art = await this.dataSource.getRepository(ArtItem).findOneBy({ id: line.artId!, teamId: actor.teamId });
      if (!art || art.deletedAt) throw conflict(`Line ${line.position + 1}'s art was removed from the library.`);
      const piece = {
        artId: art.id,
        width: line.finishedWidthMm! - 2 * SINGLES_BORDER_MM,
        border: SINGLES_BORDER_MM,
        borderColour: '#ffffff',
        locked: false,
        cut: 'die' as const,
      };
      const first = (await this.outlines.forPiece(art, piece, limits)).outline.pieces[0];
      const key = `line-${line.id}`;
      pieceOf.set(key, piece);
      items.push({
        key,
        name: art.name,
        outline: { points: first.cutLine.points, widthMm: first.widthMm, heightMm: first.heightMm },
        count: line.quantity,
      });
    }
    const run = arrangeInThreads(
      items,
      {
        width: profile.areaWidthMm,
        height: profile.areaHeightMm,
        gap: profile.minGapMm,
        margin: profile.safeMarginMm,
        rotate: '90',
        timeMs: this.options.seconds * 1000,
        seed: 1,
        maxSheets: MAX_ORDER_SHEETS,
      },
      [],
      this.options.threads,
    );
    const result = await run.done;
    if (result.placed < result.requested)
      throw new AppError(
        400,
        'validation_failed',
        `Only ${result.placed} of ${result.requested} stickers fit on ${MAX_ORDER_SHEETS} sheets: ${result.unplaced.map((u) => u.reason).join(' ')}`,
      );
    const customer = await this.dataSource.getRepository(Customer).findOneByOrFail({ id: order.customerId });
    const sheetIds: string[] = [];
    const member = { userId: actor.userId!, teamId: actor.teamId, role: actor.role! };
    for (let s = 0; s < result.sheets; s++) {
      const pieces = result.placements
        .filter((p) => p.sheet === s)
        .map((p) => ({ ...pieceOf.get(p.key)!, id: newPieceId(), x: p.x, y: p.y, rotation: p.rotation }));
      const made = await this.sheets.create(member, {
        name: `Order ${order.number} · ${customer.name} · sheet ${s + 1} of ${result.sheets}`,
        profileId: profile.id,
        unit: actor.unit,
      });
      await this.sheets.save(member, made.id, { version: made.version, document: { ...made.document, pieces } });
      await this.dataSource.getRepository(Sheet).update({ id: made.id }, { orderId });
      sheetIds.push(made.id);
    }
    // Their checks and thumbnails are a worker's job; a queue that is down only delays them.
    for (const id of sheetIds) await this.analysis.soon(actor.teamId, id).catch(() => undefined);
    await this.dataSource.transaction((manager) =>
      this.orders.record(
        manager,
        orderId,
        actor,
        `Made ${result.sheets} sheet${result.sheets === 1 ? '' : 's'} for ${result.placed} stickers`,
      ),
    );
    return { sheetIds, placed: result.placed, requested: result.requested };
  }

  /** What the runs logged against the order cost (each copy at its sheet's cost), in cents; null when none. */
  async costMinor(teamId: string, orderId: string): Promise<number | null> {
    const runs = await this.dataSource.getRepository(PrintRun).findBy({ teamId, orderId });
    if (runs.length === 0) return null;
    let cost = 0;
    const perSheet = new Map<string, number>();
    for (const run of runs) {
      if (!run.sheetId) continue;
      if (!perSheet.has(run.sheetId)) perSheet.set(run.sheetId, (await this.costing.cost(teamId, run.sheetId)).cost.sheet);
      cost += perSheet.get(run.sheetId)! * run.copies;
    }
    return Math.round(cost * 100);
  }

  /** Whether the order exists in the team (for routes that only need the check). */
  async exists(teamId: string, orderId: string) {
    return this.dataSource.getRepository(Order).existsBy({ id: orderId, teamId });
  }
}
