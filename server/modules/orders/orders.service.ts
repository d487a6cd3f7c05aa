// Buyers and their orders: quotes with priced lines, the moves the shop makes by hand, and the log
// of every change. Proofs (proofs.service.ts) and payments (payments.service.ts) move orders too,
// each through `record`, so the log is complete whoever acted.
import type { DataSource, EntityManager } from 'typeorm';
import { In } from 'typeorm';
import type { Role } from '@shared/permissions';
import { can } from '@shared/permissions';
import { ORDER_CURRENCIES, formatMinor } from '@shared/orders/money';
import type { OrderCurrency } from '@shared/orders/money';
import type { CustomerInput, CustomerView, OrderInput, OrderLineInput, OrderState, orderListQuerySchema } from '@shared/schemas/orders';
import { EDITABLE_STATES, HAND_MOVES, ORDER_STATE_LABELS, ORDER_STATES } from '@shared/schemas/orders';
import type { OrderBoard, OrderView } from '@shared/schemas/orders';
import type { z } from 'zod';
import { AppError, conflict, forbidden, notFound } from '../../lib/errors';
import { inTransaction, isDuplicateOf } from '../../db/transaction';
import { ArtItem } from '../art/art-item.entity';
import type { ProfilesService } from '../sheets/profiles.service';
import { Sheet } from '../sheets/sheet.entity';
import type { CostingService } from '../shop/costing.service';
import { StockItem } from '../shop/stock-item.entity';
import { Customer } from './customer.entity';
import { Order, OrderEvent, OrderLine } from './order.entity';
import { sheetPriceMinor, singlesPriceMinor, singlesSize } from './pricing';
import { buildOrderView, summaryOf } from './order-view';

/** Who acts: a member (with their role and unit), the buyer on the proof page, or the payment service. */
export type OrderActor = { userId: string | null; name: string; teamId: string; role: Role | null; unit: 'in' | 'mm' };

export class OrdersService {
  constructor(
    private readonly dataSource: DataSource,
    private readonly profiles: ProfilesService,
    private readonly costing: CostingService,
  ) {}

  /** Adds a line to the order's log (inside the caller's transaction). */
  record(manager: EntityManager, orderId: string, who: Pick<OrderActor, 'userId' | 'name'>, what: string) {
    return manager.getRepository(OrderEvent).insert({ orderId, userId: who.userId, who: who.name.slice(0, 160), what: what.slice(0, 600) });
  }

  async customers(teamId: string): Promise<CustomerView[]> {
    const rows = await this.dataSource.getRepository(Customer).find({ where: { teamId }, order: { name: 'ASC' } });
    const counts = await this.dataSource
      .getRepository(Order)
      .createQueryBuilder('o')
      .select('o.customer_id', 'customerId')
      .addSelect('COUNT(*)', 'n')
      .where('o.team_id = :teamId', { teamId })
      .groupBy('o.customer_id')
      .getRawMany<{ customerId: string; n: string }>();
    const count = new Map(counts.map((c) => [String(c.customerId), Number(c.n)]));
    return rows.map((c) => ({ id: c.id, name: c.name, email: c.email, notes: c.notes ?? '', orders: count.get(c.id) ?? 0 }));
  }

  async addCustomer(teamId: string, input: CustomerInput): Promise<CustomerView> {
    const row = await this.dataSource
      .getRepository(Customer)
      .save({ teamId, name: input.name, email: input.email, notes: input.notes || null });
    return { id: row.id, name: row.name, email: row.email, notes: row.notes ?? '', orders: 0 };
  }

  async order(teamId: string, orderId: string, manager: EntityManager = this.dataSource.manager, lock = false): Promise<Order> {
    const query = manager
      .getRepository(Order)
      .createQueryBuilder('o')
      .where('o.id = :orderId AND o.team_id = :teamId', { orderId, teamId });
    const row = await (lock ? query.setLock('pessimistic_write') : query).getOne();
    if (!row) throw notFound('That order');
    return row;
  }

  async create(actor: OrderActor, input: OrderInput): Promise<OrderView> {
    const customer = await this.dataSource.getRepository(Customer).findOneBy({ id: input.customerId, teamId: actor.teamId });
    if (!customer) throw notFound('That buyer');
    const currency = await this.currencyOf(actor.teamId);
    // The next number of the team's own; two quotes started at once both retry until one wins each number.
    const id = await inTransaction(
      this.dataSource,
      async (manager) => {
        const { max } = (await manager
          .getRepository(Order)
          .createQueryBuilder('o')
          .select('MAX(o.number)', 'max')
          .where('o.team_id = :teamId', { teamId: actor.teamId })
          .getRawOne<{ max: number | null }>()) ?? { max: null };
        const saved = await manager.getRepository(Order).save({
          teamId: actor.teamId,
          number: Number(max ?? 0) + 1,
          customerId: customer.id,
          currency,
          depositPercent: input.depositPercent,
          notes: input.notes || null,
          createdBy: actor.userId!,
        });
        await this.record(manager, saved.id, actor, `Started a quote for ${customer.name}`);
        return saved.id;
      },
      { retryIf: isDuplicateOf('orders_team_number') },
    );
    return this.view(actor, id);
  }

