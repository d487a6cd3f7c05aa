import sharp from 'sharp';
import { describe, expect, it } from 'vitest';
import { Sheet } from '../../server/modules/sheets/sheet.entity';
import { zipSync } from 'fflate';
import { svgArt } from '../helpers/art';
import { Client, makeTeamWithRoles, useTestApp } from '../helpers/app';
import { uploadFile } from '../helpers/library';
import { placePieces, testPiece } from '../helpers/sheets';

const t = useTestApp({ pool: true });

async function shop() {
  const { team, users } = await makeTeamWithRoles(t.db);
  const member = new Client(t.sheetsmith.app);
  await member.signIn(users.member.email);
  const art = (await uploadFile(member, team.id, await svgArt(400, 400, '<circle cx="200" cy="200" r="190" fill="#8e44ad"/>'), 'plum.png'))
    .body.results[0].item;
  const { body: sheet } = await member.post(`/api/teams/${team.id}/sheets`, { name: 'Bounds', unit: 'in' });
  return { team, users, member, art, sheet };
}

describe('sheet documents are bounded to physical sense', () => {
  it('refuses a piece far outside the sheet, one wider than the print area and a wild rotation, naming the piece in the sheet’s unit; nothing is saved', async () => {
    const { team, member, art, sheet } = await shop();
    const cases: [Partial<Parameters<typeof testPiece>[4]>, string, RegExp][] = [
      [{ x: 1e308 }, 'x', /far outside the print area/],
      [{ y: -500 }, 'y', /far outside the print area/],
      [{ width: 762 }, 'width', /30 in wide.*at most 9\.25 in/],
      [{ rotation: 1e9 }, 'rotation', /rotation/i],
    ];
    for (const [change, field, message] of cases) {
      const res = await placePieces(member, team.id, sheet, [testPiece('ok', art.id, 50, 50), testPiece('bad', art.id, 50, 100, change)]);
      expect(res.status, JSON.stringify(change)).toBe(400);
      expect(res.body.error.fields[`document.pieces.1.${field}`]).toMatch(message);
      expect(res.body.error.message).toMatch(/^Piece 2 /);
    }
    const stored = await member.get(`/api/teams/${team.id}/sheets/${sheet.id}`);
    expect(stored.body.version).toBe(1);
    expect(stored.body.document.pieces).toEqual([]);
    // At the limit is fine: a piece as wide as the print area's long side, beside the area.
    const fine = await placePieces(member, team.id, sheet, [
      testPiece('edge', art.id, -20, 100, { width: sheet.document.printArea.height - 2 * 3.175 }),
    ]);
    expect(fine.status).toBe(200);
  });

  it('a document saved before the bounds (or written by hand) never makes analysis, cost or export answer 500', async () => {
    const { team, member, art, sheet } = await shop();
    await placePieces(member, team.id, sheet, [testPiece('ok', art.id, 50, 50)]);
    const row = await t.db.getRepository(Sheet).findOneByOrFail({ id: sheet.id });
    const doc = JSON.parse(row.document);
    doc.pieces.push(testPiece('far', art.id, 1e308, 50), testPiece('wide', art.id, 50, 100, { width: 762 }));
    await t.db.getRepository(Sheet).update({ id: sheet.id }, { document: JSON.stringify(doc), pieceCount: 3 });
    for (const path of ['analysis', 'cost']) {
      const res = await member.get(`/api/teams/${team.id}/sheets/${sheet.id}/${path}`);
      expect(res.status, path).toBeLessThan(500);
    }
    const analysis = await member.get(`/api/teams/${team.id}/sheets/${sheet.id}/analysis`);
    expect(JSON.stringify(analysis.body)).toMatch(/far outside the print area|wider than the print area/);
    const exported = await member.post(`/api/teams/${team.id}/sheets/${sheet.id}/exports`, { dpi: 150, formats: ['png'] });
    expect(exported.status).toBe(422);
    expect(exported.body.error.message).toMatch(/^Piece \d .*Fix it in the editor before exporting\.$/);
  });

  it('a sheet thumbnail must be a real PNG of bounded size', async () => {
    const { team, member, sheet } = await shop();
    const html = `data:image/png;base64,${Buffer.from('<html><script>alert(1)</script></html>').toString('base64')}`;
    const refused = await member.send('put', `/api/teams/${team.id}/sheets/${sheet.id}`, { version: 1, thumbnail: html });
    expect(refused.status).toBe(400);
    expect(refused.body.error.fields.thumbnail).toMatch(/not a PNG/i);
    const huge = await sharp({ create: { width: 4000, height: 10, channels: 3, background: '#fff' } })
      .png()
      .toBuffer();
    const tooBig = await member.send('put', `/api/teams/${team.id}/sheets/${sheet.id}`, {
      version: 1,
      thumbnail: `data:image/png;base64,${huge.toString('base64')}`,
    });
    expect(tooBig.status).toBe(400);
    const small = await sharp({ create: { width: 160, height: 200, channels: 3, background: '#fde' } })
      .png()
      .toBuffer();
    const ok = await member.send('put', `/api/teams/${team.id}/sheets/${sheet.id}`, {
      version: 1,
      thumbnail: `data:image/png;base64,${small.toString('base64')}`,
    });
    expect(ok.status).toBe(200);
    const served = await member.get(`/api/teams/${team.id}/sheets/${sheet.id}/thumbnail`);
    expect(served.headers['content-type']).toBe('image/png');
    expect((await sharp(served.body).metadata()).width).toBe(160);
  });
});

