import JSZip from 'jszip';
import sharp from 'sharp';
import { describe, expect, it } from 'vitest';
import { pieceOutlineQuery } from '@shared/sheet/placement';
import { svgArt } from '../helpers/art';
import { Client, binary, makeTeamWithRoles, useTestApp } from '../helpers/app';
import { uploadFile } from '../helpers/library';
import { placePieces, testPiece } from '../helpers/sheets';

const t = useTestApp({ pool: true });

async function sheetWithPieces(pieces: number) {
  const { team, users } = await makeTeamWithRoles(t.db);
  const member = new Client(t.sheetsmith.app);
  await member.signIn(users.member.email);
  const art = (await uploadFile(member, team.id, await svgArt(600, 600, '<circle cx="300" cy="300" r="280" fill="#2471a3"/>'), 'drop.png'))
    .body.results[0].item;
  const { body: sheet } = await member.post(`/api/teams/${team.id}/sheets`, { name: 'Export me' });
  await placePieces(
    member,
    team.id,
    sheet,
    Array.from({ length: pieces }, (_, i) =>
      testPiece(`e${i}`, art.id, 40 + (i % 3) * 50, 40 + Math.floor(i / 3) * 50, { rotation: i * 20 }),
    ),
  );
  return { team, users, member, sheet };
}

async function waitFor(client: Client, url: string) {
  for (let i = 0; i < 120; i++) {
    const res = await client.get(url);
    if (res.body.status !== 'running') return res.body;
    await new Promise((r) => setTimeout(r, 250));
  }
  throw new Error('export did not finish');
}

