import { createHash, randomBytes } from 'node:crypto';
import { readdir, utimes, writeFile } from 'node:fs/promises';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { env } from '../../server/config/env';
import { LocalDiskStorage } from '../../server/storage/local-disk';
import { sweepStorage } from '../../server/storage/sweep';
import { svgArt } from '../helpers/art';
import { Client, makeTeamWithRoles, useTestApp } from '../helpers/app';
import { uploadFile } from '../helpers/library';
import { testPiece } from '../helpers/sheets';

const HOUR = 3_600_000;
let root = '';
let storage: LocalDiskStorage;
const t = useTestApp({
  pool: true,
  extra: () => {
    // A storage folder of this file's own: the sweep lists only it (references are database-wide).
    root = path.join(env.dataDir, `sweep-${randomBytes(4).toString('hex')}`);
    storage = new LocalDiskStorage(root);
    return { storage };
  },
});

const fileOf = (key: string) => path.join(root, key.slice(0, 2), key.slice(2, 4), key);
/** Makes every stored file look `hours` old, as if written then. */
async function ageAll(hours: number) {
  const when = new Date(Date.now() - hours * HOUR);
  for await (const { key } of storage.list()) await utimes(path.join(root, key.slice(0, 2), key.slice(2, 4), key), when, when);
}
const keys = async () => {
  const out: string[] = [];
  for await (const { key } of storage.list()) out.push(key);
  return out.sort();
};
/** Distinct art (a random colour), so no other suite stores the same bytes. */
const uniqueArt = () => svgArt(300, 300, `<circle cx="150" cy="150" r="140" fill="#${randomBytes(3).toString('hex')}"/>`);

