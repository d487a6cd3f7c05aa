// Payments through the payments SDK: a checkout session for what the buyer owes now (the deposit,
// else the balance), refunds, and the service's signed notices. A notice is the only thing that
// marks money paid: its signature is checked with the SDK's verifier, and its id is stored in the
// same transaction as its effect, so the same notice twice changes the order once.
import type { DataSource } from 'typeorm';
import { amountDue, formatMinor, orderTotal } from '@shared/orders/money';
import { AppError, conflict } from '../../lib/errors';
import type { Log } from '../../lib/log';
import type { Mailer } from '../../mail/mailer';
import type { Payments } from '../../payments/client';
import { inTransaction, isDuplicateOf } from '../../db/transaction';
import { Customer } from './customer.entity';
import { Order, OrderLine } from './order.entity';
import type { OrderActor, OrdersService } from './orders.service';
import { OrderPayment, PaymentNotice } from './payment.entity';

/** The smallest charge the payments service takes (50 cents in the two-decimal currencies). */
const MIN_CHARGE_MINOR = 50;
const SERVICE = { userId: null, name: 'Payments' };

export class PaymentsService {
  constructor(
    private readonly dataSource: DataSource,
    private readonly orders: OrdersService,
    private readonly payments: Payments,
    private readonly mailer: Mailer,
    private readonly log: Log,
  ) {}

  /**
   * A checkout session for what the order owes now. `returnTo` is where the buyer lands after
   * paying or going back (the proof page when they pay from it).
   */
  async checkout(
    teamId: string,
    orderId: string,
    who: Pick<OrderActor, 'userId' | 'name'>,
    returnTo: string,
  ): Promise<{ url: string; amountMinor: number }> {
    const order = await this.orders.order(teamId, orderId);
    if (!['approved', 'deposit', 'making', 'ready'].includes(order.state))
      throw conflict(
        order.state === 'paid' || order.state === 'handed-over'
          ? 'This order is paid in full.'
          : 'The buyer pays once they have approved the proof.',
      );
    const lines = await this.dataSource.getRepository(OrderLine).findBy({ orderId });
    const due = amountDue(orderTotal(lines), order.paidMinor, order.depositPercent);
    if (due.minor === 0) throw conflict('Nothing is owed on this order.');
    if (due.minor < MIN_CHARGE_MINOR)
      throw conflict(`${formatMinor(due.minor, order.currency)} is below the smallest amount a card payment can take.`);
    await this.expireOpen(orderId);
    const customer = await this.dataSource.getRepository(Customer).findOneByOrFail({ id: order.customerId });
    const payment = await this.dataSource
      .getRepository(OrderPayment)
      .save({ orderId, kind: due.kind, amountMinor: due.minor, currency: order.currency, createdBy: who.userId });
    let session;
    try {
      session = await this.payments.sdk.checkout.sessions.create({
        mode: 'payment',
        customer_email: customer.email,
        line_items: [
          {
            quantity: 1,
            price_data: {
              currency: order.currency.toLowerCase(),
              unit_amount: due.minor,
              product_data: {
                name: `Stickers, order ${order.number}: ${due.kind === 'deposit' ? `deposit (${order.depositPercent} %)` : 'balance'}`,
              },
            },
          },
        ],
        success_url: `${returnTo}${returnTo.includes('?') ? '&' : '?'}paid=1`,
        cancel_url: returnTo,
        metadata: { orderId, paymentId: payment.id, teamId },
      });
    } catch (error) {
      await this.dataSource.getRepository(OrderPayment).update({ id: payment.id }, { status: 'expired' });
      this.log.warn({ err: error, orderId }, 'checkout session failed');
      throw new AppError(503, 'unavailable', 'The payment service did not answer: try again in a minute.');
    }
    await inTransaction(this.dataSource, async (manager) => {
      await manager.getRepository(OrderPayment).update({ id: payment.id }, { sessionId: session.id });
      await this.orders.record(manager, orderId, who, `Asked for ${formatMinor(due.minor, order.currency)} (${due.kind})`);
    });
    return { url: session.url!, amountMinor: due.minor };
  }

  /**
   * Closes the order's earlier payment links before a new one is made, so the buyer cannot pay the
   * same deposit twice from two e-mails. A link paid meanwhile cannot be closed: its notice counts.
   */
  private async expireOpen(orderId: string) {
    const open = await this.dataSource.getRepository(OrderPayment).find({ where: { orderId, status: 'open' } });
    for (const payment of open) {
      if (!payment.sessionId) continue;
      try {
        await this.payments.sdk.checkout.sessions.expire(payment.sessionId);
        await this.dataSource.getRepository(OrderPayment).update({ id: payment.id, status: 'open' }, { status: 'expired' });
      } catch (error) {
        this.log.info(
          { err: error, orderId, sessionId: payment.sessionId },
          'an earlier payment link could not be closed (paid meanwhile?)',
        );
      }
    }
  }

