import sharp from 'sharp';
import { describe, expect, it } from 'vitest';
import { Client, makeTeamWithRoles } from '../helpers/app';
import { BROWSER_TEST_TIMEOUT, screenshot, signInThroughForm, useBrowserApp } from '../helpers/browser';
import { teamWithShapes } from '../helpers/editor';
import { uploadFile } from '../helpers/library';
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
    const [download] = await Promise.all([
      page.waitForEvent('download'),
      page.getByRole('link', { name: 'Print image (PNG) for the cutter software' }).click(),
    ]);
    expect(download.suggestedFilename()).toBe('market-singles-print.png');
    await screenshot(page, 'export-panel-files');
    // The sheets list at 1280 px: the export's Download link and the row's Duplicate apart, not run together.
    await page.goto(`${t.served.url}/t/${team.id}/sheets`);
    await page.getByRole('link', { name: 'Market singles' }).first().waitFor();
    await screenshot(page, 'sheets-list-exported');
    const row = page.getByRole('row').filter({ hasText: 'Market singles' });
    // The editor's second save (area used, preview) keeps the version: the bundle is the current one.
    const downloadBox = (await row.getByRole('link', { name: 'Download', exact: true }).boundingBox())!;
    const duplicateBox = (await row.getByRole('button', { name: 'Duplicate' }).boundingBox())!;
    expect(duplicateBox.x - (downloadBox.x + downloadBox.width)).toBeGreaterThanOrEqual(10);
    await page.close();
  });

  it('a 0.6 mm neck shows in the live preflight and the export panel; the profile’s registration marks are named there', async () => {
    const { team, users } = await makeTeamWithRoles(t.db);
    const admin = new Client(t.served.url);
    await admin.signIn(users.admin.email);
    const [profile] = (await admin.get(`/api/teams/${team.id}/sheet-profiles`)).body.profiles;
    const { id: _id, isDefault: _d, ...fields } = profile;
    expect(
      (
        await admin.send('put', `/api/teams/${team.id}/sheet-profiles/${profile.id}`, {
          ...fields,
          regMarkShape: 'bracket',
          regMarkSizeMm: 6.35,
          regMarkOffsetMm: 3.175,
        })
      ).status,
    ).toBe(200);
    // Two discs joined by a bar 0.6 mm wide at 40 mm, cut with no border.
    const necked = await sharp(
      Buffer.from(
        '<svg xmlns="http://www.w3.org/2000/svg" width="1600" height="640" viewBox="0 0 40 16"><circle cx="8" cy="8" r="8" fill="#1f618d"/><circle cx="32" cy="8" r="8" fill="#1f618d"/><rect x="15" y="7.7" width="10" height="0.6" fill="#1f618d"/></svg>',
      ),
    )
      .png()
      .toBuffer();
    const art = (await uploadFile(admin, team.id, necked, 'dumbbell.png')).body.results[0].item;
    const { body: sheet } = await admin.post(`/api/teams/${team.id}/sheets`, { name: 'Dumbbells', unit: 'in' });
    await placePieces(admin, team.id, sheet, [testPiece('n1', art.id, 60, 60, { width: 40, border: 0 })]);

    const page = await t.browser.newPage({ viewport: { width: 1280, height: 800 } });
    await signInThroughForm(page, t.served.url, users.member.email);
    await page.goto(`${t.served.url}/t/${team.id}/sheets/${sheet.id}`);
    const neck = /dumbbell's cut line narrows below 0\.039 in \(or has a slot that narrow\) in one place: the blade may tear it/;
    await expect.poll(() => page.getByTestId('preflight').textContent(), { timeout: 20_000 }).toMatch(neck);
    expect(await page.getByTestId('preflight').locator('[data-code=narrow-neck]').count()).toBe(1);
    await screenshot(page, 'neck-in-live-preflight');
    await page.getByRole('button', { name: 'Export…' }).click();
    expect(await page.getByTestId('export-warnings').textContent()).toMatch(neck);
    expect(await page.getByTestId('export-marks').textContent()).toBe(
      'Registration marks from the profile: corner brackets 0.25 in, 0.125 in outside three corners, printed on the PDF page. Cut layer colour: CutContour.',
    );
    expect(await page.getByLabel('Outline the marks in the cut files too').isChecked()).toBe(false);
    await screenshot(page, 'export-panel-neck-and-marks');
    await page.close();
  });
});