describe('storage hygiene', () => {
  it('the sweep removes old files no row refers to and keeps every referenced kind and anything recent', async () => {
    const { team, users } = await makeTeamWithRoles(t.db);
    const admin = new Client(t.sheetsmith.app);
    await admin.signIn(users.admin.email);
    const art = (await uploadFile(admin, team.id, await uniqueArt(), 'kept.png')).body.results[0].item;
    // Vector art keeps its cleaned SVG beside the PNG drawn from it.
    const vector = Buffer.from(
      `<svg xmlns="http://www.w3.org/2000/svg" width="20mm" height="20mm" viewBox="0 0 10 10"><circle cx="5" cy="5" r="4" fill="#${randomBytes(3).toString('hex')}"/></svg>`,
    );
    const drawn = (await uploadFile(admin, team.id, vector, 'kept.svg')).body.results[0].item;
    await admin.send('patch', `/api/teams/${team.id}/art/${art.id}`, { licence: { kind: 'personal' } });
    await admin.agent
      .post(`/api/teams/${team.id}/art/${art.id}/licence-proof`)
      .set('x-csrf-token', admin.csrf)
      .attach('file', randomBytes(200), 'proof.pdf');
    const collection = (await admin.post(`/api/teams/${team.id}/collections`, { name: 'Pack', licence: { kind: 'commercial' } })).body;
    await admin.agent
      .post(`/api/teams/${team.id}/collections/${collection.id}/licence-proof`)
      .set('x-csrf-token', admin.csrf)
      .attach('file', randomBytes(300), 'pack-licence.pdf');
    expect((await admin.get(`/api/teams/${team.id}/art/${art.id}/outline?width=40mm&border=3mm`)).status).toBe(200);
    const { body: sheet } = await admin.post(`/api/teams/${team.id}/sheets`, { name: 'Sweep' });
    const thumb = `data:image/png;base64,${(
      await (
        await import('sharp')
      )
        .default({ create: { width: 20, height: 26, channels: 3, background: `#${randomBytes(3).toString('hex')}` } })
        .png()
        .toBuffer()
    ).toString('base64')}`;
    await admin.send('put', `/api/teams/${team.id}/sheets/${sheet.id}`, {
      version: 1,
      thumbnail: thumb,
      document: { ...sheet.document, pieces: [testPiece('s1', art.id, 40, 40)] },
    });
    // A buyer's proof keeps the picture of each sticker as it was sent (inside the proof's JSON).
    const buyer = (await admin.post(`/api/teams/${team.id}/customers`, { name: 'Sweep Buyer', email: 'sweep-buyer@example.test' })).body;
    const order = (await admin.post(`/api/teams/${team.id}/orders`, { customerId: buyer.id })).body;
    await admin.post(`/api/teams/${team.id}/orders/${order.id}/lines`, {
      kind: 'singles',
      artId: art.id,
      finishedWidthMm: 30,
      quantity: 10,
      unitPrice: '0.50',
    });
    expect((await admin.post(`/api/teams/${team.id}/orders/${order.id}/proofs`, {})).status).toBe(201);
    const picture = (await admin.get(`/api/teams/${team.id}/orders/${order.id}`)).body.proofs[0].lines[0].pictureUrl;
    const referenced = await keys();
    expect(referenced.length).toBeGreaterThanOrEqual(11); // 2 files, 2 thumbnails, an SVG, 2 licence proofs, 2 outline PNGs, sheet preview, proof picture

    // What a killed upload leaves: a whole file and a half-written one, no row for either.
    const orphan = (await storage.put(randomBytes(500))).key;
    const half = `${orphan.replace(/^../, 'ab')}.0123456789ab.tmp`;
    const halfPath = path.join(root, 'ab', half.slice(2, 4), half);
    await (await import('node:fs/promises')).mkdir(path.dirname(halfPath), { recursive: true });
    await writeFile(halfPath, randomBytes(100));
    await ageAll(48);
    const young = (await storage.put(randomBytes(400))).key;

    const report = await sweepStorage(t.db, storage, 24 * HOUR);
    expect(report.deleted).toBe(2);
    const after = await keys();
    expect(after).toEqual([...referenced, young].sort());
    expect(after).not.toContain(orphan);
    expect(await readdir(path.dirname(halfPath))).toEqual([]);
    // Everything still serves.
    expect((await admin.get(`/api/teams/${team.id}/art/${art.id}/file`)).status).toBe(200);
    expect((await admin.get(`/api/teams/${team.id}/art/${art.id}/licence-proof`)).status).toBe(200);
    expect((await admin.get(`/api/teams/${team.id}/collections/${collection.id}/licence-proof`)).status).toBe(200);
    expect((await admin.get(`/api/teams/${team.id}/sheets/${sheet.id}/thumbnail`)).status).toBe(200);
    expect((await admin.get(drawn.source.url)).status).toBe(200);
    expect((await admin.get(picture)).status).toBe(200);
  });

  it('a re-put renews a file, so the sweep never takes what a new row is about to use', async () => {
    const bytes = randomBytes(600);
    const { key } = await storage.put(bytes);
    await utimes(fileOf(key), new Date(Date.now() - 48 * HOUR), new Date(Date.now() - 48 * HOUR));
    await storage.put(bytes); // a new upload of the same bytes, its row not written yet
    await sweepStorage(t.db, storage, 24 * HOUR);
    expect(await storage.exists(key)).toBe(true);
  });

  it('a replaced licence proof is deleted with its row, unless another row uses the same file', async () => {
    const { team, users } = await makeTeamWithRoles(t.db);
    const admin = new Client(t.sheetsmith.app);
    await admin.signIn(users.admin.email);
    const [a, b] = [
      (await uploadFile(admin, team.id, await uniqueArt(), 'a.png')).body.results[0].item,
      (await uploadFile(admin, team.id, await uniqueArt(), 'b.png')).body.results[0].item,
    ];
    for (const item of [a, b]) await admin.send('patch', `/api/teams/${team.id}/art/${item.id}`, { licence: { kind: 'commercial' } });
    const attach = (id: string, bytes: Buffer) =>
      admin.agent.post(`/api/teams/${team.id}/art/${id}/licence-proof`).set('x-csrf-token', admin.csrf).attach('file', bytes, 'proof.pdf');
    const first = randomBytes(700);
    const shared = randomBytes(800);
    await attach(a.id, first);
    await attach(b.id, shared);
    await attach(a.id, shared); // a now shares b's proof file
    // Replaced within a minute of being written: left for the sweep (a row for it may be in flight).
    expect(await storage.exists(createHash('sha256').update(first).digest('hex'))).toBe(true);
    // Proofs are replaced long after they were attached; files re-put within a minute wait for the sweep.
    await ageAll(2);
    await attach(a.id, randomBytes(900));
    const sharedKey = (await t.db.query('SELECT licence_proof_key AS k FROM art_items WHERE id = ?', [b.id]))[0].k;
    expect(await storage.exists(sharedKey)).toBe(true); // b still uses it
    await attach(b.id, randomBytes(950));
    expect(await storage.exists(sharedKey)).toBe(false); // nobody does now
  });
});
