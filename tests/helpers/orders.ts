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
import { openDatabase, testApp } from './app';

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