  private async currencyOf(teamId: string): Promise<OrderCurrency> {
    const code = (await this.costing.settings(teamId)).currencyCode ?? 'USD';
    return (ORDER_CURRENCIES as readonly string[]).includes(code) ? code : 'USD';
  }

  private editable(order: Order) {
    if (!EDITABLE_STATES.includes(order.state))
      throw conflict(
        order.state === 'proof-out'
          ? 'A proof of this order is with the buyer: wait for their answer, or send a new proof after they ask for changes.'
          : `This order is ${ORDER_STATE_LABELS[order.state].toLowerCase()}: what the buyer approved stays as it was. Start a new order for other stickers.`,
      );
  }

  async addLine(actor: OrderActor, orderId: string, input: OrderLineInput): Promise<OrderView> {
    const order = await this.order(actor.teamId, orderId);
    this.editable(order);
    const settings = await this.costing.settings(actor.teamId);
    const stockId = input.stockId ?? settings.defaultStockId;
    const stock = stockId ? await this.dataSource.getRepository(StockItem).findOneBy({ id: stockId, teamId: actor.teamId }) : null;
    if (input.stockId && !stock) throw notFound('That stock');
    let unitPriceMinor: number;
    let title: string;
    if (input.kind === 'singles') {
      const art = await this.dataSource.getRepository(ArtItem).findOneBy({ id: input.artId, teamId: actor.teamId });
      if (!art || art.deletedAt) throw notFound('That art');
      const size = singlesSize(art, input.finishedWidthMm, await this.profiles.defaultFor(actor.teamId), actor.unit);
      unitPriceMinor = input.unitPrice ?? singlesPriceMinor(stock, size.perSheet, settings);
      title = art.name;
    } else {
      const sheet = await this.dataSource.getRepository(Sheet).findOneBy({ id: input.sheetId, teamId: actor.teamId });
      if (!sheet) throw notFound('That sheet');
      unitPriceMinor = input.unitPrice ?? sheetPriceMinor(await this.costing.cost(actor.teamId, sheet.id), sheet.name);
      title = sheet.name;
    }
    if (unitPriceMinor * input.quantity > 2_000_000_000)
      throw new AppError(400, 'validation_failed', 'That line comes to more than one order can hold: split it over several orders.');
    await inTransaction(this.dataSource, async (manager) => {
      const locked = await this.order(actor.teamId, orderId, manager, true);
      this.editable(locked);
      const position = await manager.getRepository(OrderLine).countBy({ orderId });
      await manager.getRepository(OrderLine).insert({
        orderId,
        position,
        kind: input.kind,
        artId: input.kind === 'singles' ? input.artId : null,
        sheetId: input.kind === 'sheet' ? input.sheetId : null,
        finishedWidthMm: input.kind === 'singles' ? input.finishedWidthMm : null,
        quantity: input.quantity,
        stockId: stock?.id ?? null,
        unitPriceMinor,
        priceFrom: input.unitPrice === undefined ? 'cost' : 'hand',
      });
      await this.record(
        manager,
        orderId,
        actor,
        `Added ${input.quantity} × ${title} at ${formatMinor(unitPriceMinor, order.currency)} each`,
      );
    });
    return this.view(actor, orderId);
  }

  async setLinePrice(actor: OrderActor, orderId: string, lineId: string, unitPriceMinor: number): Promise<OrderView> {
    await inTransaction(this.dataSource, async (manager) => {
      const order = await this.order(actor.teamId, orderId, manager, true);
      this.editable(order);
      const line = await manager.getRepository(OrderLine).findOneBy({ id: lineId, orderId });
      if (!line) throw notFound('That line');
      await manager.getRepository(OrderLine).update({ id: line.id }, { unitPriceMinor, priceFrom: 'hand' });
      await this.record(
        manager,
        orderId,
        actor,
        `Changed line ${line.position + 1}'s price from ${formatMinor(line.unitPriceMinor, order.currency)} to ${formatMinor(unitPriceMinor, order.currency)}`,
      );
    });
    return this.view(actor, orderId);
  }

