// Buyers' orders, the buyer's side and production, against the real MariaDB and the local payments
// fake: proof links (expiry, answered proofs frozen, nothing of the team on the page), other teams
// and viewers, bad input, and sheets made for an order by the nester.
import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { lastMailTo } from '../helpers/outbox';
import { makeShop, withCutter } from '../helpers/shop';
import { testApp, unique, uniqueEmail } from '../helpers/app';
import { proofToken, quotedOrder, useOrdersApp } from '../helpers/orders';

const t = useOrdersApp();

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
    const approved = (await s.member.get(path)).body.proofs[0];
    expect(approved).toMatchObject({ status: 'approved', comment: null });
    // The members see exactly the picture the buyer approved; another team does not.
    const seen = await buyerSide.get(`/proof/${token}/pictures/0.png`).buffer(true);
    const url = approved.lines[0].pictureUrl as string;
    expect(url).toMatch(/\/proofs\/\d+\/pictures\/0\.png$/);
    const kept = await s.member.get(url).buffer(true);
    expect(kept.status).toBe(200);
    expect(Buffer.compare(kept.body, seen.body)).toBe(0);
    const other = await makeShop(t, 1);
    expect((await other.owner.get(url.replace(s.base, other.base))).status).toBe(404);

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
    // Nobody has opened them yet: their checks and thumbnails are queued as they are made.
    await expect
      .poll(
        async () => {
          const list = (await s.member.get(`${s.base}/sheets`)).body.sheets as Array<{ id: string; thumbnailUrl: string | null }>;
          return made.body.sheetIds.map((id: string) => Boolean(list.find((x) => x.id === id)?.thumbnailUrl));
        },
        { timeout: 20_000, interval: 250 },
      )
      .toEqual([true, true]);
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

describe('proof pages are rate-limited', () => {
  it('answers the request over the hourly limit per address with 429, in words and with Retry-After, across app processes', async () => {
    const s = await makeShop(t, 1);
    const { stock } = await withCutter(s);
    const { buyer, order } = await quotedOrder(s, stock.id);
    await s.member.post(`${s.base}/orders/${order.id}/proofs`, {});
    const token = await proofToken(buyer.email);
    // Two app processes on one database share the count (rate_limits in MariaDB), as behind a proxy.
    const prefix = unique('proof-limit');
    const [a, b] = [0, 1].map(() => testApp(t.db, { LIMIT_PROOF_REQUESTS_PER_HOUR: 3 }, { rateLimitPrefix: prefix }));
    try {
      expect((await request(a.app).get(`/proof/${token}`)).status).toBe(200);
      expect((await request(b.app).get(`/proof/${token}/pictures/0.png`)).status).toBe(200);
      expect((await request(a.app).get(`/proof/${'B'.repeat(43)}`)).status).toBe(404); // guessing counts too
      const refused = await request(b.app).get(`/proof/${token}`);
      expect(refused.status).toBe(429);
      expect(Number(refused.headers['retry-after'])).toBeGreaterThan(0);
      expect(refused.text).toMatch(/Too many proof pages opened from your network\. Wait about \d+ minutes? and try again\./);
    } finally {
      await Promise.all([a.close(), b.close()]);
    }
  });
});
