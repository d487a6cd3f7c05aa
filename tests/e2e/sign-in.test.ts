import sharp from 'sharp';
import { describe, expect, it } from 'vitest';
import { DEMO_ACCOUNTS, DEMO_PASSWORD, DEMO_SHOP } from '../../server/db/demo/accounts';
import { env } from '../../server/config/env';
import { seedDemo } from '../../server/db/demo/seed';
import { LocalDiskStorage } from '../../server/storage/local-disk';
import { Client, binary } from '../helpers/app';
import { BROWSER_TEST_TIMEOUT, screenshot, useBrowserApp } from '../helpers/browser';

// The whole demo shop, art and sheets included, in the storage the served app reads.
const storage = new LocalDiskStorage(env.storageDir);
const t = useBrowserApp((db) => seedDemo(db, storage));

const ROLE_LABEL = { owner: 'Owner', admin: 'Admin', member: 'Member', viewer: 'Viewer' } as const;

describe('signing in as each demo account in Chromium', { timeout: BROWSER_TEST_TIMEOUT }, () => {
  for (const account of DEMO_ACCOUNTS) {
    it(`${account.email} reaches the shell with the ${account.role} role`, async () => {
      const page = await t.browser.newPage({ viewport: { width: 1280, height: 800 } });
      await page.goto(`${t.served.url}/`);
      await page.waitForURL(/\/sign-in/);
      await page.getByLabel('E-mail').fill(account.email);
      await page.getByLabel('Password').fill(DEMO_PASSWORD);
      await page.getByRole('button', { name: 'Sign in' }).click();
      await page.waitForURL(/\/t\/\d+\/library$/);
      await expect.poll(() => page.getByTestId('role-badge').textContent()).toBe(ROLE_LABEL[account.role]);
      expect(await page.getByLabel('Switch team').locator('option:checked').textContent()).toBe(DEMO_SHOP);
      expect(await page.getByTestId('account-link').textContent()).toBe(account.name);
      // The body font is the shipped Nunito, not a fallback.
      expect(await page.evaluate(() => document.fonts.check('16px Nunito'))).toBe(true);
      await screenshot(page, `shell-${account.role}`);

      await page.getByRole('link', { name: 'Team' }).click();
      await page.getByRole('heading', { name: 'Members' }).waitFor();
      const canInvite = account.role === 'owner' || account.role === 'admin';
      expect(await page.getByRole('button', { name: 'Send invitation' }).count()).toBe(canInvite ? 1 : 0);
      await screenshot(page, `team-${account.role}`);
      await page.close();
    });
  }
});

describe('inviting on the team page', { timeout: BROWSER_TEST_TIMEOUT }, () => {
  it('a refused invite replaces the earlier success, never shows beside it; a double click sends once', async () => {
    const page = await t.browser.newPage({ viewport: { width: 1280, height: 800 } });
    await page.goto(`${t.served.url}/sign-in`);
    await page.getByLabel('E-mail').fill(DEMO_ACCOUNTS[0].email);
    await page.getByLabel('Password').fill(DEMO_PASSWORD);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.waitForURL(/\/t\/\d+\/library$/);
    await page.getByRole('link', { name: 'Team' }).click();
    const invites = page.waitForResponse((r) => r.url().includes('/invites') && r.request().method() === 'POST');
    await page.getByLabel('Their e-mail').fill('new.helper@example.com');
    await page.getByRole('button', { name: 'Send invitation' }).dblclick();
    await invites;
    await expect.poll(() => page.getByText('Invitation sent to new.helper@example.com', { exact: false }).count()).toBe(1);
    await page.waitForTimeout(300);
    expect(await page.getByText('new.helper@example.com ·', { exact: false }).count()).toBe(1); // one pending invite, not two

    await page.getByLabel('Their e-mail').fill(DEMO_ACCOUNTS[2].email); // already in the team
    await page.getByRole('button', { name: 'Send invitation' }).click();
    await expect.poll(() => page.getByText('That person is already in this team.').count()).toBe(1);
    expect(await page.getByText('Invitation sent to', { exact: false }).count()).toBe(0);
    await screenshot(page, 'team-invite-refused');
    await page.close();
  });
});

