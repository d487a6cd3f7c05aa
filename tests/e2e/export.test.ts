import { describe, expect, it } from 'vitest';
import { BROWSER_TEST_TIMEOUT, screenshot, signInThroughForm, useBrowserApp } from '../helpers/browser';
import { teamWithShapes } from '../helpers/editor';
import { placePieces, testPiece } from '../helpers/sheets';

const t = useBrowserApp();

describe('export panel in Chromium', { timeout: BROWSER_TEST_TIMEOUT }, () => {
  it('says to print at 100 % before anything is exported, then offers each file on its own and the bundle', async () => {
    const { team, users, client, art } = await teamWithShapes(t.db, t.served.url);
    const { body: sheet } = await client.post(`/api/teams/${team.id}/sheets`, { name: 'Market singles', unit: 'in' });
    await placePieces(client, team.id, sheet, [testPiece('e1', art[0].id, 40, 40), testPiece('e2', art[1].id, 100, 40)]);
    const page = await t.browser.newPage({ viewport: { width: 1280, height: 900 } });
    await signInThroughForm(page, t.served.url, users.member.email);
    await page.goto(`${t.served.url}/t/${team.id}/sheets/${sheet.id}`);
    await expect.poll(() => page.getByTestId('save-state').textContent(), { timeout: 20_000 }).toBe('All changes saved');
    await page.getByRole('button', { name: 'Export…' }).click();
    const caution = page.getByTestId('print-caution');
    expect(await caution.isVisible()).toBe(true);
    expect(await caution.textContent()).toBe(
      'Print at 100 % (actual size): no scaling, no fit-to-page, no borderless expansion. A scaled print puts the cut lines off the art and wastes the sheet. Check with a ruler: the print area is 6.75 in × 9.25 in, and the bar under it in the PDF is 1 in.',
    );
    await page.getByRole('dialog', { name: 'Export for print and cut' }).getByRole('button', { name: 'Export', exact: true }).click();
    const files = page.getByRole('list', { name: 'Files of this export' }).getByRole('link');
    await expect.poll(() => files.count(), { timeout: 30_000 }).toBe(7);
    expect(await files.allTextContents()).toContain('Print image (PNG) for the cutter software');
    expect(await page.getByRole('link', { name: 'Everything in one zip' }).count()).toBe(1);
    const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('link', { name: 'Print image (PNG) for the cutter software' }).click()]);
    expect(download.suggestedFilename()).toBe('market-singles-print.png');
    await screenshot(page, 'export-panel-files');
    await page.close();
  });
});
