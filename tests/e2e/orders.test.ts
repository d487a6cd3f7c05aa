// A buyer's order in Chromium: the shop quotes and sends a proof, the buyer (a second browser
// context, no account) asks for a change, the shop sends a new proof, the buyer approves and pays
// on the local payments fake's checkout page, the order reads paid and its sheets are made.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser } from 'playwright-core';
import type { DataSource } from 'typeorm';
import { svgArt } from '../helpers/art';
import { Client, makeTeamWithRoles, openDatabase, uniqueEmail } from '../helpers/app';
import {
  BROWSER_TEST_TIMEOUT,
  freePort,
  launchChromium,
  screenshot,
  serveApp,
  signInThroughForm,
  watchContentSecurityPolicy,
} from '../helpers/browser';
import { uploadFile } from '../helpers/library';
import { lastMailTo } from '../helpers/outbox';
import { STOCK } from '../helpers/shop';
import { startFakePayments } from '../../server/payments/fake-api';
import type { FakePayments } from '../../server/payments/fake-api';
import { createPayments } from '../../server/payments/client';

const SECRET = 'whsec_sheetsmith_e2e_orders';
const t = {} as { db: DataSource; fake: FakePayments; served: Awaited<ReturnType<typeof serveApp>>; browser: Browser; csp: string[] };

beforeAll(async () => {
  t.db = await openDatabase();
  t.fake = await startFakePayments();
  const port = await freePort();
  const settings = { STRIPE_SECRET_KEY: '', STRIPE_WEBHOOK_SECRET: SECRET, PAYMENTS_FAKE_URL: t.fake.url };
  t.served = await serveApp(t.db, {
    port,
    env: { ...settings, appUrl: `http://127.0.0.1:${port}` },
    extra: { payments: createPayments(settings) },
  });
  t.fake.endpoints.push({ url: `${t.served.url}/api/payments/notices`, secret: SECRET });
  t.browser = await launchChromium();
  t.csp = watchContentSecurityPolicy(t.browser);
});
afterAll(async () => {
  await t.browser?.close();
  await t.served?.close();
  await t.fake?.close();
  await t.db?.destroy();
  if (t.csp?.length) throw new Error(`Content Security Policy blocked something:\n${t.csp.join('\n')}`);
});

