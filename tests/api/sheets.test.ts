import { describe, expect, it } from 'vitest';
import type { Piece } from '@shared/sheet/document';
import { svgArt } from '../helpers/art';
import { Client, makeTeamWithRoles, useTestApp } from '../helpers/app';
import { uploadFile } from '../helpers/library';
import { testPiece } from '../helpers/sheets';

const t = useTestApp({ pool: true });

async function setup() {
  const { team, users } = await makeTeamWithRoles(t.db);
  const clients = {} as Record<'owner' | 'admin' | 'member' | 'viewer', Client>;
  for (const role of ['owner', 'admin', 'member', 'viewer'] as const) {
    clients[role] = new Client(t.sheetsmith.app);
    await clients[role].signIn(users[role].email);
  }
  const art = (
    await uploadFile(clients.member, team.id, await svgArt(300, 300, '<circle cx="150" cy="150" r="120" fill="#1e8449"/>'), 'leaf.png')
  ).body.results[0].item;
  return { team, users, ...clients, art };
}

const piece = (artId: string, x: number, extra: Partial<Piece> = {}): Piece => testPiece(`p${x}`, artId, x, 40, { width: 40, ...extra });

describe('sheet profiles', () => {
  it('start with the common-practice Letter print-and-cut profile; owners and admins manage them; the print area must fit', async () => {
    const { team, admin, member } = await setup();
    const list = await member.get(`/api/teams/${team.id}/sheet-profiles`);
    expect(list.body.profiles).toHaveLength(1);
    // 6.75 × 9.25 in (common practice) = 171.45 × 234.95 mm, centred on Letter (ANSI 8.5 × 11 in).
    expect(list.body.profiles[0]).toMatchObject({
      paper: 'letter',
      paperWidthMm: 215.9,
      paperHeightMm: 279.4,
      areaWidthMm: 171.45,
      areaHeightMm: 234.95,
      areaXMm: 22.225,
      areaYMm: 22.225,
      minGapMm: 3.175,
      isDefault: true,
    });

    const a4 = await admin.post(`/api/teams/${team.id}/sheet-profiles`, {
      name: 'A4 matte',
      paper: 'a4',
      areaWidthMm: 180,
      areaHeightMm: 250,
      safeMarginMm: 3,
      minGapMm: 3,
    });
    expect(a4.status).toBe(201);
    expect(a4.body).toMatchObject({ paperWidthMm: 210, paperHeightMm: 297, areaXMm: 15, areaYMm: 23.5 });
    const tooBig = await admin.post(`/api/teams/${team.id}/sheet-profiles`, {
      name: 'Too big',
      paper: 'letter',
      areaWidthMm: 220,
      areaHeightMm: 250,
      safeMarginMm: 3,
      minGapMm: 3,
    });
    expect(tooBig.status).toBe(400);
    expect(tooBig.body.error.fields.areaWidthMm).toBe('The print area does not fit across the paper');
    const offPaper = await admin.post(`/api/teams/${team.id}/sheet-profiles`, {
      name: 'Off',
      paper: 'custom',
      paperWidthMm: 200,
      paperHeightMm: 200,
      areaWidthMm: 150,
      areaHeightMm: 150,
      areaXMm: 60,
      areaYMm: 10,
      safeMarginMm: 3,
      minGapMm: 3,
    });
    expect(offPaper.body.error.fields.areaWidthMm).toMatch(/does not fit/);
    expect(
      (
        await member.post(`/api/teams/${team.id}/sheet-profiles`, {
          name: 'Mine',
          paper: 'a4',
          areaWidthMm: 180,
          areaHeightMm: 250,
          safeMarginMm: 3,
          minGapMm: 3,
        })
      ).status,
    ).toBe(403);
    expect((await admin.post(`/api/teams/${team.id}/sheet-profiles/${a4.body.id}/default`)).body.isDefault).toBe(true);
    expect((await admin.send('delete', `/api/teams/${team.id}/sheet-profiles/${a4.body.id}`)).status).toBe(409);
  });
});

