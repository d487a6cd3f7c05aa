import sharp from 'sharp';
import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { ArtItem } from '../../server/modules/art/art-item.entity';
import { OutlineCacheEntry } from '../../server/modules/outlines/outline-cache.entity';
import { svgArt } from '../helpers/art';
import { Client, binary, makeTeamWithRoles, useTestApp } from '../helpers/app';
import { pngPhys, pngSize } from '../helpers/png';
import { uploadFile } from '../helpers/library';

const upload = (client: Client, teamId: string, file: Buffer, name = 'fox.png') => uploadFile(client, teamId, file, name);

const t = useTestApp({ pool: true });

describe('art upload', () => {
  it('stores an image once per team, sniffing the type from the bytes', async () => {
    const { team, users } = await makeTeamWithRoles(t.db);
    const member = new Client(t.sheetsmith.app);
    await member.signIn(users.member.email);
    const art = await svgArt(400, 300, '<ellipse cx="200" cy="150" rx="150" ry="100" fill="#ca6f1e"/>');
    const first = await upload(member, team.id, art, 'Autumn Fox.png');
    expect(first.status).toBe(201);
    expect(first.body.results[0]).toMatchObject({
      status: 'stored',
      item: { name: 'Autumn Fox', format: 'png', widthPx: 400, heightPx: 300, hasTransparency: true },
    });
    const again = await upload(member, team.id, art, 'copy.jpg');
    expect(again.status).toBe(200);
    expect(again.body.results[0]).toMatchObject({ status: 'duplicate', item: { id: first.body.results[0].item.id } });
    expect(await t.db.getRepository(ArtItem).countBy({ teamId: team.id })).toBe(1);
  });

  it('refuses a viewer (403), a non-image named .png (415) and an SVG with nothing drawn (422), storing nothing', async () => {
    const { team, users } = await makeTeamWithRoles(t.db);
    const viewer = new Client(t.sheetsmith.app);
    await viewer.signIn(users.viewer.email);
    expect((await upload(viewer, team.id, await svgArt(50, 50, '<circle cx="25" cy="25" r="20"/>'))).status).toBe(403);
    const member = new Client(t.sheetsmith.app);
    await member.signIn(users.member.email);
    const fake = await upload(member, team.id, Buffer.from('this is a text file'), 'sneaky.png');
    expect(fake.status).toBe(415);
    expect(fake.body.error.message).toMatch(/not an image/);
    const svg = await upload(member, team.id, Buffer.from('<svg xmlns="http://www.w3.org/2000/svg" width="9" height="9"/>'), 'logo.svg');
    expect(svg.status).toBe(422);
    expect(svg.body.error.message).toMatch(/^Nothing to cut: every pixel of this image is transparent/);
    expect(await t.db.getRepository(ArtItem).countBy({ teamId: team.id })).toBe(0);
  });
});

describe('GET /api/teams/:teamId/art/:artId/outline', () => {
  it('computes an outline once, then answers the same request from the cache', async () => {
    const { team, users } = await makeTeamWithRoles(t.db);
    const member = new Client(t.sheetsmith.app);
    await member.signIn(users.member.email);
    const art = await svgArt(1000, 1000, '<circle cx="500" cy="500" r="400" fill="#2e86c1"/>');
    const artId = (await upload(member, team.id, art)).body.results[0].item.id;

    const url = `/api/teams/${team.id}/art/${artId}/outline?width=2in&border=0.125in`;
    const first = await member.get(url);
    expect(first.status).toBe(200);
    expect(first.body.cached).toBe(false);
    expect(first.body.pieces).toHaveLength(1);
    const piece = first.body.pieces[0];
    expect(piece.widthMm).toBeCloseTo(2.25 * 25.4, 6);
    expect(piece.cutLine.svgPath).toMatch(/^M[\d. ]+(L[\d. -]+)+Z$/);
    const rows = await t.db.getRepository(OutlineCacheEntry).count();

    const second = await member.get(`/api/teams/${team.id}/art/${artId}/outline?border=3.175mm&width=50.8`);
    expect(second.status).toBe(200);
    expect(second.body.cached).toBe(true); // same options written differently: same key
    expect(second.body.key).toBe(first.body.key);
    expect(await t.db.getRepository(OutlineCacheEntry).count()).toBe(rows);

    const png = await member.get(piece.pngUrl).buffer(true);
    expect(png.status).toBe(200);
    expect(png.headers['content-type']).toBe('image/png');
    expect(pngSize(png.body)).toEqual({ width: 675, height: 675 });
    expect(pngPhys(png.body)).toEqual({ x: 11811, y: 11811, unit: 1 });
  });

  it('answers bad options with 400 field messages, and another team with 404', async () => {
    const mine = await makeTeamWithRoles(t.db);
    const theirs = await makeTeamWithRoles(t.db);
    const owner = new Client(t.sheetsmith.app);
    await owner.signIn(theirs.users.owner.email);
    const artId = (await upload(owner, theirs.team.id, await svgArt(200, 200, '<rect x="20" y="20" width="160" height="160"/>'))).body
      .results[0].item.id;

    const bad = await owner.get(`/api/teams/${theirs.team.id}/art/${artId}/outline?width=banana&dpi=5`);
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toMatchObject({
      'query.width': expect.stringMatching(/length like 2in/),
      'query.dpi': 'At least 72 DPI',
    });

    const stranger = new Client(t.sheetsmith.app);
    await stranger.signIn(mine.users.owner.email);
    expect((await stranger.get(`/api/teams/${mine.team.id}/art/${artId}/outline?width=1in`)).status).toBe(404);
    expect((await stranger.get(`/api/teams/${theirs.team.id}/art/${artId}/outline?width=1in`)).status).toBe(404);
    const good = await owner.get(`/api/teams/${theirs.team.id}/art/${artId}/outline?width=1in`);
    expect((await stranger.get(good.body.pieces[0].pngUrl.replace(`/teams/${theirs.team.id}/`, `/teams/${mine.team.id}/`))).status).toBe(
      404,
    );
  });

  it('ten outlines at once never stall the API: health answers while they run', async () => {
    const { team, users } = await makeTeamWithRoles(t.db);
    const member = new Client(t.sheetsmith.app);
    await member.signIn(users.member.email);
    const artId = (await upload(member, team.id, await svgArt(2000, 2000, '<circle cx="1000" cy="1000" r="900" fill="#7b241c"/>'))).body
      .results[0].item.id;
    const finished: number[] = [];
    const jobs = Array.from({ length: 10 }, (_, i) =>
      member.get(`/api/teams/${team.id}/art/${artId}/outline?width=${2 + i * 0.1}in`).then((res) => {
        finished.push(Date.now());
        return res;
      }),
    );
    await new Promise((resolve) => setTimeout(resolve, 50));
    const health = await request(t.sheetsmith.app).get('/api/health');
    const healthAt = Date.now();
    expect(health.status).toBe(200);
    const results = await Promise.all(jobs);
    expect(results.map((r) => r.status)).toEqual(Array(10).fill(200));
    // The API answered before the outline work was done, not after it.
    expect(finished.filter((t) => t <= healthAt).length).toBeLessThan(10);
  });
});