  async removeLine(actor: OrderActor, orderId: string, lineId: string): Promise<OrderView> {
    await inTransaction(this.dataSource, async (manager) => {
      this.editable(await this.order(actor.teamId, orderId, manager, true));
      const line = await manager.getRepository(OrderLine).findOneBy({ id: lineId, orderId });
      if (!line) throw notFound('That line');
      await manager.getRepository(OrderLine).delete({ id: line.id });
      await this.record(manager, orderId, actor, `Removed line ${line.position + 1} (${line.quantity} ×)`);
    });
    return this.view(actor, orderId);
  }

  /** The moves the shop makes by hand: into production, ready, handed over, or cancelled. */
  async move(actor: OrderActor, orderId: string, to: OrderState, note: string): Promise<OrderView> {
    await inTransaction(this.dataSource, async (manager) => {
      const order = await this.order(actor.teamId, orderId, manager, true);
      const from = HAND_MOVES[to] ?? [];
      if (!from.includes(order.state))
        throw conflict(
          to === 'making'
            ? 'An order goes into production once the buyer has paid the deposit or the whole.'
            : `An order that is ${ORDER_STATE_LABELS[order.state].toLowerCase()} cannot be marked ${ORDER_STATE_LABELS[to].toLowerCase()}.`,
        );
      if (to === 'cancelled' && order.paidMinor > order.refundedMinor && !can(actor.role, 'orders.payments'))
        throw forbidden('This order has payments: only someone who takes payments may cancel it (and refund what is owed).');
      await manager.getRepository(Order).update({ id: order.id }, { state: to });
      await this.record(manager, orderId, actor, `Marked ${ORDER_STATE_LABELS[to].toLowerCase()}${note ? `: ${note}` : ''}`);
    });
    return this.view(actor, orderId);
  }

  /** What the order's print runs cost (set by the production side, which knows the runs). */
  costOf: (teamId: string, orderId: string) => Promise<number | null> = async () => null;

  async view(actor: Pick<OrderActor, 'teamId' | 'role'>, orderId: string): Promise<OrderView> {
    const order = await this.order(actor.teamId, orderId);
    const money = await this.seesMoney(actor);
    return buildOrderView(this.dataSource, order, money, money ? await this.costOf(actor.teamId, orderId) : null);
  }

  /** Whether this member sees prices: the permission, or a viewer while the owner lets viewers see them. */
  async seesMoney(actor: Pick<OrderActor, 'teamId' | 'role'>): Promise<boolean> {
    if (can(actor.role, 'orders.money')) return true;
    if (actor.role !== 'viewer') return false;
    return (await this.costing.settings(actor.teamId)).viewersSeePrices ?? true;
  }

  async board(actor: Pick<OrderActor, 'teamId' | 'role'>, query: z.infer<typeof orderListQuerySchema>): Promise<OrderBoard> {
    const money = await this.seesMoney(actor);
    const qb = this.dataSource.getRepository(Order).createQueryBuilder('o').where('o.team_id = :teamId', { teamId: actor.teamId });
    if (query.state) qb.andWhere('o.state = :state', { state: query.state });
    if (query.customerId) qb.andWhere('o.customer_id = :customerId', { customerId: query.customerId });
    const orders = await qb.orderBy('o.updated_at', 'DESC').addOrderBy('o.id', 'DESC').take(500).getMany();
    const customers = await this.dataSource.getRepository(Customer).findBy({ id: In([0, ...orders.map((o) => o.customerId)]) });
    const lines = await this.dataSource.getRepository(OrderLine).findBy({ orderId: In([0, ...orders.map((o) => o.id)]) });
    let summaries = orders.map((o) =>
      summaryOf(
        o,
        customers.find((c) => c.id === o.customerId)!,
        lines.filter((l) => l.orderId === o.id),
        money,
      ),
    );
    if (query.q) {
      const q = query.q.toLowerCase();
      summaries = summaries.filter(
        (s) => s.customer.name.toLowerCase().includes(q) || s.customer.email.includes(q) || String(s.number) === q.replace(/^#/, ''),
      );
    }
    const totals = Object.fromEntries(ORDER_STATES.map((s) => [s, { count: 0, totalMinor: money ? 0 : null }])) as OrderBoard['totals'];
    for (const s of summaries) {
      totals[s.state].count++;
      if (money) totals[s.state].totalMinor = (totals[s.state].totalMinor ?? 0) + (s.totalMinor ?? 0);
    }
    return { orders: summaries, totals };
  }

  /** Lines of an order (for proofs and production). */
  lines(orderId: string, manager: EntityManager = this.dataSource.manager) {
    return manager.getRepository(OrderLine).find({ where: { orderId }, order: { position: 'ASC', id: 'ASC' } });
  }
}
