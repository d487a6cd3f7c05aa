// Stickers made from words or a shape (issue 18): drawn by the server from fonts shipped with the
// app, stored as vector art and outlined like any art. The cut line is checked against the
// rendered glyph raster (the PNG the library stores), by brute force, not the engine's geometry.
import sharp from 'sharp';
import { describe, expect, it } from 'vitest';
import { outline } from '../../server/engine/outline/outline';
import { Client, binary, makeTeamWithRoles, useTestApp } from '../helpers/app';

const t = useTestApp({ pool: true });
const PX_PER_MM = 300 / 25.4;

async function member() {
  const { team, users } = await makeTeamWithRoles(t.db);
  const client = new Client(t.sheetsmith.app);
  await client.signIn(users.member.email);
  const viewer = new Client(t.sheetsmith.app);
  await viewer.signIn(users.viewer.email);
  return { team, client, viewer, base: `/api/teams/${team.id}/art/made` };
}
const png = async (client: Client, url: string) => (await client.agent.get(url).buffer(true).parse(binary)).body as Buffer;

describe('stickers made from words and shapes', () => {
  it('a text sticker’s cut line clears every glyph by the border, ± 1 px at 300 DPI (glyph raster, brute force)', async () => {
    const { client, base } = await member();
    const made = await client.post(base, { name: 'Ada name label', kind: 'text', text: 'Ada\nLovelace', font: 'rounded', letterMm: 12 });
    expect(made.status).toBe(201);
    const item = made.body.results[0].item;
    expect(item).toMatchObject({ name: 'Ada name label', format: 'png', hasTransparency: true, source: { format: 'svg' } });
    const art = await png(client, item.fileUrl);
    const { data, info } = await sharp(art).ensureAlpha().raw().toBuffer({ resolveWithObject: true });
    const W = info.width,
      H = info.height;
    const solid = (x: number, y: number) => x >= 0 && y >= 0 && x < W && y < H && data[(y * W + x) * 4 + 3] >= 48;
    // Edge pixels of the glyphs: the nearest glyph pixel to a point outside is always one of them.
    const edge: Array<[number, number]> = [];
    let minX = W,
      minY = H,
      maxX = 0,
      maxY = 0;
    for (let y = 0; y < H; y++)
      for (let x = 0; x < W; x++)
        if (solid(x, y)) {
          [minX, minY, maxX, maxY] = [Math.min(minX, x), Math.min(minY, y), Math.max(maxX, x), Math.max(maxY, y)];
          if (!solid(x - 1, y) || !solid(x + 1, y) || !solid(x, y - 1) || !solid(x, y + 1)) edge.push([x, y]);
        }
    const artW = maxX - minX + 1,
      artH = maxY - minY + 1;
    const borderMm = 3.175;
    const { pieces } = await outline(art, { width: artW / PX_PER_MM, border: borderMm });
    expect(pieces).toHaveLength(1); // the border joins the letters and the lines into one sticker
    const piece = pieces[0];
    const ox = Math.round((piece.pixelWidth - artW) / 2),
      oy = Math.round((piece.pixelHeight - artH) / 2);
    const borderPx = borderMm * PX_PER_MM;
    let worst = 0;
    for (const q of piece.cutLine.points) {
      const px = q.x * PX_PER_MM - ox + minX,
        py = q.y * PX_PER_MM - oy + minY;
      let best = Infinity;
      for (const [x, y] of edge) best = Math.min(best, Math.hypot(Math.max(x - px, 0, px - x - 1), Math.max(y - py, 0, py - y - 1)));
      worst = Math.max(worst, Math.abs(best - borderPx));
    }
    expect(piece.cutLine.points.length).toBeGreaterThan(50);
    expect(worst).toBeLessThanOrEqual(1);
  });

  it('a shape with words inside is the shape’s size, its fill behind the words, the words kept inside', async () => {
    const { client, base } = await member();
    const made = await client.post(base, {
      name: 'Planner box',
      kind: 'shape',
      shape: 'label',
      shapeWidthMm: 60,
      shapeHeightMm: 20,
      fill: '#e9c46a',
      text: 'MONDAY TO-DO LIST, EVERY WEEK',
      letterMm: 14, // too wide for the label: shrunk to fit inside
      textColour: '#264653',
      font: 'chunky',
    });
    expect(made.status).toBe(201);
    const item = made.body.results[0].item;
    expect(Math.abs(item.widthPx - 60 * PX_PER_MM)).toBeLessThanOrEqual(1);
    expect(Math.abs(item.heightPx - 20 * PX_PER_MM)).toBeLessThanOrEqual(1);
    const { data, info } = await sharp(await png(client, item.fileUrl))
      .ensureAlpha()
      .raw()
      .toBuffer({ resolveWithObject: true });
    const at = (x: number, y: number) => [...data.subarray((y * info.width + x) * 4, (y * info.width + x) * 4 + 3)];
    const colours = new Set<string>();
    for (let x = 0; x < info.width; x += 3) colours.add(at(x, Math.round(info.height / 2)).join(','));
    expect(colours).toContain('233,196,106'); // the fill
    expect(colours).toContain('38,70,83'); // the words
    // The words stay inside the label's straight part: its round ends (a half-height each) hold fill only.
    for (let y = 0; y < info.height; y += 2) for (let x = 0; x < info.height / 2 - 2; x++) expect(at(x, y).join(',')).not.toBe('38,70,83');
  });

  it('refuses empty words and art over 300 mm in a maker’s words, storing nothing; viewers may not make stickers', async () => {
    const { client, viewer, base } = await member();
    const empty = await client.post(base, { name: 'Blank', kind: 'text', text: '   ' });
    expect(empty.status).toBe(400);
    expect(Object.values(empty.body.error.fields)).toContain('Type the words for the sticker');
    const huge = await client.post(base, { name: 'Banner', kind: 'text', text: 'A very long banner of words', letterMm: 150 });
    expect(huge.status).toBe(400);
    expect(huge.body.error.message).toMatch(/^The words make art \d+ × \d+ mm, over 300 mm a side\. Use a smaller letter size/);
    const colour = await client.post(base, { name: 'Odd', kind: 'shape', fill: 'yellow' });
    expect(Object.values(colour.body.error.fields)).toContain('Fill: give a colour like #2a9d8f');
    expect((await client.get(`/api/teams/${base.split('/')[3]}/art`)).body.total).toBe(0);
    expect((await viewer.post(base, { name: 'Nope', kind: 'shape' })).status).toBe(403);
    const preview = await client.post(`${base}/preview`, { name: 'Circle', kind: 'shape', shape: 'circle', shapeWidthMm: 30 });
    expect(preview.body.svg).toMatch(/^<svg xmlns="http:\/\/www.w3.org\/2000\/svg" width="30mm" height="30mm"/);
  });
});
