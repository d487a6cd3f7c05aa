import AxeBuilder from '@axe-core/playwright';
import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { svgArt } from '../helpers/art';
import { Client, makeTeamWithRoles, uniqueEmail } from '../helpers/app';
import { BROWSER_TEST_TIMEOUT, screenshot, signInThroughForm, useBrowserApp } from '../helpers/browser';
import { uploadFile } from '../helpers/library';
import { benchCutter, placePieces, testPiece } from '../helpers/sheets';

const t = useBrowserApp();

/**
 * WCAG 2.1 level A and AA rules as axe-core implements them (the rules' tags name the success
 * criteria). A finding is reported with the rule, the criterion's help text and the first nodes.
 */
async function violations(page: Page) {
  const result = await new AxeBuilder({ page }).withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa']).analyze();
  return result.violations.map(
    (v) =>
      `${v.id} (${v.impact}): ${v.help} — ${v.nodes
        .slice(0, 3)
        .map((n) => `${n.target.join(' ')} [${n.failureSummary?.split('\n').slice(1).join(' ').trim()}]`)
        .join(' | ')}`,
  );
}

describe('accessibility in Chromium', () => {
  it(
    'every screen passes the WCAG 2.1 A/AA rules of axe-core, at 1280 px and on a laptop',
    async () => {
      const { team, users } = await makeTeamWithRoles(t.db);
      const owner = new Client(t.served.url);
      await owner.signIn(users.owner.email);
      const base = `/api/teams/${team.id}`;
      const art = (
        await uploadFile(owner, team.id, await svgArt(600, 600, '<circle cx="300" cy="300" r="300" fill="#1b4f72"/>'), 'moon.png')
      ).body.results[0].item;
      const { body: sheet } = await owner.post(`${base}/sheets`, { name: 'Moons' });
      expect((await placePieces(owner, team.id, sheet, [testPiece('m1', art.id, 40, 40)])).status).toBe(200);
      const stock = (
        await owner.post(`${base}/stock`, {
          name: 'Matte sticker paper',
          finish: 'matte',
          paper: 'letter',
          packPrice: 18,
          sheetsPerPack: 100,
          onHand: 20,
          lowAt: 25, // running low: the print room's reminders show
        })
      ).body;
      const cutter = await benchCutter(owner, team.id);
      await owner.post(`${base}/print-runs`, { sheetId: sheet.id, copies: 1, stockId: stock.id, cutterId: cutter.id, result: 'good' });
      // A buyer's order with a proof out, for the orders screens and the buyer's proof page.
      const buyer = (await owner.post(`${base}/customers`, { name: 'Wren Alder', email: uniqueEmail('buyer') })).body;
      const order = (await owner.post(`${base}/orders`, { customerId: buyer.id })).body;
      await owner.post(`${base}/orders/${order.id}/lines`, { kind: 'sheet', sheetId: sheet.id, quantity: 4, unitPrice: '6.50' });
      const proofLink = (await owner.post(`${base}/orders/${order.id}/proofs`, {})).body.link as string;

      // axe needs a page from an explicit browser context.
      const newPage = async (viewport: { width: number; height: number }) => (await t.browser.newContext({ viewport })).newPage();
      const signedOut = await newPage({ width: 1280, height: 900 });
      await signedOut.goto(`${t.served.url}/sign-in`);
      await signedOut.getByLabel('E-mail').waitFor();
      expect(await violations(signedOut), 'sign-in').toEqual([]);
      await signedOut.context().close();

      for (const viewport of [
        { width: 1280, height: 900 },
        { width: 1366, height: 768 },
      ]) {
        const page = await newPage(viewport);
        await signInThroughForm(page, t.served.url, users.owner.email);
        const screens: Array<[string, string, () => Promise<unknown>]> = [
          ['library', `/t/${team.id}/library`, () => page.getByText('moon').first().waitFor()],
          ['art', `/t/${team.id}/library/${art.id}`, () => page.getByRole('heading', { name: 'moon' }).waitFor()],
          [
            'make a sticker',
            `/t/${team.id}/library`,
            async () => {
              await page.getByRole('button', { name: 'Make a sticker…' }).click();
              await page.getByLabel('Words (one line per line)').fill('Moon club');
              await page.getByTestId('make-preview').waitFor({ timeout: 15_000 });
            },
          ],
          ['sheets', `/t/${team.id}/sheets`, () => page.getByRole('link', { name: 'Moons' }).waitFor()],
          [
            'editor',
            `/t/${team.id}/sheets/${sheet.id}`,
            async () => {
              await page.getByTestId('preflight-ok').or(page.getByTestId('preflight')).waitFor();
              await page.getByText('Cost', { exact: true }).click();
              await page.getByTestId('cost-sheet').waitFor({ timeout: 15_000 });
            },
          ],
          [
            'print-room',
            `/t/${team.id}/print-room`,
            async () => {
              await page.getByTestId('runs-table').getByText('Moons').waitFor();
              await page.getByTestId('reminders').waitFor();
              await page.getByRole('button', { name: 'New stock…' }).click(); // the forms are checked open
              await page.getByRole('form', { name: 'Log a print run' }).getByLabel('Stock').selectOption({ label: 'Matte sticker paper' });
              await page.getByText(/^Settings used/).click();
            },
          ],
          [
            'orders',
            `/t/${team.id}/orders`,
            async () => {
              await page.getByRole('link', { name: /Wren Alder/ }).waitFor();
              await page.getByRole('button', { name: 'New quote' }).click(); // checked with the form open
            },
          ],
          ['order', `/t/${team.id}/orders/${order.id}`, () => page.getByTestId('order-history').waitFor()],
          ['proof page', new URL(proofLink).pathname, () => page.getByRole('heading', { name: 'Your sticker proof' }).waitFor()],
          ['team', `/t/${team.id}/team`, () => page.getByRole('heading', { level: 1 }).waitFor()],
          ['account', '/account', () => page.getByRole('heading', { level: 1 }).waitFor()],
        ];
        const found: Record<string, string[]> = {};
        for (const [name, url, ready] of screens) {
          await page.goto(`${t.served.url}${url}`);
          await ready();
          const list = await violations(page);
          if (list.length) found[`${name} at ${viewport.width} px`] = list;
        }
        expect(found).toEqual({});
        await screenshot(page, `accessibility-account-${viewport.width}`);
        await page.context().close();
      }
    },
    2 * BROWSER_TEST_TIMEOUT,
  ); // every screen twice: two browser tests' worth
});
