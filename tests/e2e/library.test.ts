import { mkdtemp, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { zipSync } from 'fflate';
import sharp from 'sharp';
import { describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { svgArt } from '../helpers/art';
import { Client, makeTeamWithRoles } from '../helpers/app';
import { uploadFile } from '../helpers/library';
import { BROWSER_TEST_TIMEOUT, screenshot, signInThroughForm, useBrowserApp } from '../helpers/browser';

const t = useBrowserApp();

async function critterPack(): Promise<string> {
  const files: Record<string, Uint8Array> = {};
  const colours = ['#c0392b', '#8e44ad', '#2980b9', '#16a085', '#d35400', '#7f8c8d'];
  for (let i = 0; i < 11; i++) {
    const c = colours[i % colours.length];
    files[`Critter_Pack/${i < 6 ? 'Hedgehogs' : 'Foxes'}/critter-${String(i + 1).padStart(2, '0')}.png`] = await svgArt(
      600,
      500,
      `<defs><filter id="f"><feGaussianBlur stdDeviation="6"/></filter></defs><g filter="url(#f)"><ellipse cx="300" cy="280" rx="${170 + i * 6}" ry="150" fill="${c}"/><circle cx="${420 - i * 5}" cy="170" r="70" fill="${c}" opacity="0.8"/></g><circle cx="260" cy="260" r="30" fill="none" stroke="#fff" stroke-width="10"/>`,
    );
  }
  // One flat JPEG on white: the library offers background removal for it.
  files['Critter_Pack/critter-12.jpg'] = await sharp(
    Buffer.from(
      '<svg xmlns="http://www.w3.org/2000/svg" width="600" height="500"><rect width="600" height="500" fill="#fff"/><path d="M120 400 Q300 40 480 400 Z" fill="#6d4c41"/></svg>',
    ),
  )
    .jpeg({ quality: 92 })
    .toBuffer();
  const dir = await mkdtemp(path.join(tmpdir(), 'sheetsmith-e2e-'));
  const file = path.join(dir, 'critter-pack.zip');
  await writeFile(file, zipSync(files));
  return file;
}

const signIn = (page: Page, email: string) => signInThroughForm(page, t.served.url, email);

describe('art library in Chromium', { timeout: BROWSER_TEST_TIMEOUT }, () => {
  it('uploads a zip of twelve images with progress, tags the batch, and finds them by search', async () => {
    const { team, users } = await makeTeamWithRoles(t.db);
    const zip = await critterPack();
    const page = await t.browser.newPage({ viewport: { width: 1280, height: 900 } });
    await signIn(page, users.member.email);
    await page.goto(`${t.served.url}/t/${team.id}/library`);
    await page.getByRole('button', { name: 'Add art' }).click();
    await page.getByLabel('Keywords for this batch').fill('woodland, autumn fair');
    // Record every value the overall progress bar shows while the upload runs.
    await page.evaluate(() => {
      (window as unknown as { seen: string[] }).seen = [];
      new MutationObserver(() => {
        const el = document.querySelector('[data-testid="overall-progress"]');
        if (el) (window as unknown as { seen: string[] }).seen.push(el.textContent ?? '');
      }).observe(document.body, { subtree: true, childList: true, characterData: true });
    });
    await page.locator('[data-testid="upload-input"]').setInputFiles(zip);
    await expect.poll(() => page.getByTestId('upload-summary').textContent(), { timeout: 30_000 }).toContain('12 added');
    expect(await page.getByTestId('overall-progress').textContent()).toBe('100%');
    expect(await page.getByRole('progressbar', { name: 'Upload of critter-pack.zip' }).getAttribute('value')).toBe('1');
    expect((await page.evaluate(() => (window as unknown as { seen: string[] }).seen)).length).toBeGreaterThan(0);
    await screenshot(page, 'library-upload-done');

    await page.getByRole('searchbox').fill('woodland');
    await expect.poll(() => page.getByTestId('result-count').textContent()).toBe('12 pieces of art');
    await page.getByRole('searchbox').fill('hedgehog');
    await expect.poll(() => page.getByTestId('result-count').textContent()).toBe('6 pieces of art');
    await page.getByRole('searchbox').fill('Autumn-Fairs');
    await expect.poll(() => page.getByTestId('result-count').textContent()).toBe('12 pieces of art');
    // A typo is forgiven, and the page says which word it took it for; a click searches for that.
    await page.getByRole('searchbox').fill('hedgehgo');
    await expect.poll(() => page.getByTestId('result-count').textContent()).toBe('6 pieces of art');
    expect(await page.getByTestId('did-you-mean').textContent()).toBe('Including near spellings, such as hedgehog.');
    await screenshot(page, 'library-typo-search');
    await page.getByTestId('did-you-mean').getByRole('button', { name: 'hedgehog' }).click();
    await expect.poll(() => page.getByRole('searchbox').inputValue()).toBe('hedgehog');
    await expect.poll(() => page.getByTestId('did-you-mean').count()).toBe(0);
    await page.getByRole('searchbox').fill('Autumn-Fairs');
    await expect.poll(() => page.getByTestId('result-count').textContent()).toBe('12 pieces of art');
    await screenshot(page, 'library-grid-search');

    await page.getByRole('button', { name: 'Table' }).click();
    await page.getByTestId('art-table').waitFor();
    await page.getByRole('button', { name: /^Name/ }).click();
    await expect.poll(() => page.locator('[data-testid="art-table"] tbody tr td:nth-child(3)').first().textContent()).toBe('critter-01');
    await screenshot(page, 'library-table');

    await page.getByRole('link', { name: 'critter-12' }).click();
    await page.getByRole('heading', { name: 'Background' }).waitFor();
    await page.getByTestId('after-preview').waitFor({ timeout: 30_000 });
    await expect
      .poll(() => page.getByTestId('after-preview').evaluate((img: HTMLImageElement) => img.complete && img.naturalWidth > 0))
      .toBe(true);
    await screenshot(page, 'library-art-detail');
    await page.close();
  });

  it('uploads an SVG, draws it at its own size, and offers the cleaned original for download', async () => {
    const { team, users } = await makeTeamWithRoles(t.db);
    const dir = await mkdtemp(path.join(tmpdir(), 'sheetsmith-e2e-'));
    const file = path.join(dir, 'lantern-badge.svg');
    await writeFile(
      file,
      '<svg xmlns="http://www.w3.org/2000/svg" width="2in" height="1.5in" viewBox="0 0 200 150" onload="alert(1)"><script>alert(2)</script><rect x="10" y="10" width="180" height="130" rx="40" fill="#e9c46a"/><circle cx="100" cy="75" r="40" fill="#2a9d8f"/></svg>',
    );
    const page = await t.browser.newPage({ viewport: { width: 1280, height: 900 } });
    await signIn(page, users.member.email);
    await page.goto(`${t.served.url}/t/${team.id}/library`);
    await page.getByRole('button', { name: 'Add art' }).click();
    await page.locator('[data-testid="upload-input"]').setInputFiles(file);
    await expect.poll(() => page.getByTestId('upload-summary').textContent(), { timeout: 30_000 }).toContain('1 added');
    await page.getByRole('link', { name: 'lantern-badge' }).click();
    await page.getByTestId('vector-source').waitFor();
    expect(await page.getByTestId('vector-source').textContent()).toBe('Drawn at 300 DPI from an SVG · download the SVG');
    // 2 × 1.5 in at 300 DPI.
    expect(await page.getByText('600 × 450 (PNG)').count()).toBe(1);
    await screenshot(page, 'library-svg-art');
    await page.close();
  });

  it('lets an admin add a collection, keeps a refused name as typed, and renames it', async () => {
    const { team, users } = await makeTeamWithRoles(t.db);
    const page = await t.browser.newPage({ viewport: { width: 1280, height: 800 } });
    await signIn(page, users.admin.email);
    await page.goto(`${t.served.url}/t/${team.id}/library`);
    const name = page.getByLabel('New collection name');
    await name.fill('Harbour lights');
    await name.press('Enter');
    await expect.poll(() => page.getByRole('button', { name: /^Harbour lights/ }).count(), { timeout: 15_000 }).toBe(1);
    expect(await name.inputValue()).toBe(''); // emptied once added
    await name.fill('   ');
    await name.press('Enter');
    await expect.poll(() => page.getByRole('alert').count(), { timeout: 15_000 }).toBeGreaterThan(0);
    expect(await name.inputValue()).toBe('   ');
    await page.getByRole('button', { name: 'Settings of Harbour lights' }).click();
    await page.getByLabel('Collection name', { exact: true }).fill('Harbour lights at dusk');
    await page.getByRole('button', { name: 'Rename' }).click();
    await expect.poll(() => page.getByRole('button', { name: /^Harbour lights at dusk/ }).count(), { timeout: 15_000 }).toBe(1);
    // Its licence: a limited licence without a unit count is refused beside the field; with one it saves.
    await page.getByLabel('Licence kind').selectOption({ label: 'Commercial, limited units' });
    await page.getByRole('button', { name: 'Save licence' }).click();
    await expect.poll(() => page.getByRole('alert').filter({ hasText: /unit/i }).count(), { timeout: 15_000 }).toBe(1);
    await page.getByLabel('Units allowed').fill('200');
    await page.getByRole('button', { name: 'Save licence' }).click();
    await expect.poll(() => page.getByText('Licence saved.').count(), { timeout: 15_000 }).toBe(1);
    await page.close();
  });

  it('shows a viewer the library without upload or bulk actions', async () => {
    const { team, users } = await makeTeamWithRoles(t.db);
    const page = await t.browser.newPage({ viewport: { width: 1280, height: 800 } });
    await signIn(page, users.viewer.email);
    await page.goto(`${t.served.url}/t/${team.id}/library`);
    await page.getByRole('heading', { name: 'Art library' }).waitFor();
    expect(await page.getByRole('button', { name: 'Add art' }).count()).toBe(0);
    expect(await page.getByLabel('New collection name').count()).toBe(0);
    await page.close();
  });

  it('offers a member "Remove from the library" on their own art only (the server refuses the rest)', async () => {
    const { team, users } = await makeTeamWithRoles(t.db);
    const [admin, member] = [new Client(t.served.url), new Client(t.served.url)];
    await admin.signIn(users.admin.email);
    await member.signIn(users.member.email);
    const theirs = (
      await uploadFile(admin, team.id, await svgArt(300, 300, '<circle cx="150" cy="150" r="120" fill="#7b2d26"/>'), 'acorn.png')
    ).body.results[0].item;
    const own = (
      await uploadFile(member, team.id, await svgArt(300, 300, '<circle cx="150" cy="150" r="110" fill="#3d5a80"/>'), 'plum.png')
    ).body.results[0].item;
    const page = await t.browser.newPage({ viewport: { width: 1280, height: 800 } });
    await signIn(page, users.member.email);
    await page.goto(`${t.served.url}/t/${team.id}/library/${theirs.id}`);
    await page.getByRole('heading', { name: 'acorn' }).waitFor();
    await page.getByRole('button', { name: 'Save details' }).waitFor();
    expect(await page.getByRole('button', { name: 'Remove from the library' }).count()).toBe(0);
    await page.goto(`${t.served.url}/t/${team.id}/library/${own.id}`);
    await page.getByRole('heading', { name: 'plum' }).waitFor();
    await page.getByRole('button', { name: 'Remove from the library' }).waitFor();
    await page.close();
  });

  it('the art page keeps collection and licence through a keyword edit (even before the collection list loads) and when the art joins a second collection', async () => {
    const { team, users } = await makeTeamWithRoles(t.db);
    const admin = new Client(t.served.url);
    await admin.signIn(users.admin.email);
    const pack = (
      await admin.post(`/api/teams/${team.id}/collections`, {
        name: 'Harvest Moon Pack',
        licence: { kind: 'commercial_limited', source: 'Hollyhock Bundles', unitLimit: 200 },
      })
    ).body;
    const market = (await admin.post(`/api/teams/${team.id}/collections`, { name: 'Autumn Market' })).body;
    const art = (
      await uploadFile(admin, team.id, await svgArt(500, 500, '<circle cx="250" cy="250" r="230" fill="#d35400"/>'), 'gourd.png', {
        collectionId: pack.id,
      })
    ).body.results[0].item;
    const page = await t.browser.newPage({ viewport: { width: 1280, height: 900 } });
    await signIn(page, users.admin.email);
    // The collection list arrives late, as on a slow connection.
    let release: () => void = () => undefined;
    const held = new Promise<void>((resolve) => (release = resolve));
    await page.route(`**/api/teams/${team.id}/collections`, async (route) => {
      await held;
      await route.continue();
    });
    await page.goto(`${t.served.url}/t/${team.id}/library/${art.id}`);
    await expect.poll(() => page.getByTestId('collections-loading').count(), { timeout: 15_000 }).toBe(1);
    await page.getByLabel('Keywords (comma between)').fill('gourd, harvest');
    await page.getByRole('button', { name: 'Save details' }).click();
    await expect.poll(() => page.getByRole('status').filter({ hasText: 'Saved.' }).count(), { timeout: 15_000 }).toBe(1);
    let stored = (await admin.get(`/api/teams/${team.id}/art/${art.id}`)).body;
    expect(stored.keywords).toEqual(['gourd', 'harvest']);
    expect(stored.collections.map((c: { name: string }) => c.name)).toEqual(['Harvest Moon Pack']);
    expect(stored.licence).toMatchObject({ kind: 'commercial_limited', inheritedFrom: { name: 'Harvest Moon Pack' } });

    release();
    const second = page.getByRole('checkbox', { name: 'Autumn Market' });
    await expect.poll(() => second.count(), { timeout: 15_000 }).toBe(1);
    expect(await page.getByRole('checkbox', { name: 'Harvest Moon Pack' }).isChecked()).toBe(true);
    await second.check();
    await page.getByRole('button', { name: 'Save details' }).click();
    await expect
      .poll(async () => (await admin.get(`/api/teams/${team.id}/art/${art.id}`)).body.collections.length, { timeout: 15_000 })
      .toBe(2);
    stored = (await admin.get(`/api/teams/${team.id}/art/${art.id}`)).body;
    expect(stored.collections.map((c: { id: string }) => c.id)).toEqual([pack.id, market.id]);
    expect(stored.licence).toMatchObject({ kind: 'commercial_limited', unitLimit: 200, inheritedFrom: { name: 'Harvest Moon Pack' } });
    await expect.poll(() => page.getByText('Commercial, limited units', { exact: false }).count()).toBeGreaterThan(0);
    await screenshot(page, 'art-two-collections');
    await page.close();
  });

  it('the art page tints what background removal takes, warns when it eats the light tip, and starts each mode at its own tolerance', async () => {
    const { team, users } = await makeTeamWithRoles(t.db);
    const member = new Client(t.served.url);
    await member.signIn(users.member.email);
    // A candy-corn-like piece with no transparency: a cream tip (about 37 from white) on white, 300 DPI at the preview's 3 in.
    const corn = await sharp(
      Buffer.from(
        `<svg xmlns="http://www.w3.org/2000/svg" width="1500" height="1500" viewBox="0 0 600 600"><rect width="600" height="600" fill="#fff"/><clipPath id="c"><polygon points="300,40 480,560 120,560"/></clipPath><g clip-path="url(#c)"><rect width="600" height="200" fill="#fcf4dc"/><rect y="200" width="600" height="180" fill="#f28c28"/><rect y="380" width="600" height="220" fill="#f7c531"/></g></svg>`,
      ),
    )
      .flatten({ background: '#ffffff' })
      .png()
      .toBuffer();
    const art = (await uploadFile(member, team.id, corn, 'candy-corn.png')).body.results[0].item;
    const page = await t.browser.newPage({ viewport: { width: 1280, height: 800 } });
    await signInThroughForm(page, t.served.url, users.member.email);
    await page.goto(`${t.served.url}/t/${team.id}/library/${art.id}`);
    await page.getByRole('heading', { name: 'Background' }).waitFor();
    const removal = page.getByTestId('removal-preview');
    await expect
      .poll(() => removal.evaluate((img: HTMLImageElement) => img.complete && img.naturalWidth > 0), { timeout: 30_000 })
      .toBe(true);
    await page.getByTestId('after-preview').waitFor({ timeout: 30_000 });
    expect(await page.getByTestId('tolerance-value').textContent()).toBe('32');
    expect(await page.getByTestId('outline-cautions').count()).toBe(0);
    // Ten steps up by keyboard: 42, the tolerance that was measured to eat the tip.
    await page.getByRole('slider').focus();
    for (let i = 0; i < 10; i++) await page.keyboard.press('ArrowRight');
    expect(await page.getByTestId('tolerance-value').textContent()).toBe('42');
    await expect
      .poll(() => page.getByTestId('outline-cautions').textContent(), { timeout: 30_000 })
      .toMatch(/Background removal at tolerance 42 also took away \d+(\.\d)? % of the art/);
    await expect.poll(() => removal.getAttribute('src')).toContain('backgroundTolerance=42');
    await expect
      .poll(() => removal.evaluate((img: HTMLImageElement) => img.complete && img.naturalWidth > 0), { timeout: 30_000 })
      .toBe(true);
    await screenshot(page, 'background-removal-eats-tip');
    // Another mode starts from its own default, not from 42.
    await page.getByLabel('Remove a colour').check();
    expect(await page.getByTestId('tolerance-value').textContent()).toBe('24');
    await page.getByLabel('Automatic').check();
    expect(await page.getByTestId('tolerance-value').textContent()).toBe('32');
    await expect.poll(() => page.getByTestId('outline-cautions').count(), { timeout: 30_000 }).toBe(0);
    await page.close();
  });
});