describe('sheet exports', () => {
  it('runs in the background with progress, keeps the bundle for the version and serves it again', async () => {
    const { team, member, sheet } = await sheetWithPieces(4);
    const started = await member.post(`/api/teams/${team.id}/sheets/${sheet.id}/exports`, {
      dpi: 150,
      formats: ['png', 'svg', 'pdf', 'dxf'],
    });
    expect(started.status).toBe(202);
    expect(started.body).toMatchObject({ status: 'running', sheetVersion: 2 });
    const done = await waitFor(member, `/api/teams/${team.id}/sheets/${sheet.id}/exports/${started.body.id}`);
    expect(done).toMatchObject({ status: 'done', progress: 1 });
    const latest = await member.get(`/api/teams/${team.id}/sheets/${sheet.id}/exports/latest`);
    expect(latest.body.export.id).toBe(started.body.id);
    const list = await member.get(`/api/teams/${team.id}/sheets`);
    expect(list.body.sheets[0].lastExport).toMatchObject({ status: 'done', current: true, downloadUrl: done.downloadUrl });
    const zip = await member
      .get(done.downloadUrl)
      .buffer(true)
      .parse((res, cb) => {
        const parts: Buffer[] = [];
        res.on('data', (c: Buffer) => parts.push(c));
        res.on('end', () => cb(null, Buffer.concat(parts)));
      });
    expect(zip.status).toBe(200);
    // Read back with JSZip: every promised file is there.
    const names = Object.keys((await JSZip.loadAsync(zip.body as Buffer)).files).sort();
    expect(names).toEqual([
      'export-me-cut.dxf',
      'export-me-cut.svg',
      'export-me-print.png',
      'export-me-settings.txt',
      'export-me-summary.pdf',
      'export-me.pdf',
    ]);
  });

  it('offers each file on its own, with its media type and the same bytes as in the bundle', async () => {
    const { team, member, sheet, users } = await sheetWithPieces(2);
    const started = await member.post(`/api/teams/${team.id}/sheets/${sheet.id}/exports`, { dpi: 150 });
    const done = await waitFor(member, `/api/teams/${team.id}/sheets/${sheet.id}/exports/${started.body.id}`);
    const zip = await JSZip.loadAsync((await member.get(done.downloadUrl).buffer(true).parse(binary)).body as Buffer);
    // IANA media types: image/png, image/svg+xml, application/pdf, image/vnd.dxf, text/plain.
    const types: Record<string, string> = {
      png: 'image/png',
      svg: 'image/svg+xml',
      pdf: 'application/pdf',
      dxf: 'image/vnd.dxf',
      txt: 'text/plain; charset=utf-8',
    };
    expect(done.files.map((f: { name: string }) => f.name).sort()).toEqual(Object.keys(zip.files).sort());
    expect(done.files.find((f: { name: string }) => f.name === 'export-me-print.png').label).toBe(
      'Print image (PNG) for the cutter software',
    );
    const viewer = new Client(t.sheetsmith.app);
    await viewer.signIn(users.viewer.email);
    for (const f of done.files as Array<{ name: string; url: string; size: number }>) {
      const res = await viewer.get(f.url).buffer(true).parse(binary);
      expect(res.status, f.name).toBe(200);
      expect(res.headers['content-type'], f.name).toBe(types[f.name.split('.').pop()!]);
      expect(res.headers['content-disposition'], f.name).toBe(`attachment; filename=${f.name}`);
      const inZip = await zip.file(f.name)!.async('nodebuffer');
      expect(Buffer.compare(res.body as Buffer, inZip), f.name).toBe(0);
      expect(f.size).toBe(inZip.length);
    }
    expect((await member.get(`/api/teams/${team.id}/sheets/${sheet.id}/exports/${started.body.id}/files/not-there.png`)).status).toBe(404);
    expect((await member.get(`/api/teams/${team.id}/sheets/${sheet.id}/exports/${started.body.id}/files/..%2Fsecret.txt`)).status).toBe(
      400,
    );
  });

  it('prints exactly what the editor previewed: the same raster for art with a non-default background tolerance', async () => {
    const { team, users } = await makeTeamWithRoles(t.db);
    const member = new Client(t.sheetsmith.app);
    await member.signIn(users.member.email);
    // No transparency: a plum disc with a pale halo (#f0f0f0, 26 from white in RGB) on white.
    // The default tolerance (32) removes the halo with the background; a tolerance of 10 keeps it.
    const flat = await sharp(
      Buffer.from(
        '<svg xmlns="http://www.w3.org/2000/svg" width="600" height="600"><rect width="600" height="600" fill="#ffffff"/><circle cx="300" cy="300" r="260" fill="#f0f0f0"/><circle cx="300" cy="300" r="180" fill="#8e44ad"/></svg>',
      ),
    )
      .flatten({ background: '#ffffff' })
      .png()
      .toBuffer();
    const art = (await uploadFile(member, team.id, flat, 'halo.png')).body.results[0].item;
    expect(
      (await member.send('patch', `/api/teams/${team.id}/art/${art.id}`, { background: { mode: 'auto', tolerance: 10 } })).status,
    ).toBe(200);
    const piece = testPiece('h1', art.id, 60, 60, { width: 50 });
    const { body: sheet } = await member.post(`/api/teams/${team.id}/sheets`, { name: 'Halo' });
    await placePieces(member, team.id, sheet, [piece]);
    // The visible part is always printed 50 mm wide, so what the tolerance changes is how much of
    // it is plum: with the halo kept, the plum disc is (180/260)² ≈ 0.48 of what it is without.
    const opaque = async (png: Buffer) => {
      const { data } = await sharp(png).ensureAlpha().raw().toBuffer({ resolveWithObject: true });
      let n = 0;
      for (let i = 0; i < data.length; i += 4) if (data[i + 3] > 127 && data[i] < 180 && data[i + 1] < 110 && data[i + 2] > 120) n++;
      return n;
    };
    // What the editor shows: its own outline request for the piece (the server adds the art's setting).
    const previewOf = async (extra = '') => {
      const outline = await member.get(
        `/api/teams/${team.id}/art/${art.id}/outline?${new URLSearchParams(pieceOutlineQuery(piece, { minFeatureMm: 1, bridgeWidthMm: 3 }))}${extra}`,
      );
      return opaque((await member.get(outline.body.pieces[0].pngUrl).buffer(true).parse(binary)).body as Buffer);
    };
    const preview = await previewOf();
    const atDefault = await previewOf('&background=auto&backgroundTolerance=32');
    expect(preview / atDefault).toBeLessThan(0.6); // the setting matters: the halo stays
    const started = await member.post(`/api/teams/${team.id}/sheets/${sheet.id}/exports`, { dpi: 150, formats: ['png'] });
    const done = await waitFor(member, `/api/teams/${team.id}/sheets/${sheet.id}/exports/${started.body.id}`);
    const print = (
      await member
        .get(done.files.find((f: { name: string }) => f.name.endsWith('-print.png')).url)
        .buffer(true)
        .parse(binary)
    ).body as Buffer;
    expect(Math.abs((await opaque(print)) - preview) / preview).toBeLessThan(0.005);
  });

  it('a 0.6 mm neck shows in the sheet analysis (preflight) and in the export’s settings text', async () => {
    const { team, users } = await makeTeamWithRoles(t.db);
    const member = new Client(t.sheetsmith.app);
    await member.signIn(users.member.email);
    // Two discs joined by a bar 0.6 mm wide at 40 mm, cut with no border.
    const necked = await sharp(
      Buffer.from(
        '<svg xmlns="http://www.w3.org/2000/svg" width="1600" height="640" viewBox="0 0 40 16"><circle cx="8" cy="8" r="8" fill="#1f618d"/><circle cx="32" cy="8" r="8" fill="#1f618d"/><rect x="15" y="7.7" width="10" height="0.6" fill="#1f618d"/></svg>',
      ),
    )
      .png()
      .toBuffer();
    const art = (await uploadFile(member, team.id, necked, 'dumbbell.png')).body.results[0].item;
    const { body: sheet } = await member.post(`/api/teams/${team.id}/sheets`, { name: 'Necked' });
    await placePieces(member, team.id, sheet, [testPiece('n1', art.id, 60, 60, { width: 40, border: 0 })]);
    const analysis = await member.get(`/api/teams/${team.id}/sheets/${sheet.id}/analysis`);
    const finding = analysis.body.findings.find((f: { code: string }) => f.code === 'narrow-neck');
    expect(finding?.message).toMatch(/^dumbbell's cut line narrows below 0\.039 in|^dumbbell's cut line narrows below 1 mm/);
    const started = await member.post(`/api/teams/${team.id}/sheets/${sheet.id}/exports`, { dpi: 150, formats: ['png'] });
    const done = await waitFor(member, `/api/teams/${team.id}/sheets/${sheet.id}/exports/${started.body.id}`);
    const settings = await member.get(done.files.find((f: { name: string }) => f.name.endsWith('-settings.txt')).url);
    expect(settings.text).toMatch(/WARNING: dumbbell's cut line narrows below/);
  });

  it('the profile’s bridge width reaches the editor’s outline, its marks the export; the art’s “widen narrow parts” its outline', async () => {
    const { team, users } = await makeTeamWithRoles(t.db);
    const admin = new Client(t.sheetsmith.app);
    await admin.signIn(users.admin.email);
    const profile = (
      await admin.post(`/api/teams/${team.id}/sheet-profiles`, {
        name: 'Wide bridges',
        paper: 'letter',
        areaWidthMm: 171.45,
        areaHeightMm: 234.95,
        safeMarginMm: 3,
        minGapMm: 3,
        bridgeWidthMm: 6,
        regMarkShape: 'dot',
        regMarkSizeMm: 5,
        regMarkOffsetMm: 5,
      })
    ).body;
    // Two discs 6.56 mm apart across 2 in (the measured case): the border alone joins them in a 0.74 mm waist.
    const islands = await sharp(
      Buffer.from(
        '<svg xmlns="http://www.w3.org/2000/svg" width="2032" height="820" viewBox="0 0 50.8 20.56"><circle cx="10.28" cy="10.28" r="10.28" fill="#884ea0"/><circle cx="40.52" cy="10.28" r="10.28" fill="#884ea0"/></svg>',
      ),
    )
      .png()
      .toBuffer();
    const art = (await uploadFile(admin, team.id, islands, 'twins.png')).body.results[0].item;
    const { body: created } = await admin.post(`/api/teams/${team.id}/sheets`, { name: 'Twins', profileId: profile.id });
    const piece = testPiece('t1', art.id, 60, 60, { width: 50.8, border: 3.175 });
    await placePieces(admin, team.id, created, [piece]);
    const sheet = (await admin.get(`/api/teams/${team.id}/sheets/${created.id}`)).body;
    expect(sheet.limits).toMatchObject({ minFeatureMm: 1, bridgeWidthMm: 6 });
    expect(sheet.printing).toEqual({ spotColour: 'CutContour', marks: { shape: 'dot', sizeMm: 5, offsetMm: 5 } });
    const outline = await admin.get(
      `/api/teams/${team.id}/art/${art.id}/outline?${new URLSearchParams(pieceOutlineQuery(piece, sheet.limits))}`,
    );
    expect(outline.body.warnings.find((w: { code: string }) => w.code === 'islands-joined')?.message).toMatch(/at least 6 mm wide/);
    const started = await admin.post(`/api/teams/${team.id}/sheets/${created.id}/exports`, { dpi: 150, formats: ['pdf', 'svg'] });
    const done = await waitFor(admin, `/api/teams/${team.id}/sheets/${created.id}/exports/${started.body.id}`);
    const settings = (await admin.get(done.files.find((f: { name: string }) => f.name.endsWith('-settings.txt')).url)).text;
    expect(settings).toMatch(/Registration marks: filled dots 0\.197 in, 0\.197 in outside .*not in the cut files/);
    const cut = String(
      (
        await admin
          .get(done.files.find((f: { name: string }) => f.name.endsWith('-cut.svg')).url)
          .buffer(true)
          .parse(binary)
      ).body,
    );
    expect(cut).not.toContain('registration-marks');

    // A necked piece of one art: warned as drawn; once the maker agrees, the editor's same request widens it.
    const necked = await sharp(
      Buffer.from(
        '<svg xmlns="http://www.w3.org/2000/svg" width="1600" height="640" viewBox="0 0 40 16"><circle cx="8" cy="8" r="8" fill="#1f618d"/><circle cx="32" cy="8" r="8" fill="#1f618d"/><rect x="15" y="7.7" width="10" height="0.6" fill="#1f618d"/></svg>',
      ),
    )
      .png()
      .toBuffer();
    const dumbbell = (await uploadFile(admin, team.id, necked, 'dumbbell.png')).body.results[0].item;
    const query = new URLSearchParams(pieceOutlineQuery({ width: 40, border: 0, borderColour: '#ffffff' }, sheet.limits));
    const codes = async () =>
      (await admin.get(`/api/teams/${team.id}/art/${dumbbell.id}/outline?${query}`)).body.warnings.map((w: { code: string }) => w.code);
    expect(await codes()).toContain('narrow-neck');
    const agreed = await admin.send('patch', `/api/teams/${team.id}/art/${dumbbell.id}`, { widenNecks: true });
    expect(agreed.body.widenNecks).toBe(true);
    const after = await codes();
    expect(after).toContain('necks-widened');
    expect(after).not.toContain('narrow-neck');
    const refused = await admin.send('patch', `/api/teams/${team.id}/art/${dumbbell.id}`, { widenNecks: 'sure' });
    expect(refused.status).toBe(400);
    expect(refused.body.error.fields.widenNecks).toBe('Say yes or no to widening narrow parts');
  });

  it('can be stopped while running, and a running row whose job is gone ends failed with a message', async () => {
    const { team, member, sheet } = await sheetWithPieces(12);
    const started = await member.post(`/api/teams/${team.id}/sheets/${sheet.id}/exports`, { dpi: 600 });
    const stopped = await member.post(`/api/teams/${team.id}/sheets/${sheet.id}/exports/${started.body.id}/cancel`);
    expect(stopped.status).toBe(200);
    expect(stopped.body).toMatchObject({ status: 'failed', error: 'Stopped before it finished.' });
    // The worker notices at its next step and leaves the row alone.
    await new Promise((r) => setTimeout(r, 1500));
    expect((await member.get(`/api/teams/${team.id}/sheets/${sheet.id}/exports/${started.body.id}`)).body.status).toBe('failed');
    expect((await member.post(`/api/teams/${team.id}/sheets/${sheet.id}/exports/${started.body.id}/cancel`)).status).toBe(409);

    // A row left "running" by a job the queue no longer has (a wiped Redis, a worker that died for good).
    const insert = await t.db.query(
      "INSERT INTO sheet_exports (team_id, sheet_id, sheet_version, status, options_json, created_by, step, created_at) VALUES (?, ?, 2, 'running', '{}', ?, 'Outlining piece 5 of 40', NOW(3) - INTERVAL 1 MINUTE)",
      [
        team.id,
        sheet.id,
        started.body.id ? (await t.db.query('SELECT created_by FROM sheet_exports WHERE id = ?', [started.body.id]))[0].created_by : null,
      ],
    );
    const orphan = await member.get(`/api/teams/${team.id}/sheets/${sheet.id}/exports/${insert.insertId}`);
    expect(orphan.body).toMatchObject({ status: 'failed', error: 'The export stopped before it finished. Try again.' });
    const list = await member.get(`/api/teams/${team.id}/sheets`);
    expect(list.body.sheets[0].lastExport.status).not.toBe('running');
  });

  it('gives clear errors: another team’s sheet (404), an empty sheet (422), a DPI out of range (400), a viewer (403)', async () => {
    const a = await sheetWithPieces(1);
    const b = await sheetWithPieces(1);
    expect((await a.member.post(`/api/teams/${a.team.id}/sheets/${b.sheet.id}/exports`, {})).status).toBe(404);
    expect((await a.member.post(`/api/teams/${b.team.id}/sheets/${b.sheet.id}/exports`, {})).status).toBe(404);
    const { body: empty } = await a.member.post(`/api/teams/${a.team.id}/sheets`, { name: 'Nothing here' });
    const emptyRes = await a.member.post(`/api/teams/${a.team.id}/sheets/${empty.id}/exports`, {});
    expect(emptyRes.status).toBe(422);
    expect(emptyRes.body.error.message).toMatch(/no pieces yet/);
    const dpi = await a.member.post(`/api/teams/${a.team.id}/sheets/${a.sheet.id}/exports`, { dpi: 2400 });
    expect(dpi.status).toBe(400);
    expect(dpi.body.error.fields.dpi).toBe('At most 600 DPI');
    const viewer = new Client(t.sheetsmith.app);
    await viewer.signIn(a.users.viewer.email);
    expect((await viewer.post(`/api/teams/${a.team.id}/sheets/${a.sheet.id}/exports`, {})).status).toBe(403);
  });
});
