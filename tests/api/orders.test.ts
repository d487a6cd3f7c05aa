// Buyers' orders end to end against the real MariaDB and the local payments fake (reached through
// the `stripe` SDK): quote, proof and changes, approval, deposit, production, balance, refund and
// hand-over; notices with bad signatures and replays; money in whole cents.
import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { OrderPayment, PaymentNotice } from '../../server/modules/orders/payment.entity';
import { Order } from '../../server/modules/orders/order.entity';
import { signPayload } from '../../server/payments/fake-api';
import { lastMailTo } from '../helpers/outbox';
import { makeShop, withCutter } from '../helpers/shop';
import type { Shop } from '../helpers/shop';
import { uniqueEmail } from '../helpers/app';
import { NOTICE_SECRET, useOrdersApp } from '../helpers/orders';

const t = useOrdersApp();

/** A shop with a stock, a buyer and an order of 50 × 3 in moons (priced from the stock) and 3 sheets at 5.93. */
async function quotedOrder(s: Shop, stockId: string) {
  const buyer = (await s.member.post(`${s.base}/customers`, { name: 'Robin Quill', email: uniqueEmail('buyer') })).body;
  const order = (await s.member.post(`${s.base}/orders`, { customerId: buyer.id, depositPercent: 50 })).body;
  const singles = await s.member.post(`${s.base}/orders/${order.id}/lines`, {
    kind: 'singles',
    artId: s.art.id,
    finishedWidthMm: 76.2,
    quantity: 50,
    stockId,
  });
  expect(singles.status).toBe(201);
  const sheet = await s.member.post(`${s.base}/orders/${order.id}/lines`, {
    kind: 'sheet',
    sheetId: s.sheet.id,
    quantity: 3,
    unitPrice: '5.93',
  });
  expect(sheet.status).toBe(201);
  return { buyer, order: sheet.body };
}

const proofToken = async (email: string) => {
  const mail = await lastMailTo(email);
  const link = mail.links.find((l) => l.includes('/proof/'))!;
  return link.split('/proof/')[1].replace(/[^A-Za-z0-9_-].*$/, '');
};

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

describe('proof links and what they show', () => {
  it('answers an expired link with 410, keeps an answered proof as it is, and shows nothing else of the team', async () => {
    const s = await makeShop(t, 1);
    const { stock } = await withCutter(s);
    // Other things the team has: another buyer, another art, a stock and the members' names must not leak.
    await s.member.post(`${s.base}/customers`, { name: 'Zephyrine Oddly', email: uniqueEmail('other') });
    const { buyer, order } = await quotedOrder(s, stock.id);
    const path = `${s.base}/orders/${order.id}`;
    await s.member.post(`${path}/proofs`, {});
    const token = await proofToken(buyer.email);
    const buyerSide = request(t.sheetsmith.app);
    const html = (await buyerSide.get(`/proof/${token}`)).text;
    expect(html).toContain('Order 1');
    for (const secret of [
      s.team.name,
      'Zephyrine Oddly',
      s.users.owner.email,
      s.users.member.email,
      s.users.viewer.email,
      'Desk cutter',
      'Standard blade',
    ])
      expect(html).not.toContain(secret);
    expect(html).not.toMatch(/<script/i);

    // Approved: neither approved again nor changed.
    await buyerSide.post(`/proof/${token}/approve`).type('form').send({ name: 'Robin Quill' });
    const change = await buyerSide.post(`/proof/${token}/changes`).type('form').send({ comment: 'Actually, smaller please' });
    expect(change.status).toBe(409);
    expect((await s.member.get(path)).body.proofs[0]).toMatchObject({ status: 'approved', comment: null });

    // Another order's proof, sent and then left past its expiry.
    const second = await quotedOrder(s, stock.id);
    await s.member.post(`${s.base}/orders/${second.order.id}/proofs`, {});
    const late = await proofToken(second.buyer.email);
    await t.db.query('UPDATE order_proofs SET expires_at = NOW() - INTERVAL 1 MINUTE WHERE order_id = ?', [second.order.id]);
    const expired = await buyerSide.get(`/proof/${late}`);
    expect(expired.status).toBe(410);
    expect(expired.text).toContain('This proof link has expired');
    expect((await buyerSide.post(`/proof/${late}/approve`).type('form').send({ name: 'Robin Quill' })).status).toBe(410);
    expect((await s.member.get(`${s.base}/orders/${second.order.id}`)).body.state).toBe('proof-out');
    // A token nobody was given: 404, in words.
    expect((await buyerSide.get(`/proof/${'A'.repeat(43)}`)).status).toBe(404);
  });

  it("answers another team's order by id with 404, and hides prices from viewers when the owner says so", async () => {
    const s = await makeShop(t, 1);
    const { stock } = await withCutter(s);
    const { order } = await quotedOrder(s, stock.id);
    const other = await makeShop(t, 1);
    expect((await other.owner.get(`${other.base}/orders/${order.id}`)).status).toBe(404);
    expect((await other.owner.post(`${other.base}/orders/${order.id}/moves`, { to: 'cancelled' })).status).toBe(404);

    const seen = (await s.viewer.get(`${s.base}/orders/${order.id}`)).body;
    expect(seen.totalMinor).toBe(2229);
    expect((await s.viewer.post(`${s.base}/orders`, { customerId: seen.customer.id })).status).toBe(403);
    const settings = (await s.owner.get(`${s.base}/shop-settings`)).body;
    expect((await s.owner.send('put', `${s.base}/shop-settings`, { ...settings, viewersSeePrices: false })).status).toBe(200);
    const hidden = (await s.viewer.get(`${s.base}/orders/${order.id}`)).body;
    expect(hidden).toMatchObject({ totalMinor: null, paidMinor: null, dueMinor: null });
    expect(hidden.lines.map((l: { unitPriceMinor: number | null }) => l.unitPriceMinor)).toEqual([null, null]);
    expect(JSON.stringify(hidden)).not.toMatch(/5\.93|0\.09|22\.29/);
    const board = (await s.viewer.get(`${s.base}/orders`)).body;
    expect(board.totals.quote).toEqual({ count: 1, totalMinor: null });
    expect((await s.member.get(`${s.base}/orders`)).body.totals.quote).toEqual({ count: 1, totalMinor: 2229 });
  });
});

