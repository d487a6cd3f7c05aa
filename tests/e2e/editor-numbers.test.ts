// Sizes and places by the numbers (issue 18): width by the finished sticker (art + a border each
// side) or by the art, the other figure beside it; X/Y of the sticker's edges from the print
// area's corner in the user's unit; "mixed" for pieces that differ. In Chromium, with screenshots.
import { describe, expect, it } from 'vitest';
import type { Piece } from '@shared/sheet/document';
import { BROWSER_TEST_TIMEOUT, screenshot, signInThroughForm, useBrowserApp } from '../helpers/browser';
import { screenOf, sheetOf, teamWithShapes } from '../helpers/editor';
import { placePieces, testPiece } from '../helpers/sheets';

const t = useBrowserApp();

describe('sizes and places by the numbers', { timeout: BROWSER_TEST_TIMEOUT }, () => {
  it('sizes by the finished sticker, moves by X/Y, and shows mixed values for a mixed selection', async () => {
    const { team, users, client, art } = await teamWithShapes(t.db, t.served.url);
    const { body: sheet } = await client.post(`/api/teams/${team.id}/sheets`, { name: 'Numbers', unit: 'in' });
    await placePieces(client, team.id, sheet, [
      testPiece('n1', art[0].id, 60, 60, { width: 38.1 }), // a 1.5 in circle with a 1/8 in border: a 1.75 in sticker
      testPiece('n2', art[1].id, 130, 100, { width: 25.4 }),
    ]);
    const page = await t.browser.newPage({ viewport: { width: 1280, height: 900 } });
    await signInThroughForm(page, t.served.url, users.member.email);
    await page.goto(`${t.served.url}/t/${team.id}/sheets/${sheet.id}`);
    await expect.poll(() => page.getByTestId('area-used').textContent(), { timeout: 20_000 }).toMatch(/^2 pieces · [1-9]/);
    const n1 = await screenOf(page, { x: 60, y: 60 });
    await page.mouse.click(n1.x, n1.y);
    const sticker = page.getByLabel('Sticker width (in)');
    await expect.poll(() => sticker.inputValue()).toBe('1.75');
    expect(await page.getByText('art 1.5 in', { exact: true }).count()).toBe(1);
    await sticker.fill('2');
    await sticker.press('Enter');
    await expect.poll(() => page.getByText('art 1.75 in', { exact: true }).count()).toBe(1);
    // X: the sticker's left edge 0.5 in from the print area's edge (its centre at 0.5 + 2/2 in).
    await expect.poll(() => page.getByLabel('X (in)').inputValue(), { timeout: 15_000 }).toBe(String(+((60 - 25.4) / 25.4).toFixed(3)));
    await page.getByLabel('X (in)').fill('0.5');
    await page.getByLabel('X (in)').press('Enter');
    await screenshot(page, 'editor-size-by-sticker');
    await expect.poll(() => page.getByTestId('save-state').textContent(), { timeout: 15_000 }).toBe('All changes saved');
    let pieces: Piece[] = (await sheetOf(client, team.id, sheet.id)).document.pieces;
    const first = pieces.find((p) => p.id === 'n1')!;
    expect(first.width).toBeCloseTo(44.45, 6); // 2 in − 2 × 1/8 in
    expect(first.x).toBeCloseTo(12.7 + 25.4, 3);

    // Both selected: their widths and edges differ, so the fields say "mixed"; a Y typed applies to each.
    const n2 = await screenOf(page, { x: 130, y: 100 });
    await page.keyboard.down('Shift');
    await page.mouse.click(n2.x, n2.y);
    await page.keyboard.up('Shift');
    await expect.poll(() => page.getByText('2 pieces', { exact: true }).count()).toBe(1);
    expect(await sticker.inputValue()).toBe('');
    expect(await sticker.getAttribute('placeholder')).toBe('mixed');
    expect(await page.getByLabel('Y (in)').getAttribute('placeholder')).toBe('mixed');
    await page.getByLabel('Y (in)').fill('1');
    await page.getByLabel('Y (in)').press('Enter');
    await expect.poll(() => page.getByLabel('Y (in)').inputValue()).toBe('1');
    await screenshot(page, 'editor-mixed-selection');
    await expect.poll(() => page.getByTestId('save-state').textContent(), { timeout: 15_000 }).toBe('All changes saved');
    pieces = (await sheetOf(client, team.id, sheet.id)).document.pieces;
    expect(pieces.find((p) => p.id === 'n1')!.y).toBeCloseTo(25.4 + 25.4, 3); // a 2 in sticker: half is 1 in
    expect(pieces.find((p) => p.id === 'n2')!.x).toBeCloseTo(130, 6); // X was left mixed: nothing moved sideways
    // A 1 in rounded square with its border: 1.25 in, within a pixel of its traced cut line (300 DPI).
    expect(Math.abs(pieces.find((p) => p.id === 'n2')!.y - (25.4 + 31.75 / 2))).toBeLessThan(25.4 / 300);
    await page.close();
  });

  it('right click and Shift+F10 open a context menu of the registry’s actions, with their shortcuts', async () => {
    const { team, users, client, art } = await teamWithShapes(t.db, t.served.url);
    const { body: sheet } = await client.post(`/api/teams/${team.id}/sheets`, { name: 'Menu', unit: 'in' });
    await placePieces(client, team.id, sheet, [testPiece('c1', art[0].id, 60, 60, { width: 38.1 })]);
    const page = await t.browser.newPage({ viewport: { width: 1280, height: 900 } });
    await signInThroughForm(page, t.served.url, users.member.email);
    await page.goto(`${t.served.url}/t/${team.id}/sheets/${sheet.id}`);
    await expect.poll(() => page.getByTestId('area-used').textContent(), { timeout: 20_000 }).toMatch(/^1 piece · [1-9]/);
    const at = await screenOf(page, { x: 60, y: 60 });
    await page.mouse.click(at.x, at.y);
    await page.mouse.click(at.x, at.y, { button: 'right' });
    const menu = page.getByRole('menu', { name: 'Selection actions' });
    await menu.waitFor();
    expect(await menu.getByRole('menuitem', { name: /^Duplicate/ }).textContent()).toBe('DuplicateCtrl/⌘ D');
    await screenshot(page, 'editor-context-menu');
    await menu.getByRole('menuitem', { name: /^Duplicate/ }).click();
    await expect.poll(() => page.getByTestId('area-used').textContent()).toMatch(/^2 pieces/);
    expect(await menu.count()).toBe(0);
    // From the keyboard: Shift+F10, arrows, Escape; the first item has the focus.
    await page.keyboard.press('Shift+F10');
    await menu.waitFor();
    expect(await page.evaluate(() => document.activeElement?.textContent)).toBe('DuplicateCtrl/⌘ D');
    await page.keyboard.press('ArrowDown');
    expect(await page.evaluate(() => document.activeElement?.textContent)).toBe('Rotate 90° clockwiseR');
    await page.keyboard.press('Escape');
    await expect.poll(() => menu.count()).toBe(0);
    await page.close();
  });

  it('Escape during a drag puts the piece back and records nothing', async () => {
    const { team, users, client, art } = await teamWithShapes(t.db, t.served.url);
    const { body: sheet } = await client.post(`/api/teams/${team.id}/sheets`, { name: 'Escape', unit: 'in' });
    await placePieces(client, team.id, sheet, [testPiece('d1', art[0].id, 60, 60, { width: 38.1 })]);
    const page = await t.browser.newPage({ viewport: { width: 1280, height: 900 } });
    await signInThroughForm(page, t.served.url, users.member.email);
    await page.goto(`${t.served.url}/t/${team.id}/sheets/${sheet.id}`);
    await expect.poll(() => page.getByTestId('area-used').textContent(), { timeout: 20_000 }).toMatch(/^1 piece · [1-9]/);
    const at = await screenOf(page, { x: 60, y: 60 });
    await page.mouse.move(at.x, at.y);
    await page.mouse.down();
    await page.mouse.move(at.x + 120, at.y + 80, { steps: 6 });
    await page.keyboard.press('Escape');
    await page.mouse.up();
    await page.waitForTimeout(1200); // longer than the autosave's quiet time
    expect(await page.getByRole('button', { name: 'Undo' }).isDisabled()).toBe(true);
    expect((await sheetOf(client, team.id, sheet.id)).document.pieces[0]).toMatchObject({ x: 60, y: 60 });
    // The piece is drawn where it was: a click there still selects it.
    await page.mouse.click(at.x, at.y);
    await expect.poll(() => page.getByText('One piece', { exact: true }).count()).toBe(1);
    await page.close();
  });
});
