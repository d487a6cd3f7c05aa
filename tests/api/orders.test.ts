// Buyers' orders end to end against the real MariaDB and the local payments fake (reached through
// the `stripe` SDK): quote, proof and changes, approval, deposit, production, balance, refund and
// hand-over; notices with bad signatures and replays; money in whole cents.
import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { OrderPayment, PaymentNotice } from '../../server/modules/orders/payment.entity';
import { Order } from '../../server/modules/orders/order.entity';
import { signPayload, startFakePayments } from '../../server/payments/fake-api';
import { createPayments } from '../../server/payments/client';
import { lastMailTo } from '../helpers/outbox';
import { makeShop, withCutter } from '../helpers/shop';
import { NOTICE_SECRET, proofToken, quotedOrder, useOrdersApp } from '../helpers/orders';

const t = useOrdersApp();

describe('customer orders', () => {
  it('carries an order from quote to hand-over, with proofs, a deposit, the balance and a refund', async () => {
    const s = await makeShop(t, 1);
    const { stock } = await withCutter(s);
    const { buyer, order } = await quotedOrder(s, stock.id);
    const path = `${s.base}/orders/${order.id}`;
    // Hand arithmetic (README "Orders and money"): 18.00 per 100 sheets = 0.18 a sheet; 76.2 mm
    // squares (art 600 × 600 px, 1/8 in border) with a 3.175 mm gap and margin on 171.45 × 234.95 mm:
    // floor(168.275 / 79.375) = 2 across, floor(231.775 / 79.375) = 2 down, 4 a sheet; 0.045 a
    // sticker, doubled by the 100 % markup = 9 cents. 50 × 9 + 3 × 593 = 2229 cents.
    expect(order.lines.map((l: { unitPriceMinor: number; priceFrom: string }) => [l.unitPriceMinor, l.priceFrom])).toEqual([
      [9, 'cost'],
      [593, 'hand'],
    ]);
    expect(order.totalMinor).toBe(2229);
    expect(order.dueMinor).toBe(1115); // 50 % of 2229 = 1114.5, half up

    // First proof: the buyer asks for changes.
    expect((await s.member.post(`${path}/proofs`, { message: 'Here you go' })).status).toBe(201);
    const first = await proofToken(buyer.email);
    const buyerSide = request(t.sheetsmith.app);
    const page = await buyerSide.get(`/proof/${first}`);
    expect(page.status).toBe(200);
    expect(page.text).toContain('76.2 mm');
    expect(page.text).toContain('$22.29');
    const picture = await buyerSide.get(`/proof/${first}/pictures/0.png`);
    expect(picture.status).toBe(200);
    expect(picture.headers['content-type']).toBe('image/png');
    const asked = await buyerSide.post(`/proof/${first}/changes`).type('form').send({ comment: 'Please make them a bit bigger.' });
    expect(asked.status).toBe(303);
    expect((await s.member.get(path)).body.state).toBe('changes');
    expect((await lastMailTo(s.users.member.email)).subject).toContain('changes asked');

    // A new proof replaces the first: its link is closed (410), the new one is approved once.
    expect((await s.member.post(`${path}/proofs`, {})).status).toBe(201);
    const second = await proofToken(buyer.email);
    expect(second).not.toBe(first);
    expect((await buyerSide.get(`/proof/${first}`)).status).toBe(410);
    expect((await buyerSide.post(`/proof/${second}/approve`).type('form').send({ name: 'Robin Quill' })).status).toBe(303);
    const again = await buyerSide.post(`/proof/${second}/approve`).type('form').send({ name: 'Robin Quill' });
    expect(again.status).toBe(409);
    expect(again.text).toContain('already approved');
    let view = (await s.member.get(path)).body;
    expect(view.state).toBe('approved');
    expect(view.proofs[0]).toMatchObject({ status: 'approved', decidedName: 'Robin Quill' });
    // A line cannot change once approved.
    expect((await s.member.post(`${path}/lines`, { kind: 'sheet', sheetId: s.sheet.id, quantity: 1, unitPrice: 1 })).status).toBe(409);

    // The deposit, paid on the checkout page: only the signed notice marks it paid.
    const pay = await buyerSide.post(`/proof/${second}/pay`);
    expect(pay.status).toBe(303);
    expect(pay.headers.location.startsWith(t.fake.url)).toBe(true);
    expect((await s.member.get(path)).body.paidMinor).toBe(0);
    const paid = await fetch(pay.headers.location, { method: 'POST', redirect: 'manual' });
    expect(paid.status).toBe(303);
    view = (await s.member.get(path)).body;
    expect(view).toMatchObject({ state: 'deposit', paidMinor: 1115, dueMinor: 1114 });

    // Into production; the balance is paid meanwhile; ready; handed over.
    expect((await s.member.post(`${path}/moves`, { to: 'making' })).body.state).toBe('making');
    const balance = await buyerSide.post(`/proof/${second}/pay`);
    await fetch(balance.headers.location, { method: 'POST', redirect: 'manual' });
    view = (await s.member.get(path)).body;
    expect(view).toMatchObject({ state: 'making', paidMinor: 2229, dueMinor: 0 });
    expect((await s.member.post(`${path}/moves`, { to: 'ready' })).body.state).toBe('ready');

    // A refund of 2.00 for a misprint, through the payment service, by someone who takes payments.
    expect((await s.member.post(`${path}/refunds`, { amount: '2.00' })).status).toBe(403);
    const refunded = await s.owner.post(`${path}/refunds`, { amount: '2.00', reason: 'one sticker misprinted' });
    expect(refunded.status).toBe(200);
    expect(refunded.body).toMatchObject({ refundedMinor: 200, paidMinor: 2229 });
    expect(refunded.body.payments.filter((p: { kind: string }) => p.kind === 'refund')).toEqual([
      expect.objectContaining({ amountMinor: 200, status: 'refunded' }),
    ]);
    const tooMuch = await s.owner.post(`${path}/refunds`, { amount: '22.29' });
    expect(tooMuch.status).toBe(400);
    expect(tooMuch.body.error.message).toBe('At most $20.29 can be refunded on this order.');

    view = (await s.member.post(`${path}/moves`, { to: 'handed-over' })).body;
    expect(view.state).toBe('handed-over');
    const log = view.events.map((e: { who: string; what: string }) => `${e.who}: ${e.what}`);
    expect(log).toEqual([
      'member: Started a quote for Robin Quill',
      'member: Added 50 × moon at $0.09 each',
      'member: Added 3 × Moons at $5.93 each',
      `member: Sent a proof to ${buyer.email}`,
      'Robin Quill (buyer): Asked for changes: Please make them a bit bigger.',
      `member: Sent a proof to ${buyer.email}`,
      'Robin Quill (buyer): Approved the proof, typed name "Robin Quill"',
      'Buyer: Asked for $11.15 (deposit)',
      'Payments: Received $11.15 (deposit); paid $11.15 of $22.29',
      'member: Marked in production',
      'Buyer: Asked for $11.14 (balance)',
      'Payments: Received $11.14 (balance); paid $22.29 of $22.29',
      'member: Marked ready',
      'owner: Refunded $2.00: one sticker misprinted',
      'member: Marked handed over',
    ]);
    for (const e of view.events) expect(Date.parse(e.at)).toBeGreaterThan(Date.now() - 120_000);
  });

  it('acts on a notice once: a replay changes nothing, and a bad signature is refused with 400', async () => {
    const s = await makeShop(t, 1);
    const { stock } = await withCutter(s);
    const { buyer, order } = await quotedOrder(s, stock.id);
    const path = `${s.base}/orders/${order.id}`;
    await s.member.post(`${path}/proofs`, {});
    const token = await proofToken(buyer.email);
    const buyerSide = request(t.sheetsmith.app);
    await buyerSide.post(`/proof/${token}/approve`).type('form').send({ name: 'Robin Quill' });
    const pay = await buyerSide.post(`/proof/${token}/pay`);
    const sessionId = pay.headers.location.split('/pay/')[1];
    await t.fake.pay(sessionId);
    const sent = t.fake.sent.find((e) => e.type === 'checkout.session.completed' && JSON.parse(e.payload).data.object.id === sessionId)!;
    expect(sent.status).toBe(200);
    const notices = () => t.db.getRepository(PaymentNotice).count();
    const before = { order: await t.db.getRepository(Order).findOneByOrFail({ id: order.id }), notices: await notices() };
    expect(before.order.paidMinor).toBe(1115);

    const replay = await buyerSide
      .post('/api/payments/notices')
      .set('content-type', 'application/json')
      .set('stripe-signature', sent.signature)
      .send(sent.payload);
    expect(replay.status).toBe(200);
    expect(replay.body).toEqual({ received: true, duplicate: true });

    // The same notice with the amount raised, under the old signature; then signed with another secret.
    const forged = sent.payload.replace('"amount_total":1115', '"amount_total":2229').replace(/"id":"evt_[0-9a-f]+"/, '"id":"evt_forged"');
    for (const signature of [sent.signature, signPayload(forged, 'whsec_someone_else'), 'nonsense', undefined]) {
      const req = buyerSide.post('/api/payments/notices').set('content-type', 'application/json');
      const res = await (signature ? req.set('stripe-signature', signature) : req).send(forged);
      expect(res.status).toBe(400);
      expect(res.body.error.message).toBe('This notice is not signed by the payment service.');
    }
    const after = await t.db.getRepository(Order).findOneByOrFail({ id: order.id });
    expect(after.paidMinor).toBe(1115);
    expect(after.state).toBe('deposit');
    expect(await notices()).toBe(before.notices);
    expect(await t.db.getRepository(OrderPayment).countBy({ orderId: order.id, status: 'paid' })).toBe(1);
    // The properly signed forged amount would be acted on: the signature is what guards it.
    expect(signPayload(forged, NOTICE_SECRET)).toMatch(/^t=\d+,v1=[0-9a-f]{64}$/);
  });
});

