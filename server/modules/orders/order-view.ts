// What an order looks like to a member: its lines with their names, the log, the proofs as sent,
// the payments, and the money (left out, as null, for those who may not see it).
import type { DataSource } from 'typeorm';
import { In } from 'typeorm';
import { amountDue, orderTotal } from '@shared/orders/money';
import type { OrderLineView, OrderSummary, OrderView, ProofLine, ProofView } from '@shared/schemas/orders';
import { ArtItem } from '../art/art-item.entity';
import { Sheet } from '../sheets/sheet.entity';
import { StockItem } from '../shop/stock-item.entity';
import { Customer } from './customer.entity';
import type { Order } from './order.entity';
import { OrderEvent, OrderLine } from './order.entity';
import { OrderPayment } from './payment.entity';
import { OrderProof } from './proof.entity';

/** What the buyer was shown, frozen when the proof was sent. */
export type ProofSnapshot = {
  orderNumber: number;
  currency: Order['currency'];
  depositPercent: number;
  lines: Array<ProofLine & { imageKey: string | null; kind: 'singles' | 'sheet'; unitPriceMinor: number; totalMinor: number }>;
  totalMinor: number;
};

function proofView(p: OrderProof, money: boolean, teamId?: string): ProofView {
  const snapshot = JSON.parse(p.snapshotJson) as ProofSnapshot;
  return {
    id: p.id,
    status: p.status,
    sentTo: p.sentTo,
    sentAt: p.createdAt.toISOString(),
    expiresAt: p.expiresAt.toISOString(),
    decidedAt: p.decidedAt?.toISOString() ?? null,
    decidedName: p.decidedName,
    comment: p.comment,
    lines: snapshot.lines.map((l, i) => ({
      title: l.title,
      pictureUrl: teamId && l.imageKey ? `/api/teams/${teamId}/orders/${p.orderId}/proofs/${p.id}/pictures/${i}.png` : null,
      finishedWidthMm: l.finishedWidthMm,
      finishedHeightMm: l.finishedHeightMm,
      quantity: l.quantity,
      stockName: l.stockName,
      unitPriceMinor: money ? l.unitPriceMinor : null,
      totalMinor: money ? l.totalMinor : null,
    })),
  };
}

export function summaryOf(order: Order, customer: Customer, lines: OrderLine[], money: boolean): OrderSummary {
  return {
    id: order.id,
    number: order.number,
    state: order.state,
    customer: { id: customer.id, name: customer.name, email: customer.email },
    currency: order.currency,
    totalMinor: money ? orderTotal(lines) : null,
    paidMinor: money ? order.paidMinor : null,
    updatedAt: order.updatedAt.toISOString(),
    lines: lines.length,
  };
}

/** Names for the lines: the art's or the sheet's, and the stock's. */
async function lineViews(dataSource: DataSource, lines: OrderLine[], money: boolean): Promise<OrderLineView[]> {
  const ids = (pick: (l: OrderLine) => string | null) => In(['0', ...lines.map(pick).filter((id): id is string => id !== null)]);
  const [art, sheets, stock] = await Promise.all([
    dataSource.getRepository(ArtItem).find({ where: { id: ids((l) => l.artId) }, select: { id: true, name: true } }),
    dataSource.getRepository(Sheet).find({ where: { id: ids((l) => l.sheetId) }, select: { id: true, name: true } }),
    dataSource.getRepository(StockItem).find({ where: { id: ids((l) => l.stockId) }, select: { id: true, name: true } }),
  ]);
  const name = (rows: Array<{ id: string; name: string }>, id: string | null) => rows.find((r) => r.id === id)?.name ?? null;
  return lines.map((l) => ({
    id: l.id,
    kind: l.kind,
    artId: l.artId,
    sheetId: l.sheetId,
    title: (l.kind === 'singles' ? name(art, l.artId) : name(sheets, l.sheetId)) ?? '(removed)',
    finishedWidthMm: l.finishedWidthMm,
    quantity: l.quantity,
    stockId: l.stockId,
    stockName: name(stock, l.stockId),
    unitPriceMinor: money ? l.unitPriceMinor : null,
    totalMinor: money ? l.unitPriceMinor * l.quantity : null,
    priceFrom: money ? l.priceFrom : null,
  }));
}

export async function buildOrderView(
  dataSource: DataSource,
  order: Order,
  money: boolean,
  costMinor: number | null = null,
): Promise<OrderView> {
  const [customer, lines, events, proofs, payments, sheets] = await Promise.all([
    dataSource.getRepository(Customer).findOneByOrFail({ id: order.customerId }),
    dataSource.getRepository(OrderLine).find({ where: { orderId: order.id }, order: { position: 'ASC', id: 'ASC' } }),
    dataSource.getRepository(OrderEvent).find({ where: { orderId: order.id }, order: { id: 'ASC' } }),
    dataSource.getRepository(OrderProof).find({ where: { orderId: order.id }, order: { id: 'DESC' } }),
    dataSource.getRepository(OrderPayment).find({ where: { orderId: order.id }, order: { id: 'ASC' } }),
    dataSource.getRepository(Sheet).find({ where: { orderId: order.id }, select: { id: true }, order: { id: 'ASC' } }),
  ]);
  const total = orderTotal(lines);
  return {
    id: order.id,
    number: order.number,
    state: order.state,
    customer: { id: customer.id, name: customer.name, email: customer.email },
    currency: order.currency,
    depositPercent: order.depositPercent,
    notes: order.notes ?? '',
    lines: await lineViews(dataSource, lines, money),
    totalMinor: money ? total : null,
    paidMinor: money ? order.paidMinor : null,
    refundedMinor: money ? order.refundedMinor : null,
    dueMinor: money ? amountDue(total, order.paidMinor, order.depositPercent).minor : null,
    costMinor: money ? costMinor : null,
    // What the order brings in, less refunds and what its print runs cost.
    marginMinor: money && costMinor !== null ? total - order.refundedMinor - costMinor : null,
    proofs: proofs.map((p) => proofView(p, money, order.teamId)),
    payments: money
      ? payments.map((p) => ({
          id: p.id,
          kind: p.kind,
          status: p.status,
          amountMinor: p.amountMinor,
          createdAt: p.createdAt.toISOString(),
        }))
      : [],
    events: events.map((e) => ({
      at: e.createdAt.toISOString(),
      who: e.who,
      what: money ? e.what : e.what.replace(/[^\s]*\d+\.\d{2}/g, '…'),
    })),
    sheetIds: sheets.map((s) => s.id),
    createdAt: order.createdAt.toISOString(),
    updatedAt: order.updatedAt.toISOString(),
  };
}
