import { mkdirSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import type { Piece } from '@shared/sheet/document';
import { BROWSER_TEST_TIMEOUT, screenshot, signInThroughForm, useBrowserApp } from '../helpers/browser';
import { placePieces, testPiece } from '../helpers/sheets';
import { screenOf, sheetOf, teamWithShapes } from '../helpers/editor';

const t = useBrowserApp();

const signIn = (page: Page, email: string) => signInThroughForm(page, t.served.url, email);

const teamWithArt = () => teamWithShapes(t.db, t.served.url);

describe('sheet editor in Chromium', { timeout: BROWSER_TEST_TIMEOUT }, () => {
  it('create, drag three pieces in, type a width, gap warning, undo/redo, reload', async () => {
    const { team, users, client } = await teamWithArt();
    const page = await t.browser.newPage({ viewport: { width: 1280, height: 900 } });
    await signIn(page, users.member.email);
    await page.goto(`${t.served.url}/t/${team.id}/sheets`);
    await page.getByPlaceholder('e.g. Spring market, sheet 1').fill('Editor trial');
    await page.getByRole('button', { name: 'Start sheet' }).click();
    await page.waitForURL(/sheets\/\d+$/);
    const sheetId = page.url().split('/').pop()!;
    const items = page.locator('[data-testid=library-panel] li');
    await expect.poll(() => items.count()).toBe(3);

    const canvas = page.getByTestId('sheet-canvas');
    const targets = [
      { x: 40, y: 40 },
      { x: 110, y: 40 },
      { x: 75, y: 150 },
    ];
    // The panel lists newest first: the circle (shape-1) is last; it goes top left.
    for (const [i, at] of targets.entries()) {
      const p = await screenOf(page, at);
      const box = (await canvas.boundingBox())!;
      await items.nth(2 - i).dragTo(canvas, { targetPosition: { x: p.x - box.x, y: p.y - box.y } });
    }
    await expect.poll(() => page.getByTestId('area-used').textContent(), { timeout: 20_000 }).toMatch(/^3 pieces · [1-9]/);
    await expect.poll(() => page.getByTestId('preflight-ok').count(), { timeout: 15_000 }).toBe(1);
    await expect.poll(() => page.getByTestId('save-state').textContent(), { timeout: 15_000 }).toBe('All changes saved');
    let saved = await sheetOf(client, team.id, sheetId);
    expect(saved.document.pieces).toHaveLength(3);
    const first = saved.document.pieces.find((p: Piece) => Math.abs(p.x - 40) < 2)!;
    expect(first.y).toBeCloseTo(40, 0);
    await screenshot(page, 'editor-three-pieces');

    // Select the circle and type a width of 3 in: its cut line comes within 0.1 mm of the square's.
    const firstAt = await screenOf(page, { x: first.x, y: first.y });
    await page.mouse.click(firstAt.x, firstAt.y);
    await page.getByRole('radio', { name: 'Art' }).click();
    const width = page.getByLabel('Art width (in)');
    await width.fill('3');
    await width.press('Enter');
    await expect.poll(() => page.getByTestId('preflight').textContent(), { timeout: 15_000 }).toMatch(/apart; the cutter needs 0\.125 in/);
    await screenshot(page, 'editor-gap-warning');

    await page.mouse.click(5, 300); // leave the text field so shortcuts reach the editor
    await page.keyboard.press('Control+z');
    await expect.poll(() => page.getByTestId('preflight-ok').count(), { timeout: 15_000 }).toBe(1);
    await page.keyboard.press('Control+Shift+z');
    await expect.poll(() => page.getByTestId('preflight').count(), { timeout: 15_000 }).toBe(1);
    await expect.poll(() => page.getByTestId('save-state').textContent(), { timeout: 15_000 }).toBe('All changes saved');

    await page.reload();
    await expect.poll(() => page.getByTestId('area-used').textContent(), { timeout: 15_000 }).toMatch(/^3 pieces/);
    saved = await sheetOf(client, team.id, sheetId);
    expect(saved.document.pieces.find((p: Piece) => p.id === first.id).width).toBeCloseTo(76.2, 6);
    await expect.poll(() => page.getByTestId('preflight').count(), { timeout: 15_000 }).toBe(1);
    await screenshot(page, 'editor-after-reload');
    await page.close();
  });

  it('a teammate saves first: this editor gets the conflict choice and keeps its edit as a copy', async () => {
    const { team, users, client, art } = await teamWithArt();
    const { body: sheet } = await client.post(`/api/teams/${team.id}/sheets`, { name: 'Editor trial' });
    await placePieces(client, team.id, sheet, [testPiece('c1', art[0].id, 50, 50, { width: 40, border: 3 })]);
    const sheetId = String(sheet.id);
    const page = await t.browser.newPage({ viewport: { width: 1280, height: 900 } });
    await signIn(page, users.member.email);
    await page.goto(`${t.served.url}/t/${team.id}/sheets/${sheetId}`);
    await expect.poll(() => page.getByTestId('area-used').textContent(), { timeout: 15_000 }).toMatch(/^1 piece/);
    // A sheet written through the API has no area figure or thumbnail yet: the editor saves them
    // once its outlines arrive. Let that save land before the teammate opens the sheet.
    await expect.poll(async () => (await sheetOf(client, team.id, sheetId)).areaUsed, { timeout: 15_000 }).toBeGreaterThan(0);
    await expect.poll(() => page.getByTestId('save-state').textContent(), { timeout: 15_000 }).toBe('All changes saved');

    // The teammate (second browser context) saves first; this editor's next save meets the conflict.
    const other = await t.browser.newContext({ viewport: { width: 1280, height: 900 } });
    const page2 = await other.newPage();
    await signIn(page2, users.admin.email);
    await page2.goto(`${t.served.url}/t/${team.id}/sheets/${sheetId}`);
    await page2.getByLabel('Sheet name').fill('Editor trial (admin edit)');
    await expect.poll(() => page2.getByTestId('save-state').textContent(), { timeout: 15_000 }).toBe('All changes saved');

    await page.getByLabel('Sheet name').fill('Editor trial (member edit)');
    await page.getByRole('alertdialog').waitFor({ timeout: 15_000 });
    expect(await page.getByRole('alertdialog').textContent()).toMatch(/saved this sheet since you opened it/);
    await screenshot(page, 'editor-conflict');
    await page.getByRole('button', { name: 'Keep mine as a copy' }).click();
    await page.waitForURL((url) => !url.pathname.endsWith(`/${sheetId}`));
    await expect.poll(() => page.getByLabel('Sheet name').inputValue()).toBe('Editor trial (member edit) (my copy)');
    expect((await sheetOf(client, team.id, sheetId)).name).toBe('Editor trial (admin edit)');
    await other.close();
    await page.close();
  });

  it('"Add" puts a new piece at the first free spot, clear of the pieces already there, not on top of them in the centre', async () => {
    const { team, users, client, art } = await teamWithArt();
    const { body: sheet } = await client.post(`/api/teams/${team.id}/sheets`, { name: 'Add here' });
    // One piece in the middle and one in the top-left corner.
    await placePieces(client, team.id, sheet, [testPiece('mid', art[0].id, 85.7, 117.5), testPiece('corner', art[1].id, 30, 30)]);
    const page = await t.browser.newPage({ viewport: { width: 1280, height: 900 } });
    await signIn(page, users.member.email);
    await page.goto(`${t.served.url}/t/${team.id}/sheets/${sheet.id}`);
    await expect.poll(() => page.getByTestId('area-used').textContent(), { timeout: 20_000 }).toMatch(/^2 pieces · [1-9]/);
    await page.getByRole('button', { name: `Add ${art[2].name} to the sheet` }).click();
    await expect.poll(() => page.getByTestId('save-state').textContent(), { timeout: 15_000 }).toBe('All changes saved');
    const pieces = (await sheetOf(client, team.id, sheet.id)).document.pieces as Piece[];
    const added = pieces.find((p) => p.id !== 'mid' && p.id !== 'corner')!;
    // Beside the corner piece on the top row, not at the centre where "mid" is.
    expect(added.y).toBeLessThan(60);
    expect(added.x).toBeGreaterThan(55);
    await expect.poll(() => page.getByTestId('preflight-ok').count(), { timeout: 20_000 }).toBe(1);
    await page.close();
  });

  it('opens sheets read-only for a viewer', async () => {
    const { team, users, client, art } = await teamWithArt();
    const { body: sheet } = await client.post(`/api/teams/${team.id}/sheets`, { name: 'Look only' });
    await placePieces(client, team.id, sheet, [testPiece('v1', art[0].id, 50, 50, { width: 40, border: 3 })]);
    const page = await t.browser.newPage({ viewport: { width: 1280, height: 900 } });
    await signIn(page, users.viewer.email);
    await page.goto(`${t.served.url}/t/${team.id}/sheets/${sheet.id}`);
    await expect.poll(() => page.getByTestId('save-state').textContent()).toBe('Read only: your role can view sheets');
    expect(await page.getByRole('button', { name: 'Undo' }).count()).toBe(0);
    // Nothing invites a viewer to do what the role cannot.
    expect(await page.getByText('Select a piece to see its size.').count()).toBe(1);
    expect(await page.getByText(/Drag art/).count()).toBe(0);
    const at = await screenOf(page, { x: 50, y: 50 });
    await page.mouse.move(at.x, at.y);
    await page.mouse.down();
    await page.mouse.move(at.x + 80, at.y + 40, { steps: 5 });
    await page.mouse.up();
    await page.keyboard.press('Delete');
    expect((await sheetOf(client, team.id, sheet.id)).document.pieces[0]).toMatchObject({ x: 50, y: 50 });
    await page.close();
  });

  it('benchmark: drag frame times with 150 pieces on the sheet', async () => {
    const { team, users, client, art } = await teamWithArt();
    const { body: sheet } = await client.post(`/api/teams/${team.id}/sheets`, { name: 'Crowded' });
    const pieces: Piece[] = [];
    for (let i = 0; i < 150; i++) {
      pieces.push(
        testPiece(`b${i}`, art[i % 3].id, 8 + (i % 13) * 12.5, 8 + Math.floor(i / 13) * 19, {
          rotation: (i * 15) % 360,
          width: 9,
          border: 1.5,
        }),
      );
    }
    await placePieces(client, team.id, sheet, pieces);
    const page = await t.browser.newPage({ viewport: { width: 1280, height: 900 } });
    await signIn(page, users.member.email);
    await page.goto(`${t.served.url}/t/${team.id}/sheets/${sheet.id}`);
    await expect.poll(() => page.getByTestId('area-used').textContent(), { timeout: 20_000 }).toMatch(/^150 pieces · [1-9]/);
    await page.waitForTimeout(1500);
    const from = await screenOf(page, { x: pieces[70].x, y: pieces[70].y });
    await page.evaluate(() => {
      const w = window as unknown as { frames: number[]; sampling: boolean };
      w.frames = [];
      w.sampling = true;
      let last = performance.now();
      const tick = (now: number) => {
        w.frames.push(now - last);
        last = now;
        if (w.sampling) requestAnimationFrame(tick);
      };
      requestAnimationFrame(tick);
    });
    await page.mouse.move(from.x, from.y);
    await page.mouse.down();
    for (let i = 1; i <= 120; i++) {
      await page.mouse.move(from.x + i * 1.5, from.y + Math.sin(i / 10) * 30);
    }
    await page.mouse.up();
    const frames: number[] = await page.evaluate(() => {
      const w = window as unknown as { frames: number[]; sampling: boolean };
      w.sampling = false;
      return w.frames.slice(1);
    });
    const sorted = [...frames].sort((a, b) => a - b);
    const median = sorted[Math.floor(sorted.length / 2)];
    const p95 = sorted[Math.floor(sorted.length * 0.95)];
    const report = { pieces: 150, frames: frames.length, medianMs: Number(median.toFixed(1)), p95Ms: Number(p95.toFixed(1)) };
    console.log(`editor drag benchmark: ${JSON.stringify(report)}`);
    mkdirSync('tests/output', { recursive: true });
    writeFileSync(path.join('tests/output', 'bench-editor-drag.json'), JSON.stringify(report, null, 2));
    expect(frames.length).toBeGreaterThan(20);
    await screenshot(page, 'editor-150-pieces');
    await page.close();
  });
});