describe('sheet profiles: bridges, the cut layer and registration marks', () => {
  it('keep the bridge width, spot colour and marks; refuse a bridge under the smallest feature and marks that run off the paper', async () => {
    const { team, admin, member } = await setup();
    const base = { name: 'Marks', paper: 'letter', areaWidthMm: 171.45, areaHeightMm: 234.95, safeMarginMm: 3, minGapMm: 3 };
    const listed = (await member.get(`/api/teams/${team.id}/sheet-profiles`)).body.profiles[0];
    // Defaults: 3 mm bridges (common practice), the usual spot colour name, marks off.
    expect(listed).toMatchObject({ bridgeWidthMm: 3, spotColour: 'CutContour', regMarkShape: 'none' });
    const made = await admin.post(`/api/teams/${team.id}/sheet-profiles`, {
      ...base,
      bridgeWidthMm: 5,
      spotColour: 'Thru-cut',
      regMarkShape: 'bracket',
      regMarkSizeMm: 6,
      regMarkOffsetMm: 4,
    });
    expect(made.status).toBe(201);
    expect(made.body).toMatchObject({
      bridgeWidthMm: 5,
      spotColour: 'Thru-cut',
      regMarkShape: 'bracket',
      regMarkSizeMm: 6,
      regMarkOffsetMm: 4,
    });
    const thin = await admin.post(`/api/teams/${team.id}/sheet-profiles`, { ...base, minFeatureMm: 1, bridgeWidthMm: 0.6 });
    expect(thin.status).toBe(400);
    expect(thin.body.error.fields.bridgeWidthMm).toBe('The bridge width cannot be below the smallest cuttable feature');
    // 22.225 mm of paper around a 6.75 × 9.25 in area on Letter: 12 + 12 mm does not fit.
    const off = await admin.post(`/api/teams/${team.id}/sheet-profiles`, {
      ...base,
      regMarkShape: 'square',
      regMarkSizeMm: 12,
      regMarkOffsetMm: 12,
    });
    expect(off.status).toBe(400);
    expect(off.body.error.fields.regMarkOffsetMm).toBe(
      'The registration marks need 24 mm of paper around the print area; there is 22.22 mm. Use smaller marks, a smaller offset or a smaller print area.',
    );
    const badName = await admin.post(`/api/teams/${team.id}/sheet-profiles`, { ...base, spotColour: 'Cut Contour!' });
    expect(badName.body.error.fields.spotColour).toMatch(/letters, digits, - and _ only/);
    expect((await member.get(`/api/teams/${team.id}/sheet-profiles`)).body.profiles).toHaveLength(2);
  });
});