describe('bad input on orders', () => {
  it('gives each mistake a clear message and changes nothing', async () => {
    const s = await makeShop(t, 1);
    const { stock } = await withCutter(s);
    const buyer = (await s.member.post(`${s.base}/customers`, { name: 'Robin Quill', email: uniqueEmail('buyer') })).body;
    const order = (await s.member.post(`${s.base}/orders`, { customerId: buyer.id })).body;
    const path = `${s.base}/orders/${order.id}`;
    const line = (body: object) =>
      s.member.post(`${path}/lines`, { kind: 'singles', artId: s.art.id, finishedWidthMm: 50, quantity: 10, stockId: stock.id, ...body });

    const cases: Array<[object, number, string]> = [
      [{ quantity: -5 }, 400, 'Quantity: at least 1'],
      [{ quantity: 2.5 }, 400, 'Quantity: a whole number'],
      [{ unitPrice: 0.001 }, 400, 'Give the price in whole cents, like 1.25: 0.001 is not a price we can charge.'],
      [{ unitPrice: '-1' }, 400, 'Give the price in whole cents, like 1.25: -1 is not a price we can charge.'],
      [
        { finishedWidthMm: 200 },
        400, // In the member's unit (inches by default).
        'moon at 7.874 in wide is 7.874 in tall with its border: larger than the print area of "Letter print-and-cut" (6.75 in × 9.25 in less the margin). Pick a smaller size.',
      ],
    ];
    for (const [body, status, message] of cases) {
      const res = await line(body);
      expect({ body, status: res.status }).toEqual({ body, status });
      expect({ body, said: Object.values(res.body.error.fields ?? {}).concat(res.body.error.message) }).toEqual({
        body,
        said: expect.arrayContaining([message]),
      });
    }
    // A proof of an order with no stickers on it yet.
    const empty = await s.member.post(`${path}/proofs`, {});
    expect(empty.status).toBe(400);
    expect(empty.body.error.message).toBe('This order has no stickers yet: add the art or sheet the buyer wants, then send the proof.');
    const after = (await s.member.get(path)).body;
    expect(after).toMatchObject({ state: 'quote', lines: [], totalMinor: 0 });
    expect(after.events).toHaveLength(1);
    // Sending a proof changed nothing and mailed nobody.
    await expect(lastMailTo(buyer.email)).rejects.toThrow(/no e-mail/);
  });
});