describe('GET /api/teams/:teamId/art/:artId/background-removal.png', () => {
  it('tints what removal takes for editors, says how much art it takes, refuses viewers and bad tolerances', async () => {
    const { team, users } = await makeTeamWithRoles(t.db);
    const member = new Client(t.sheetsmith.app);
    await member.signIn(users.member.email);
    // No transparency: a cream-tipped shape on white (the tip is about 37 from white).
    const flat = await sharp(
      Buffer.from(
        '<svg xmlns="http://www.w3.org/2000/svg" width="300" height="300"><rect width="300" height="300" fill="#fff"/><rect x="100" y="40" width="100" height="60" fill="#fcf4dc"/><rect x="100" y="100" width="100" height="160" fill="#f28c28"/></svg>',
      ),
    )
      .flatten({ background: '#ffffff' })
      .png()
      .toBuffer();
    const art = (await upload(member, team.id, flat, 'corn.png')).body.results[0].item;
    const url = (q: string) => `/api/teams/${team.id}/art/${art.id}/background-removal.png?${q}`;
    const safe = await member.get(url('background=auto&backgroundTolerance=32')).buffer(true).parse(binary);
    expect(safe.status).toBe(200);
    expect(safe.headers['content-type']).toBe('image/png');
    expect(pngSize(safe.body as Buffer)).toEqual({ width: 300, height: 300 });
    expect(Number(safe.headers['x-art-taken'])).toBe(0);
    const eaten = await member.get(url('background=%23ffffff&backgroundTolerance=42'));
    // The tip is 6000 of 22000 art pixels.
    expect(Number(eaten.headers['x-art-taken'])).toBeGreaterThan(0.2);
    const outline = await member.get(`/api/teams/${team.id}/art/${art.id}/outline?width=2in&background=%23ffffff&backgroundTolerance=42`);
    expect(outline.body.warnings.find((w: { code: string }) => w.code === 'background-took-art')?.message).toMatch(
      /^Background removal at tolerance 42 also took away \d+ % of the art/,
    );
    const bad = await member.get(url('background=auto&backgroundTolerance=400'));
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields['query.backgroundTolerance']).toBe('The tolerance is at most 255');
    const viewer = new Client(t.sheetsmith.app);
    await viewer.signIn(users.viewer.email);
    const refused = await viewer.get(url('background=auto'));
    expect(refused.status).toBe(403);
    expect(refused.body.error.message).toBe('Only people who can edit sheets or add art preview background removal.');
  });

  it('saving a background without a tolerance gives the mode its own default; none carries over', async () => {
    const { team, users } = await makeTeamWithRoles(t.db);
    const member = new Client(t.sheetsmith.app);
    await member.signIn(users.member.email);
    const art = (await upload(member, team.id, await svgArt(100, 100, '<circle cx="50" cy="50" r="40" fill="#ca6f1e"/>'), 'dot.png')).body
      .results[0].item;
    const path = `/api/teams/${team.id}/art/${art.id}`;
    expect((await member.send('patch', path, { background: { mode: 'auto', tolerance: 42 } })).body.background).toEqual({
      mode: 'auto',
      colour: null,
      tolerance: 42,
    });
    expect((await member.send('patch', path, { background: { mode: 'colour', colour: '#FFFFFF' } })).body.background).toEqual({
      mode: 'colour',
      colour: '#ffffff',
      tolerance: 24,
    });
    expect((await member.send('patch', path, { background: { mode: 'auto' } })).body.background).toEqual({
      mode: 'auto',
      colour: null,
      tolerance: 32,
    });
  });
});