describe('multipart uploads', () => {
  it('licence-proof routes refuse extra text fields and oversized ones', async () => {
    const { team, users, art } = await shop();
    const manager = new Client(t.sheetsmith.app);
    await manager.signIn(users.admin.email);
    await manager.refreshCsrf();
    const post = () => manager.agent.post(`/api/teams/${team.id}/art/${art.id}/licence-proof`).set('x-csrf-token', manager.csrf);
    const bigField = await post()
      .field('note', 'x'.repeat(1024 * 1024))
      .attach('file', Buffer.from('%PDF-1.4 proof'), 'proof.pdf');
    expect(bigField.status).toBe(400);
    expect(bigField.body.error.message).toMatch(/text field is too long/);
    let many = post();
    for (let i = 0; i < 30; i++) many = many.field(`f${i}`, 'x');
    const manyFields = await many.attach('file', Buffer.from('%PDF-1.4 proof'), 'proof.pdf');
    expect(manyFields.status).toBe(400);
    expect(manyFields.body.error.message).toMatch(/too many fields/);
  });

  it('a malformed body (bad part header, truncated, no boundary) is a 400 with a clear message', async () => {
    const { team, member } = await shop();
    await member.refreshCsrf();
    const send = (contentType: string, body: string) =>
      member.agent.post(`/api/teams/${team.id}/art`).set('x-csrf-token', member.csrf).set('Content-Type', contentType).send(body);
    const b = 'XyZboundary';
    const cases = {
      badHeader: send(
        `multipart/form-data; boundary=${b}`,
        `--${b}\r\nContent-Disposition form-data name="file"\r\n\r\nabc\r\n--${b}--\r\n`,
      ),
      truncated: send(
        `multipart/form-data; boundary=${b}`,
        `--${b}\r\nContent-Disposition: form-data; name="file"; filename="a.png"\r\nContent-Type: image/png\r\n\r\n\x89PNG partial`,
      ),
      noBoundary: send('multipart/form-data', `--${b}\r\nContent-Disposition: form-data; name="file"\r\n\r\nabc\r\n--${b}--\r\n`),
    };
    for (const [label, pending] of Object.entries(cases)) {
      const res = await pending;
      expect(res.status, label).toBe(400);
      expect(res.body.error.message, label).toMatch(/upload (was cut off|could not be read)/i);
    }
  });
});

