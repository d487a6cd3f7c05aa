import { describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import type { Piece } from '@shared/sheet/document';
import { BROWSER_TEST_TIMEOUT, screenshot, signInThroughForm, useBrowserApp } from '../helpers/browser';
import { placePieces, testPiece } from '../helpers/sheets';
import { sheetOf, teamWithShapes } from '../helpers/editor';

const t = useBrowserApp();

const signIn = (page: Page, email: string) => signInThroughForm(page, t.served.url, email);

const teamWithArt = () => teamWithShapes(t.db, t.served.url);

describe('auto-arrange in the editor, in Chromium', { timeout: BROWSER_TEST_TIMEOUT }, () => {
  it('auto-arrange can be stopped: the best layout so far is previewed at once, long before the time is up', async () => {
    const { team, users, client, art } = await teamWithArt();
    const { body: sheet } = await client.post(`/api/teams/${team.id}/sheets`, { name: 'Stop early' });
    await placePieces(
      client,
      team.id,
      sheet,
      Array.from({ length: 12 }, (_, i) => testPiece(`s${i}`, art[i % 3].id, 80 + i, 110 + i)),
    );
    const page = await t.browser.newPage({ viewport: { width: 1280, height: 900 } });
    await signIn(page, users.member.email);
    await page.goto(`${t.served.url}/t/${team.id}/sheets/${sheet.id}`);
    await expect.poll(() => page.getByTestId('area-used').textContent(), { timeout: 20_000 }).toMatch(/^12 pieces · [1-9]/);
    await page.getByRole('button', { name: 'Auto-arrange…' }).click();
    const dialog = page.getByRole('dialog', { name: 'Auto-arrange' });
    expect(await dialog.textContent()).toContain('may turn art upside down (180°)');
    await dialog.getByLabel('Try for').selectOption('10');
    await dialog.getByRole('button', { name: 'Arrange' }).click();
    await expect
      .poll(() => page.getByTestId('arrange-progress').textContent(), { timeout: 10_000 })
      .toMatch(/tried; the best places 12 on 1 sheet/);
    const stoppedAt = Date.now();
    await dialog.getByRole('button', { name: 'Stop and keep the best so far' }).click();
    await expect.poll(() => page.getByTestId('arrange-summary').textContent(), { timeout: 3_000 }).toMatch(/^Preview: 12 of 12 placed/);
    expect(Date.now() - stoppedAt).toBeLessThan(3_000);
    await screenshot(page, 'editor-arrange-stopped');
    await page.close();
  });

  it('auto-arrange runs on the shop’s server too: its best so far shows while it runs, and Stop ends it with that best', async () => {
    const { team, users, client, art } = await teamWithArt();
    const { body: sheet } = await client.post(`/api/teams/${team.id}/sheets`, { name: 'On the server' });
    await placePieces(
      client,
      team.id,
      sheet,
      Array.from({ length: 10 }, (_, i) => testPiece(`v${i}`, art[i % 3].id, 80 + i, 110 + i)),
    );
    const page = await t.browser.newPage({ viewport: { width: 1280, height: 800 } });
    await signIn(page, users.member.email);
    await page.goto(`${t.served.url}/t/${team.id}/sheets/${sheet.id}`);
    await expect.poll(() => page.getByTestId('area-used').textContent(), { timeout: 20_000 }).toMatch(/^10 pieces · [1-9]/);
    await page.getByRole('button', { name: 'Auto-arrange…' }).click();
    const dialog = page.getByRole('dialog', { name: 'Auto-arrange' });
    await dialog.getByLabel('Run on').selectOption('server');
    await dialog.getByLabel('Try for').selectOption('120');
    await dialog.getByRole('button', { name: 'Arrange' }).click();
    await expect
      .poll(() => page.getByTestId('arrange-progress').textContent(), { timeout: 30_000 })
      .toMatch(/^Arranging on the shop’s server… the best places 10 on 1 sheet/);
    await screenshot(page, 'editor-arrange-on-server');
    const stoppedAt = Date.now();
    await dialog.getByRole('button', { name: 'Stop and keep the best so far' }).click();
    await expect.poll(() => page.getByTestId('arrange-summary').textContent(), { timeout: 15_000 }).toMatch(/^Preview: 10 of 10 placed/);
    expect(Date.now() - stoppedAt).toBeLessThan(15_000);
    await page.close();
  });

  it('auto-arranges the sheet in a Web Worker: preview, keep, and undo in one step', async () => {
    const { team, users, client, art } = await teamWithArt();
    const { body: sheet } = await client.post(`/api/teams/${team.id}/sheets`, { name: 'Pile' });
    // Nine pieces piled in the middle, all overlapping.
    const pile = Array.from({ length: 9 }, (_, i) => testPiece(`pile${i}`, art[i % 3].id, 80 + i, 110 + i));
    await placePieces(client, team.id, sheet, pile);
    const page = await t.browser.newPage({ viewport: { width: 1280, height: 900 } });
    await signIn(page, users.member.email);
    await page.goto(`${t.served.url}/t/${team.id}/sheets/${sheet.id}`);
    await expect.poll(() => page.getByTestId('area-used').textContent(), { timeout: 20_000 }).toMatch(/^9 pieces · [1-9]/);
    await expect.poll(() => page.getByTestId('preflight').textContent(), { timeout: 15_000 }).toMatch(/overlap|apart/);
    await page.getByRole('button', { name: 'Auto-arrange…' }).click();
    await page.getByRole('dialog', { name: 'Auto-arrange' }).getByRole('button', { name: 'Arrange' }).click();
    await expect.poll(() => page.getByTestId('arrange-summary').textContent(), { timeout: 20_000 }).toMatch(/^Preview: 9 of 9 placed/);
    await page.waitForTimeout(600);
    await screenshot(page, 'editor-arrange-preview');
    await page.getByRole('button', { name: 'Keep this layout' }).click();
    await expect.poll(() => page.getByTestId('preflight-ok').count(), { timeout: 15_000 }).toBe(1);
    await expect.poll(() => page.getByTestId('save-state').textContent(), { timeout: 15_000 }).toBe('All changes saved');
    const arranged = (await sheetOf(client, team.id, sheet.id)).document.pieces as Piece[];
    // The kept layout is the arranged one, not the pile: every piece apart (the preflight above) and
    // all but at most one moved in both directions. One may keep its x or y by chance (this layout
    // puts one piece at x = 87 mm, where the pile had it, 9 mm higher up).
    const moved = arranged.filter((p) => {
      const before = pile.find((q) => q.id === p.id)!;
      return p.x !== before.x && p.y !== before.y;
    });
    expect(moved.length).toBeGreaterThanOrEqual(arranged.length - 1);
    await screenshot(page, 'editor-arranged');
    await page.mouse.click(5, 300);
    await page.keyboard.press('Control+z');
    await expect.poll(() => page.getByTestId('save-state').textContent(), { timeout: 15_000 }).toBe('All changes saved');
    const undone = (await sheetOf(client, team.id, sheet.id)).document.pieces as Piece[];
    expect(undone.map((p) => [p.x, p.y]).sort()).toEqual(pile.map((p) => [p.x, p.y]).sort());
    await page.close();
  });

  it('auto-arrange takes a quantity per art, refuses a bad one with the art named, and makes the further sheets a quantity needs', async () => {
    const { team, users, client, art } = await teamWithArt();
    const { body: sheet } = await client.post(`/api/teams/${team.id}/sheets`, { name: 'Ghost run' });
    await placePieces(client, team.id, sheet, [
      testPiece('q0', art[0].id, 40, 40),
      testPiece('q1', art[1].id, 100, 40),
      testPiece('q2', art[2].id, 40, 120),
    ]);
    const page = await t.browser.newPage({ viewport: { width: 1280, height: 900 } });
    await signIn(page, users.member.email);
    await page.goto(`${t.served.url}/t/${team.id}/sheets/${sheet.id}`);
    await expect.poll(() => page.getByTestId('area-used').textContent(), { timeout: 20_000 }).toMatch(/^3 pieces · [1-9]/);
    await page.getByRole('button', { name: 'Auto-arrange…' }).click();
    const dialog = page.getByRole('dialog', { name: 'Auto-arrange' });
    // Kiss-cut pieces: the sheet is sold whole, so the run starts upright.
    expect(await dialog.getByLabel('Turning').inputValue()).toBe('none');
    expect(await dialog.textContent()).toContain('Kiss-cut sheets are sold whole');
    const quantities = dialog.getByLabel(/^Quantity of /);
    await expect.poll(() => quantities.count()).toBe(3);
    const circle = dialog.getByLabel(`Quantity of ${art[0].name}`);
    await circle.fill('0');
    await dialog.getByLabel(`Quantity of ${art[1].name}`).fill('2.5');
    const alert = dialog.getByRole('alert');
    await expect.poll(() => alert.textContent()).toContain(`${art[0].name}: give a whole number of stickers from 1 to 500.`);
    expect(await alert.textContent()).toContain(`${art[1].name}: give a whole number`);
    expect(await dialog.getByRole('button', { name: 'Arrange' }).isDisabled()).toBe(true);
    await circle.fill('40');
    await dialog.getByLabel(`Quantity of ${art[1].name}`).fill('1');
    await dialog.getByRole('button', { name: 'Arrange' }).click();
    await expect
      .poll(() => page.getByTestId('arrange-summary').textContent(), { timeout: 20_000 })
      .toMatch(/The quantity needs \d+ sheets/);
    const summary = (await page.getByTestId('arrange-summary').textContent())!;
    const needed = Number(/needs (\d+) sheets/.exec(summary)![1]);
    const onThis = Number(/^Preview: (\d+) of 42 placed/.exec(summary)![1]);
    expect(needed).toBeGreaterThanOrEqual(2);
    await page.waitForTimeout(600);
    await screenshot(page, 'editor-arrange-quantities');
    await dialog.getByRole('button', { name: 'Keep this layout' }).click();
    await expect.poll(() => page.getByTestId('arrange-made').locator('a').count(), { timeout: 20_000 }).toBe(needed - 1);
    await screenshot(page, 'editor-arrange-made');
    // The panel still shows what was asked for, not the sheet as it is after keeping.
    expect(await quantities.count()).toBe(3);
    expect(await dialog.textContent()).not.toContain('Waiting for');
    await dialog.getByRole('button', { name: 'Done' }).click();
    await expect.poll(() => page.getByTestId('save-state').textContent(), { timeout: 15_000 }).toBe('All changes saved');
    // Every sticker asked for is on exactly one sheet: this one and the ones made.
    const { body: list } = await client.get(`/api/teams/${team.id}/sheets`);
    const further = (list.sheets as Array<{ id: string; name: string }>).filter((s) => s.name.startsWith('Ghost run · sheet '));
    expect(further.map((s) => s.name).sort()).toEqual(
      Array.from({ length: needed - 1 }, (_, i) => `Ghost run · sheet ${i + 2} of ${needed}`).sort(),
    );
    const docs = [await sheetOf(client, team.id, sheet.id), ...(await Promise.all(further.map((s) => sheetOf(client, team.id, s.id))))].map(
      (d) => d.document.pieces as Piece[],
    );
    expect(docs[0]).toHaveLength(onThis);
    const byArt = (id: string) => docs.flat().filter((p) => p.artId === id).length;
    expect([byArt(art[0].id), byArt(art[1].id), byArt(art[2].id)]).toEqual([40, 1, 1]);
    await page.close();
  });
});