  /** Mails the buyer a payment link for what the order owes now. */
  async emailPaymentLink(actor: OrderActor, orderId: string, returnTo: string) {
    const order = await this.orders.order(actor.teamId, orderId);
    const { url, amountMinor } = await this.checkout(actor.teamId, orderId, actor, returnTo);
    const customer = await this.dataSource.getRepository(Customer).findOneByOrFail({ id: order.customerId });
    await this.mailer.send({
      to: customer.email,
      subject: `Payment for your stickers, order ${order.number}`,
      text: `Hello ${customer.name},\n\nYou can pay ${formatMinor(amountMinor, order.currency)} for order ${order.number} here:\n\n${url}\n`,
    });
    return { url, amountMinor };
  }

  /** A signed notice from the payments service: 400 when the signature does not hold, else acted on once. */
  async notice(raw: Buffer, signature: string | undefined): Promise<{ received: true; duplicate?: true }> {
    let event;
    try {
      event = this.payments.sdk.webhooks.constructEvent(raw, signature ?? '', this.payments.webhookSecret);
    } catch {
      throw new AppError(400, 'bad_signature', 'This notice is not signed by the payment service.');
    }
    const acted = await inTransaction(
      this.dataSource,
      async (manager) => {
        const session = event.type === 'checkout.session.completed' ? event.data.object : null;
        const payment = session ? await manager.getRepository(OrderPayment).findOneBy({ sessionId: session.id }) : null;
        await manager.getRepository(PaymentNotice).insert({ eventId: event.id, type: event.type, orderId: payment?.orderId ?? null });
        if (!session || !payment || payment.status !== 'open' || session.payment_status !== 'paid') return true;
        const order = await manager
          .getRepository(Order)
          .createQueryBuilder('o')
          .where('o.id = :id', { id: payment.orderId })
          .setLock('pessimistic_write')
          .getOneOrFail();
        const amount = session.amount_total ?? 0;
        if (amount !== payment.amountMinor || (session.currency ?? '').toUpperCase() !== payment.currency)
          this.log.warn({ orderId: order.id, amount, asked: payment.amountMinor }, 'paid amount differs from the amount asked');
        await manager
          .getRepository(OrderPayment)
          .update({ id: payment.id }, { status: 'paid', amountMinor: amount, paymentIntent: String(session.payment_intent ?? '') });
        const paid = order.paidMinor + amount;
        const total = orderTotal(await manager.getRepository(OrderLine).findBy({ orderId: order.id }));
        const state = ['approved', 'deposit'].includes(order.state) ? (paid >= total ? 'paid' : 'deposit') : order.state;
        await manager.getRepository(Order).update({ id: order.id }, { paidMinor: paid, state });
        await this.orders.record(
          manager,
          order.id,
          SERVICE,
          `Received ${formatMinor(amount, order.currency)} (${payment.kind}); paid ${formatMinor(paid, order.currency)} of ${formatMinor(total, order.currency)}`,
        );
        return true;
      },
      { attempts: 6 },
    ).catch((error) => {
      if (isDuplicateOf('PRIMARY')(error)) return false;
      throw error;
    });
    return acted ? { received: true } : { received: true, duplicate: true };
  }

  /** Gives money back through the payment service, from the latest payments first. */
  async refund(actor: OrderActor, orderId: string, amountMinor: number, reason: string) {
    const order = await this.orders.order(actor.teamId, orderId);
    const refundable = order.paidMinor - order.refundedMinor;
    if (amountMinor <= 0)
      throw new AppError(400, 'validation_failed', 'Give an amount to refund above 0.', { amount: 'Give an amount above 0' });
    if (amountMinor > refundable)
      throw new AppError(400, 'validation_failed', `At most ${formatMinor(refundable, order.currency)} can be refunded on this order.`, {
        amount: `At most ${formatMinor(refundable, order.currency)}`,
      });
    const paid = await this.dataSource.getRepository(OrderPayment).find({ where: { orderId, status: 'paid' }, order: { id: 'DESC' } });
    const refunds = await this.dataSource.getRepository(OrderPayment).find({ where: { orderId, kind: 'refund' } });
    let left = amountMinor;
    for (const payment of paid) {
      if (left === 0) break;
      const already = refunds.filter((r) => r.paymentIntent === payment.paymentIntent).reduce((s, r) => s + r.amountMinor, 0);
      const take = Math.min(left, payment.amountMinor - already);
      if (take <= 0) continue;
      let refund;
      try {
        refund = await this.payments.sdk.refunds.create({ payment_intent: payment.paymentIntent!, amount: take, metadata: { orderId } });
      } catch (error) {
        this.log.warn({ err: error, orderId }, 'refund failed');
        throw new AppError(
          503,
          'unavailable',
          `The payment service refused or did not answer${left < amountMinor ? ' after part of the refund went through' : ''}: nothing more was refunded.`,
        );
      }
      left -= take;
      await inTransaction(this.dataSource, async (manager) => {
        await manager.getRepository(OrderPayment).insert({
          orderId,
          kind: 'refund',
          status: 'refunded',
          amountMinor: take,
          currency: order.currency,
          paymentIntent: payment.paymentIntent,
          refundId: refund.id,
          createdBy: actor.userId,
        });
        await manager.getRepository(Order).increment({ id: orderId }, 'refundedMinor', take);
        await this.orders.record(manager, orderId, actor, `Refunded ${formatMinor(take, order.currency)}${reason ? `: ${reason}` : ''}`);
      });
    }
    return this.orders.view(actor, orderId);
  }
}