describe('from order to production', () => {
  it('lays an approved order out over the fewest sheets, logs runs against it and shows cost beside price', async () => {
    const s = await makeShop(t, 1);
    const { stock, cutter } = await withCutter(s);
    const buyer = (await s.member.post(`${s.base}/customers`, { name: 'Robin Quill', email: uniqueEmail('buyer') })).body;
    const order = (await s.member.post(`${s.base}/orders`, { customerId: buyer.id, depositPercent: 0 })).body;
    const path = `${s.base}/orders/${order.id}`;
    // 30 moons of 1.5 in: a grid of 38.1 mm squares holds 4 × 5 = 20 a sheet, so at least 2 sheets.
    await s.member.post(`${path}/lines`, {
      kind: 'singles',
      artId: s.art.id,
      finishedWidthMm: 38.1,
      quantity: 30,
      stockId: stock.id,
      unitPrice: '0.50',
    });
    expect((await s.member.post(`${path}/sheets`)).status).toBe(409); // not approved yet
    await s.member.post(`${path}/proofs`, {});
    await request(t.sheetsmith.app)
      .post(`/proof/${await proofToken(buyer.email)}/approve`)
      .type('form')
      .send({ name: 'Robin Quill' });

    const made = await s.member.post(`${path}/sheets`);
    expect(made.status).toBe(201);
    expect(made.body).toMatchObject({ placed: 30, requested: 30 });
    expect(made.body.sheetIds).toHaveLength(2);
    expect(made.body.order.sheetIds).toEqual(made.body.sheetIds);
    expect((await s.member.post(`${path}/sheets`)).status).toBe(409); // made once
    let pieces = 0;
    for (const [k, id] of made.body.sheetIds.entries()) {
      const sheet = (await s.member.get(`${s.base}/sheets/${id}`)).body;
      expect(sheet.name).toBe(`Order 1 · Robin Quill · sheet ${k + 1} of 2`);
      pieces += sheet.document.pieces.length;
      expect(sheet.document.pieces.every((p: { cut: string; artId: string }) => p.cut === 'die' && p.artId === s.art.id)).toBe(true);
      // The sheet's own preflight (exact cut-line geometry) finds no crossing, crowding or stray piece.
      const analysis = (await s.member.get(`${s.base}/sheets/${id}/analysis`)).body;
      expect(analysis.findings.filter((f: { severity: string }) => f.severity === 'error')).toEqual([]);
      expect(analysis.findings.map((f: { code: string }) => f.code)).not.toContain('too-close');
    }
    expect(pieces).toBe(30);

    // A run logged against the order: its cost shows beside the price, and the margin.
    const run = await s.member.post(`${s.base}/print-runs`, {
      sheetId: made.body.sheetIds[0],
      copies: 1,
      stockId: stock.id,
      cutterId: cutter.id,
      result: 'good',
      orderId: order.id,
    });
    expect(run.status).toBe(201);
    expect(run.body.orderId).toBe(order.id);
    // Another team's order cannot take this team's run.
    const other = await makeShop(t, 1);
    const theirBuyer = (await other.owner.post(`${other.base}/customers`, { name: 'X', email: uniqueEmail('x') })).body;
    const theirs = (await other.owner.post(`${other.base}/orders`, { customerId: theirBuyer.id })).body;
    const foreign = await s.member.post(`${s.base}/print-runs`, {
      sheetId: made.body.sheetIds[0],
      copies: 1,
      stockId: stock.id,
      result: 'good',
      orderId: theirs.id,
    });
    expect(foreign.status).toBe(404);
    expect(foreign.body.error.message).toBe('That order was not found.');
    const cost = (await s.member.get(`${s.base}/sheets/${made.body.sheetIds[0]}/cost`)).body.cost.sheet;
    const view = (await s.member.get(path)).body;
    expect(view.totalMinor).toBe(1500);
    expect(view.costMinor).toBe(Math.round(cost * 100));
    expect(view.marginMinor).toBe(1500 - Math.round(cost * 100));
    expect(view.events.at(-1).what).toBe('Made 2 sheets for 30 stickers');
  });
});