describe('sheets', () => {
  it('create, read, save with versions, duplicate, template, delete; viewers read only', async () => {
    const { team, member, viewer, art } = await setup();
    const created = await member.post(`/api/teams/${team.id}/sheets`, { name: 'Market Saturday' });
    expect(created.status).toBe(201);
    expect(created.body).toMatchObject({
      name: 'Market Saturday',
      version: 1,
      status: 'draft',
      pieceCount: 0,
      document: { schemaVersion: 1, printArea: { width: 171.45, height: 234.95 }, minGap: 3.175, pieces: [] },
    });
    const id = created.body.id;
    const doc = { ...created.body.document, pieces: [piece(art.id, 30), piece(art.id, 90, { rotation: 90, locked: true })] };
    const saved = await member.send('put', `/api/teams/${team.id}/sheets/${id}`, {
      version: 1,
      document: doc,
      areaUsed: 0.12,
      status: 'ready',
    });
    expect(saved.status).toBe(200);
    expect(saved.body).toMatchObject({ version: 2, pieceCount: 2, areaUsed: 0.12, status: 'ready' });
    const read = await viewer.get(`/api/teams/${team.id}/sheets/${id}`);
    expect(read.body.document).toEqual(doc);
    expect((await viewer.send('put', `/api/teams/${team.id}/sheets/${id}`, { version: 2, name: 'Mine' })).status).toBe(403);
    expect((await viewer.post(`/api/teams/${team.id}/sheets`, { name: 'x' })).status).toBe(403);

    const template = await member.post(`/api/teams/${team.id}/sheets/${id}/duplicate`, { name: 'Market layout', asTemplate: true });
    expect(template.body).toMatchObject({ isTemplate: true, version: 1, pieceCount: 2 });
    const fromTemplate = await member.post(`/api/teams/${team.id}/sheets`, { name: 'Market Sunday', fromTemplateId: template.body.id });
    expect(fromTemplate.body.document.pieces).toHaveLength(2);
    const list = await viewer.get(`/api/teams/${team.id}/sheets`);
    expect(list.body.sheets.map((s: { name: string }) => s.name).sort()).toEqual(['Market Saturday', 'Market Sunday']);
    expect((await viewer.get(`/api/teams/${team.id}/sheets?templates=only`)).body.sheets.map((s: { name: string }) => s.name)).toEqual([
      'Market layout',
    ]);
    expect((await viewer.get(`/api/teams/${team.id}/sheets?q=sunday`)).body.sheets).toHaveLength(1);
    expect((await viewer.get(`/api/teams/${team.id}/sheets?status=ready`)).body.sheets.map((s: { name: string }) => s.name)).toEqual([
      'Market Saturday',
    ]);
    expect((await member.send('delete', `/api/teams/${team.id}/sheets/${fromTemplate.body.id}`)).status).toBe(204);
  });

  it('answers 409 to a save based on an old version and keeps the newer work', async () => {
    const { team, member, admin, art } = await setup();
    const { body: sheet } = await member.post(`/api/teams/${team.id}/sheets`, { name: 'Shared' });
    const mine = { ...sheet.document, pieces: [piece(art.id, 30)] };
    const theirs = { ...sheet.document, pieces: [piece(art.id, 60), piece(art.id, 120)] };
    expect((await admin.send('put', `/api/teams/${team.id}/sheets/${sheet.id}`, { version: 1, document: theirs })).status).toBe(200);
    const stale = await member.send('put', `/api/teams/${team.id}/sheets/${sheet.id}`, { version: 1, document: mine });
    expect(stale.status).toBe(409);
    expect(stale.body.error.code).toBe('version_conflict');
    expect(stale.body.error.message).toMatch(/saved this sheet since you opened it/);
    expect((await member.get(`/api/teams/${team.id}/sheets/${sheet.id}`)).body.document).toEqual(theirs);
  });

  // Seen in the browser: the editor's second save (area used and preview, once outlines arrive)
  // made a new version, so an export taken just before read as "Older version" a moment later.
  it('keeps the version for a save that brings only the area used and the preview', async () => {
    const { team, member, art } = await setup();
    const { body: sheet } = await member.post(`/api/teams/${team.id}/sheets`, { name: 'Steady' });
    const doc = { ...sheet.document, pieces: [piece(art.id, 30)] };
    const url = `/api/teams/${team.id}/sheets/${sheet.id}`;
    expect((await member.send('put', url, { version: 1, document: doc })).body.version).toBe(2);
    // As the editor sends it: the whole state, notes '' for none.
    const again = await member.send('put', url, { version: 2, document: doc, name: 'Steady', notes: '', status: 'draft', areaUsed: 0.123 });
    expect(again.status).toBe(200);
    expect(again.body).toMatchObject({ version: 2, areaUsed: 0.123 });
    expect((await member.send('put', url, { version: 2, document: doc, name: 'Steadier' })).body.version).toBe(3);
    expect((await member.send('put', url, { version: 3, document: { ...doc, pieces: [] } })).body.version).toBe(4);
  });

  it('refuses documents that break the schema or use another team’s art', async () => {
    const a = await setup();
    const b = await setup();
    const { body: sheet } = await a.member.post(`/api/teams/${a.team.id}/sheets`, { name: 'Mine' });
    const foreign = await a.member.send('put', `/api/teams/${a.team.id}/sheets/${sheet.id}`, {
      version: 1,
      document: { ...sheet.document, pieces: [piece(b.art.id, 30)] },
    });
    expect(foreign.status).toBe(400);
    const broken = await a.member.send('put', `/api/teams/${a.team.id}/sheets/${sheet.id}`, {
      version: 1,
      document: { ...sheet.document, pieces: [{ ...piece(a.art.id, 30), width: -5 }] },
    });
    expect(broken.status).toBe(400);
    expect(Object.keys(broken.body.error.fields)[0]).toMatch(/^document\.pieces\.0\.width/);
  });

  it('answers 404 for another team’s sheets and profiles', async () => {
    const a = await setup();
    const b = await setup();
    const { body: sheet } = await b.member.post(`/api/teams/${b.team.id}/sheets`, { name: 'Theirs' });
    expect((await a.owner.get(`/api/teams/${a.team.id}/sheets/${sheet.id}`)).status).toBe(404);
    expect((await a.owner.get(`/api/teams/${b.team.id}/sheets/${sheet.id}`)).status).toBe(404);
    expect((await a.owner.send('put', `/api/teams/${a.team.id}/sheets/${sheet.id}`, { version: 1, name: 'Taken' })).status).toBe(404);
    expect((await a.owner.post(`/api/teams/${a.team.id}/sheets/${sheet.id}/duplicate`, {})).status).toBe(404);
    const profiles = (await b.owner.get(`/api/teams/${b.team.id}/sheet-profiles`)).body.profiles;
    expect((await a.owner.post(`/api/teams/${a.team.id}/sheets`, { name: 'x', profileId: profiles[0].id })).status).toBe(404);
  });

  it('asks before deleting art a sheet uses, then keeps the sheet printable', async () => {
    const { team, member, art } = await setup();
    const { body: sheet } = await member.post(`/api/teams/${team.id}/sheets`, { name: 'Uses the leaf' });
    await member.send('put', `/api/teams/${team.id}/sheets/${sheet.id}`, {
      version: 1,
      document: { ...sheet.document, pieces: [piece(art.id, 30)] },
    });
    const ask = await member.send('delete', `/api/teams/${team.id}/art/${art.id}`);
    expect(ask.status).toBe(409);
    expect(ask.body.error.message).toMatch(/is on 1 sheet \(Uses the leaf\)/);
    expect((await member.post(`/api/teams/${team.id}/art/bulk`, { action: 'delete', ids: [art.id] })).status).toBe(409);
    expect((await member.send('delete', `/api/teams/${team.id}/art/${art.id}?confirm=1`)).status).toBe(204);
    // The sheet still opens and still saves with the deleted art on it.
    const after = await member.get(`/api/teams/${team.id}/sheets/${sheet.id}`);
    expect(after.body.document.pieces[0].artId).toBe(art.id);
    expect((await member.send('put', `/api/teams/${team.id}/sheets/${sheet.id}`, { version: 2, name: 'Still fine' })).status).toBe(200);
  });
});
