// An app for the order tests with the local payments fake on loopback: the app listens on a free
// port so the fake can deliver its signed notices, exactly as on a laptop.
import type { AddressInfo } from 'node:net';
import type { Server } from 'node:http';
import { afterAll, beforeAll } from 'vitest';
import type { DataSource } from 'typeorm';
import type { SheetsmithApp } from '../../server/app';
import type { FakePayments } from '../../server/payments/fake-api';
import { startFakePayments } from '../../server/payments/fake-api';
import { createPayments } from '../../server/payments/client';
import type { Env } from '../../server/config/env';
import { expect } from 'vitest';
import { openDatabase, testApp, uniqueEmail } from './app';
import { lastMailTo } from './outbox';
import type { Shop } from './shop';

export const NOTICE_SECRET = 'whsec_sheetsmith_order_tests';

export function useOrdersApp(overrides: Partial<Env> = {}) {
  const t = {} as { db: DataSource; sheetsmith: SheetsmithApp; fake: FakePayments; server: Server; url: string };
  beforeAll(async () => {
    t.fake = await startFakePayments();
    t.db = await openDatabase();
    const settings = { STRIPE_SECRET_KEY: '', STRIPE_WEBHOOK_SECRET: NOTICE_SECRET, PAYMENTS_FAKE_URL: t.fake.url };
    t.sheetsmith = testApp(t.db, { ...settings, ...overrides }, { payments: createPayments(settings) });
    t.server = await new Promise((resolve) => {
      const s = t.sheetsmith.app.listen(0, '127.0.0.1', () => resolve(s));
    });
    t.url = `http://127.0.0.1:${(t.server.address() as AddressInfo).port}`;
    t.fake.endpoints.push({ url: `${t.url}/api/payments/notices`, secret: NOTICE_SECRET });
  });
  afterAll(async () => {
    await new Promise((resolve) => t.server?.close(resolve));
    await t.sheetsmith?.close();
    await t.fake?.close();
    await t.db?.destroy();
  });
  return t;
}

/** A shop with a stock, a buyer and an order of 50 × 3 in moons (priced from the stock) and 3 sheets at 5.93. */
export async function quotedOrder(s: Shop, stockId: string) {
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

export const proofToken = async (email: string) => {
  const mail = await lastMailTo(email);
  const link = mail.links.find((l) => l.includes('/proof/'))!;
  return link.split('/proof/')[1].replace(/[^A-Za-z0-9_-].*$/, '');
};