describe('payment links', () => {
  it('closes the earlier link when a new one is asked, so the same deposit cannot be paid twice', async () => {
    const s = await makeShop(t, 1);
    const { stock } = await withCutter(s);
    const { buyer, order } = await quotedOrder(s, stock.id);
    await s.member.post(`${s.base}/orders/${order.id}/proofs`, {});
    const token = await proofToken(buyer.email);
    const buyerSide = request(t.sheetsmith.app);
    await buyerSide.post(`/proof/${token}/approve`).type('form').send({ name: 'Robin Quill' });
    const first = (await buyerSide.post(`/proof/${token}/pay`)).headers.location;
    const emailed = await s.owner.post(`${s.base}/orders/${order.id}/payment-link`);
    expect(emailed.status).toBe(201);
    expect(emailed.body.amountMinor).toBe(1115);
    expect((await lastMailTo(buyer.email)).links).toContain(emailed.body.url);
    // The first link is closed: its page says so and paying it does nothing.
    expect(t.fake.sessions.get(first.split('/pay/')[1])?.status).toBe('expired');
    expect((await fetch(first, { method: 'POST', redirect: 'manual' })).status).toBe(410);
    await fetch(emailed.body.url, { method: 'POST', redirect: 'manual' });
    const view = (await s.member.get(`${s.base}/orders/${order.id}`)).body;
    expect(view).toMatchObject({ state: 'deposit', paidMinor: 1115, dueMinor: 1114 });
    expect(view.payments.map((p: { kind: string; status: string }) => `${p.kind} ${p.status}`)).toEqual([
      'deposit expired',
      'deposit paid',
    ]);
  });
});

describe('the local payments fake', () => {
  it('refuses a port already in use (a second app process then uses the running one) and answers the SDK as the service does', async () => {
    const port = Number(new URL(t.fake.url).port);
    await expect(startFakePayments({ port })).rejects.toMatchObject({ code: 'EADDRINUSE' });
    const sdk = createPayments({ STRIPE_SECRET_KEY: '', STRIPE_WEBHOOK_SECRET: NOTICE_SECRET, PAYMENTS_FAKE_URL: t.fake.url }).sdk;
    await expect(sdk.refunds.create({ payment_intent: 'pi_nobody', amount: 100 })).rejects.toMatchObject({
      type: 'StripeInvalidRequestError',
      message: "No such payment_intent: 'pi_nobody'",
    });
  });
});