describe('a buyer’s order in Chromium', { timeout: BROWSER_TEST_TIMEOUT * 2 }, () => {
  it('goes from quote through a changed proof to approval, payment and sheets', async () => {
    const { team, users } = await makeTeamWithRoles(t.db);
    const owner = new Client(t.served.url);
    await owner.signIn(users.owner.email);
    const base = `/api/teams/${team.id}`;
    await uploadFile(owner, team.id, await svgArt(600, 600, '<circle cx="300" cy="300" r="300" fill="#c0392b"/>'), 'cherry-badge.png');
    const stock = (await owner.post(`${base}/stock`, STOCK)).body;
    const buyerEmail = uniqueEmail('buyer');

    const shop = await t.browser.newPage({ viewport: { width: 1280, height: 900 } });
    await signInThroughForm(shop, t.served.url, users.member.email);
    await shop.getByRole('link', { name: 'Orders' }).click();
    await shop.getByRole('button', { name: 'New quote' }).click();
    await shop.getByLabel('Their name').fill('Juniper Vale');
    await shop.getByLabel('Their e-mail (proofs go there)').fill(buyerEmail);
    await shop.getByLabel('Deposit asked before printing (%)').fill('0');
    await shop.getByRole('button', { name: 'Start the quote' }).click();
    await shop.waitForURL(/\/orders\/\d+$/);
    await shop.getByLabel('Find art').fill('cherry');
    await expect.poll(() => shop.getByLabel('Art', { exact: true }).locator('option').count(), { timeout: 20_000 }).toBe(2);
    await shop.getByLabel('Art', { exact: true }).selectOption({ label: 'cherry-badge' });
    await shop.getByLabel('Finished width, border included (in)').fill('1.5');
    await shop.getByLabel('How many').fill('30');
    await shop.getByLabel('Stock').selectOption(stock.id);
    await shop.getByRole('button', { name: 'Add to the order' }).click();
    await expect.poll(() => shop.getByRole('cell', { name: /cherry-badge/ }).count(), { timeout: 20_000 }).toBe(1);
    await shop.getByRole('button', { name: 'Send the proof' }).click();
    await expect.poll(() => shop.getByTestId('order-state').textContent(), { timeout: 20_000 }).toBe('Proof with the buyer');
    await screenshot(shop, 'order-proof-sent');

    // The buyer, in a browser of their own with no account.
    const buyer = await (await t.browser.newContext({ viewport: { width: 1024, height: 800 } })).newPage();
    const firstLink = (await lastMailTo(buyerEmail)).links.find((l) => l.includes('/proof/'))!;
    expect(firstLink.startsWith(t.served.url)).toBe(true);
    await buyer.goto(firstLink);
    await expect.poll(() => buyer.getByRole('heading', { name: 'Your sticker proof' }).count(), { timeout: 20_000 }).toBe(1);
    expect(
      await buyer.getByRole('img', { name: /cherry-badge with its cut line/ }).evaluate((img: HTMLImageElement) => img.naturalWidth),
    ).toBeGreaterThan(100);
    await screenshot(buyer, 'order-proof-buyer');
    await buyer.getByLabel('Or tell the shop what to change').fill('Could the border be a touch wider?');
    await buyer.getByRole('button', { name: 'Ask for changes' }).click();
    await expect.poll(() => buyer.getByRole('status').textContent(), { timeout: 20_000 }).toContain('You asked for changes');

    await shop.reload();
    await expect.poll(() => shop.getByTestId('order-state').textContent(), { timeout: 20_000 }).toBe('Changes asked');
    await shop.getByRole('button', { name: 'Send a new proof' }).click();
    await expect.poll(() => shop.getByTestId('order-state').textContent(), { timeout: 20_000 }).toBe('Proof with the buyer');

    const secondLink = (await lastMailTo(buyerEmail)).links.find((l) => l.includes('/proof/'))!;
    expect(secondLink).not.toBe(firstLink);
    await buyer.goto(secondLink);
    await buyer.getByLabel('Type your name to approve this proof').fill('Juniper Vale');
    await buyer.getByRole('button', { name: 'Approve this proof' }).click();
    await expect.poll(() => buyer.getByRole('status').first().textContent(), { timeout: 20_000 }).toContain('Approved by Juniper Vale');
    await buyer.getByRole('button', { name: /^Pay / }).click();
    await buyer.waitForURL(`${t.fake.url}/pay/**`);
    await screenshot(buyer, 'order-fake-checkout');
    await buyer.getByRole('button', { name: /^Pay / }).click();
    await buyer.waitForURL(/\/proof\/[^/]+\?paid=1$/);
    await expect.poll(() => buyer.getByText('Thank you: your payment is on its way').count(), { timeout: 20_000 }).toBe(1);

    await shop.reload();
    await expect.poll(() => shop.getByTestId('order-state').textContent(), { timeout: 20_000 }).toBe('Paid in full');
    await shop.getByRole('button', { name: 'Make the sheets for this order' }).click();
    await expect.poll(() => shop.getByRole('link', { name: /^Sheet \d$/ }).count(), { timeout: 30_000 }).toBeGreaterThan(0);
    expect(await shop.getByTestId('order-history').textContent()).toMatch(/Payments: Received \$\d+\.\d\d \(balance\)/);
    await shop.getByRole('button', { name: 'Into production' }).click();
    await expect.poll(() => shop.getByTestId('order-state').textContent(), { timeout: 20_000 }).toBe('In production');
    await screenshot(shop, 'order-paid-with-sheets');

    // The owner (who takes payments) refunds part of it through the payment service.
    const ownerPage = await t.browser.newPage({ viewport: { width: 1280, height: 900 } });
    await signInThroughForm(ownerPage, t.served.url, users.owner.email);
    await ownerPage.goto(shop.url());
    await ownerPage.getByLabel('Refund').fill('0.10');
    await ownerPage.getByLabel('Why').fill('one sticker came out pale');
    await ownerPage.getByRole('button', { name: 'Refund', exact: true }).click();
    await expect.poll(() => ownerPage.getByTestId('order-money').textContent(), { timeout: 20_000 }).toContain('Refunded$0.10');
    expect(await ownerPage.getByTestId('order-history').textContent()).toContain('Refunded $0.10: one sticker came out pale');
    expect(await ownerPage.getByLabel('Refund').inputValue()).toBe('');

    const shopMail = await lastMailTo(users.member.email);
    expect(shopMail.subject).toMatch(/proof approved/);
    expect((await lastMailTo(buyerEmail)).subject).toMatch(/Your sticker proof/);
  });
});
