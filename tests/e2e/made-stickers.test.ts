// Stickers made from words and shapes, and a label sheet (issue 18), in Chromium with screenshots.
import { describe, expect, it } from 'vitest';
import type { Piece } from '@shared/sheet/document';
import { BROWSER_TEST_TIMEOUT, screenshot, signInThroughForm, useBrowserApp } from '../helpers/browser';
import { Client, makeTeamWithRoles } from '../helpers/app';
import { screenOf, sheetOf } from '../helpers/editor';
import { placePieces, testPiece } from '../helpers/sheets';

const t = useBrowserApp();
const IN = 25.4;

describe('made stickers', { timeout: BROWSER_TEST_TIMEOUT }, () => {
  it('makes a name sticker from words with a live preview, and it joins the library', async () => {
    const { team, users } = await makeTeamWithRoles(t.db);
    const page = await t.browser.newPage({ viewport: { width: 1280, height: 900 } });
    await signInThroughForm(page, t.served.url, users.member.email);
    await page.goto(`${t.served.url}/t/${team.id}/library`);
    await page.getByRole('button', { name: 'Make a sticker…' }).click();
    await page.getByLabel('Words (one line per line)').fill('Hello\nMaple');
    await page.getByLabel('Font').selectOption('handwritten');
    await page.getByLabel('Name in the library').fill('maple name');
    await page.getByTestId('make-preview').waitFor({ timeout: 15_000 });
    await screenshot(page, 'make-text-sticker');
    await page.getByRole('button', { name: 'Add to the library' }).click();
    await expect.poll(() => page.getByText('Added “maple name”', { exact: false }).count(), { timeout: 15_000 }).toBe(1);
    await expect.poll(() => page.getByTestId('result-count').textContent(), { timeout: 15_000 }).toBe('1 piece of art');
    // A bad size is named beside its field, and nothing is added.
    await page.getByLabel('Letter size (in)').fill('ten');
    await page.getByRole('button', { name: 'Add to the library' }).click();
    await expect.poll(() => page.getByText('Letter size: give a size').count(), { timeout: 15_000 }).toBeGreaterThan(0);
    expect(await page.getByTestId('result-count').textContent()).toBe('1 piece of art');
    await page.close();
  });

  it('fills the sheet with a label on an exact grid: pitch = label + border + gap (± 0.01 in)', async () => {
    const { team, users } = await makeTeamWithRoles(t.db);
    const client = new Client(t.served.url);
    await client.signIn(users.member.email);
    const made = await client.post(`/api/teams/${team.id}/art/made`, {
      name: 'Planner label',
      kind: 'shape',
      shape: 'label',
      shapeWidthMm: 2 * IN,
      shapeHeightMm: 0.75 * IN,
      text: 'To do',
    });
    const art = made.body.results[0].item;
    const { body: sheet } = await client.post(`/api/teams/${team.id}/sheets`, { name: 'Planner sheet', unit: 'in' });
    await placePieces(client, team.id, sheet, [testPiece('lab', art.id, 60, 40, { width: 2 * IN })]);
    const page = await t.browser.newPage({ viewport: { width: 1280, height: 900 } });
    await signInThroughForm(page, t.served.url, users.member.email);
    await page.goto(`${t.served.url}/t/${team.id}/sheets/${sheet.id}`);
    await expect.poll(() => page.getByTestId('area-used').textContent(), { timeout: 20_000 }).toMatch(/^1 piece · [1-9]/);
    const at = await screenOf(page, { x: 60, y: 40 });
    await page.mouse.click(at.x, at.y);
    await page.getByRole('button', { name: 'Fill with labels' }).click();
    // 6.5 × 9 in inside the margin; a 2.25 × 1 in sticker at a 1/8 in gap: 2 across, 8 down.
    await expect.poll(() => page.getByTestId('area-used').textContent(), { timeout: 15_000 }).toMatch(/^16 pieces/);
    await expect.poll(() => page.getByTestId('save-state').textContent(), { timeout: 20_000 }).toBe('All changes saved');
    await screenshot(page, 'label-grid');
    const pieces: Piece[] = (await sheetOf(client, team.id, sheet.id)).document.pieces;
    const xs = [...new Set(pieces.map((p) => p.x.toFixed(4)))].map(Number).sort((a, b) => a - b);
    const ys = [...new Set(pieces.map((p) => p.y.toFixed(4)))].map(Number).sort((a, b) => a - b);
    expect([xs.length, ys.length]).toEqual([2, 8]);
    expect(Math.abs(xs[1] - xs[0] - 2.375 * IN)).toBeLessThan(0.01 * IN);
    for (let j = 1; j < ys.length; j++) expect(Math.abs(ys[j] - ys[j - 1] - 1.125 * IN)).toBeLessThan(0.01 * IN);
    expect(await page.getByTestId('preflight-ok').count()).toBe(1);
    // One undo step takes the whole grid away.
    await page.mouse.click(5, 300);
    await page.keyboard.press('Control+z');
    await expect.poll(() => page.getByTestId('area-used').textContent()).toMatch(/^1 piece/);
    await page.close();
  });
});