describe('refusals of the request itself say what to do', () => {
  it('a body over the 1 MB a request may carry is refused with the limit named, and nothing is saved', async () => {
    const { team, member, sheet } = await shop();
    await member.refreshCsrf();
    const res = await member.agent
      .put(`/api/teams/${team.id}/sheets/${sheet.id}`)
      .set('x-csrf-token', member.csrf)
      .send({ version: 1, name: 'x'.repeat(1_200_000) });
    expect(res.status).toBe(413);
    expect(res.body.error.message).toBe(
      'That is more than the 1 MB one change may carry. Nothing was saved; make the change in smaller steps.',
    );
    expect((await member.get(`/api/teams/${team.id}/sheets/${sheet.id}`)).body.version).toBe(1);
  });

  it('a zip cut short or not a zip at all is refused in a maker’s words, not the unzip library’s', async () => {
    const { team, member } = await shop();
    const zip = Buffer.from(zipSync({ 'a.png': await svgArt(40, 40, '<rect width="40" height="40" fill="#c0392b"/>') }));
    for (const [label, bytes] of [
      ['cut short', zip.subarray(0, zip.length - 30)],
      ['only its first bytes a zip', Buffer.concat([Buffer.from([0x50, 0x4b, 0x03, 0x04]), Buffer.from('the rest is only text')])],
    ] as const) {
      const res = await uploadFile(member, team.id, bytes, 'pack.zip');
      expect(res.status, label).toBe(422);
      expect(res.body.error.message, label).toBe(
        'This zip could not be opened: it is damaged or was only partly downloaded. Download the pack again, or unzip it yourself and upload the images. Nothing from this zip was stored.',
      );
    }
  });

  it('an address the API does not have is a 404 in words, without the method and path echoed', async () => {
    const { member } = await shop();
    const res = await member.get('/api/no-such-place');
    expect(res.status).toBe(404);
    expect(res.body.error.message).toBe('Sheetsmith has no such page or action. Check the address, or go back and try again.');
  });
});

describe('viewers read what is already made', () => {
  it('a viewer cannot make the server compute new outlines or analyses; once an editor has, the viewer reads them', async () => {
    const { team, users, member, art, sheet } = await shop();
    const viewer = new Client(t.sheetsmith.app);
    await viewer.signIn(users.viewer.email);
    const url = `/api/teams/${team.id}/art/${art.id}/outline?width=1.5in&border=3mm&dpi=600`;
    const before = await t.db.query('SELECT COUNT(*) AS n FROM outline_cache');
    const refused = await viewer.get(url);
    expect(refused.status).toBe(409);
    expect(refused.body.error.message).toMatch(/has not been made yet/);
    expect((await t.db.query('SELECT COUNT(*) AS n FROM outline_cache'))[0].n).toBe(before[0].n);
    expect((await member.get(url)).status).toBe(200);
    expect((await viewer.get(url)).body.cached).toBe(true);

    // A size no one has outlined yet.
    await placePieces(member, team.id, sheet, [testPiece('a', art.id, 60, 60, { width: 47.3 })]);
    const notYet = await viewer.get(`/api/teams/${team.id}/sheets/${sheet.id}/analysis`);
    expect(notYet.status).toBe(409);
    expect(notYet.body.error.message).toMatch(/has not been checked since its last change/);
    expect((await viewer.get(`/api/teams/${team.id}/sheets/${sheet.id}/cost`)).status).toBe(409);
    expect((await member.get(`/api/teams/${team.id}/sheets/${sheet.id}/analysis`)).status).toBe(200);
    expect((await viewer.get(`/api/teams/${team.id}/sheets/${sheet.id}/analysis`)).status).toBe(200);
    expect((await viewer.get(`/api/teams/${team.id}/sheets/${sheet.id}/cost`)).status).toBe(200);
  });
});