describe('sign-in form', { timeout: BROWSER_TEST_TIMEOUT }, () => {
  it('shows inline field errors and keeps what the user typed', async () => {
    const page = await t.browser.newPage({ viewport: { width: 1280, height: 800 } });
    await page.goto(`${t.served.url}/sign-in`);
    await page.getByLabel('E-mail').fill('owner@demo');
    await page.getByRole('button', { name: 'Sign in' }).click();
    await expect.poll(() => page.getByText('Enter an e-mail address like name@example.com').count()).toBe(1);
    expect(await page.getByText('Enter your password').count()).toBe(1);
    expect(await page.getByLabel('E-mail').inputValue()).toBe('owner@demo');

    await page.getByLabel('E-mail').fill('owner@demo.test');
    await page.getByLabel('Password').fill('not-the-password');
    await page.getByRole('button', { name: 'Sign in' }).click();
    await expect.poll(() => page.getByRole('alert').first().textContent()).toContain('do not match an account');
    expect(await page.getByLabel('E-mail').inputValue()).toBe('owner@demo.test');
    await screenshot(page, 'sign-in-errors');
    await page.close();
  });

  it('can be completed with the keyboard alone', async () => {
    const page = await t.browser.newPage({ viewport: { width: 1280, height: 800 } });
    await page.goto(`${t.served.url}/sign-in`);
    await page.getByLabel('E-mail').waitFor();
    // The e-mail field has focus on arrival.
    await expect.poll(() => page.evaluate(() => document.activeElement?.getAttribute('name'))).toBe('email');
    await page.keyboard.type('member@demo.test');
    await page.keyboard.press('Tab');
    await page.keyboard.type(DEMO_PASSWORD);
    await page.keyboard.press('Enter');
    await page.waitForURL(/\/t\/\d+\/library$/);
    await page.close();
  });
});

describe('the demo shop', { timeout: BROWSER_TEST_TIMEOUT }, () => {
  it('has two arranged sheets without preflight errors, costed, whose logged runs moved stock and the blade; seeding again adds nothing', async () => {
    const owner = new Client(t.served.url);
    await owner.signIn('owner@demo.test', DEMO_PASSWORD);
    const teamId = (await owner.get('/api/me')).body.teams.find((x: { teamName: string }) => x.teamName === DEMO_SHOP).teamId;
    const base = `/api/teams/${teamId}`;
    const { sheets } = (await owner.get(`${base}/sheets`)).body;
    expect(sheets.map((s: { name: string }) => s.name).sort()).toEqual([
      'Garden party, market sheet',
      'Space doodles for the Hartwell kids',
    ]);
    for (const sheet of sheets) {
      expect(sheet.pieceCount).toBeGreaterThanOrEqual(9);
      expect(sheet.cost?.sheet).toBeGreaterThan(0);
      // The sheets table shows a picture of each: a 240 px PNG drawn when the demo was seeded.
      const thumbnail = await owner.get(sheet.thumbnailUrl).buffer(true).parse(binary);
      expect(thumbnail.status).toBe(200);
      expect((await sharp(thumbnail.body as Buffer).metadata()).width).toBe(240);
      const analysis = (await owner.get(`${base}/sheets/${sheet.id}/analysis`)).body;
      expect(analysis.findings.filter((f: { severity: string }) => f.severity === 'error')).toEqual([]);
      expect(analysis.findings.filter((f: { code: string }) => f.code === 'too-close' || f.code === 'overlap')).toEqual([]);
    }
    const { runs } = (await owner.get(`${base}/print-runs`)).body;
    expect(runs).toHaveLength(5);
    const { stock } = (await owner.get(`${base}/stock`)).body;
    const used = (name: string) =>
      runs.filter((r: { stock: { name: string } }) => r.stock.name === name).reduce((n: number, r: { copies: number }) => n + r.copies, 0);
    expect(stock.find((s: { name: string }) => s.name === 'Puddle glossy sticker paper').onHand).toBe(
      64 - used('Puddle glossy sticker paper'),
    );
    expect(stock.find((s: { name: string }) => s.name === 'Frosted clear vinyl').onHand).toBe(6 - used('Frosted clear vinyl'));
    const cutter = (await owner.get(`${base}/machines`)).body.machines.find((m: { kind: string }) => m.kind === 'cutter');
    const total = runs.reduce((m: number, r: { cutLengthM: number }) => m + r.cutLengthM, 0);
    expect(cutter.blade.cutLengthM).toBeCloseTo(total, 6);
    // Two buyers' quotes: 60 tulips at 0.45 (27.00) and 5 market sheets at 6.50 (32.50).
    const board = (await owner.get(`${base}/orders`)).body;
    expect(board.totals.quote).toEqual({ count: 2, totalMinor: 5950 });
    expect(await seedDemo(t.db, storage)).toBe(0);
  });
});
