import sharp from 'sharp';
import { describe, expect, it } from 'vitest';
import { ArtItem } from '../../server/modules/art/art-item.entity';
import { uploadFile, useLibraryTestApp } from '../helpers/library';

const { t, storage, setup, shape } = useLibraryTestApp('library-test');

describe('collections: who may do what', () => {
  it('owners and admins create, rename, archive and reorder; members and viewers may not', async () => {
    const { team, owner, admin, member, viewer } = await setup();
    const a = await owner.post(`/api/teams/${team.id}/collections`, { name: 'Garden Party' });
    expect(a.status).toBe(201);
    const b = await admin.post(`/api/teams/${team.id}/collections`, { name: 'Deep Space', membersCanAdd: false });
    expect(b.status).toBe(201);
    expect((await member.post(`/api/teams/${team.id}/collections`, { name: 'Mine' })).status).toBe(403);
    expect((await viewer.post(`/api/teams/${team.id}/collections`, { name: 'Mine' })).status).toBe(403);
    expect((await admin.post(`/api/teams/${team.id}/collections`, { name: 'Garden Party' })).status).toBe(409);

    expect((await admin.send('patch', `/api/teams/${team.id}/collections/${a.body.id}`, { name: 'Garden Party 2026' })).body.name).toBe(
      'Garden Party 2026',
    );
    expect((await member.send('patch', `/api/teams/${team.id}/collections/${a.body.id}`, { name: 'x' })).status).toBe(403);
    const order = await owner.send('put', `/api/teams/${team.id}/collections/order`, { ids: [b.body.id, a.body.id] });
    expect(order.body.collections.map((c: { id: string }) => c.id)).toEqual([b.body.id, a.body.id]);
    expect((await member.send('put', `/api/teams/${team.id}/collections/order`, { ids: [a.body.id, b.body.id] })).status).toBe(403);
    expect((await owner.send('put', `/api/teams/${team.id}/collections/order`, { ids: [a.body.id] })).status).toBe(400);
    const archived = await admin.send('patch', `/api/teams/${team.id}/collections/${b.body.id}`, { archived: true });
    expect(archived.body.archived).toBe(true);
    const listed = await viewer.get(`/api/teams/${team.id}/collections`);
    expect(listed.status).toBe(200);
    expect(listed.body.collections).toHaveLength(2);
  });

  it('members add art to collections open to them, not to closed or archived ones; viewers upload nothing', async () => {
    const { team, owner, member, viewer } = await setup();
    const open = (await owner.post(`/api/teams/${team.id}/collections`, { name: 'Open shelf' })).body;
    const closed = (await owner.post(`/api/teams/${team.id}/collections`, { name: 'Curated', membersCanAdd: false })).body;
    expect((await uploadFile(member, team.id, await shape(1), 'a.png', { collectionId: open.id })).status).toBe(201);
    expect((await uploadFile(member, team.id, await shape(2), 'b.png', { collectionId: closed.id })).status).toBe(403);
    expect((await uploadFile(owner, team.id, await shape(2), 'b.png', { collectionId: closed.id })).status).toBe(201);
    expect((await uploadFile(viewer, team.id, await shape(3), 'c.png')).status).toBe(403);
    await owner.send('patch', `/api/teams/${team.id}/collections/${open.id}`, { archived: true });
    expect((await uploadFile(owner, team.id, await shape(4), 'd.png', { collectionId: open.id })).status).toBe(409);
  });

  it('moving art: admins move anything; members only between collections open to members', async () => {
    const { team, owner, admin, member } = await setup();
    const open = (await owner.post(`/api/teams/${team.id}/collections`, { name: 'Open' })).body;
    const open2 = (await owner.post(`/api/teams/${team.id}/collections`, { name: 'Open too' })).body;
    const closed = (await owner.post(`/api/teams/${team.id}/collections`, { name: 'Closed', membersCanAdd: false })).body;
    const mine = (await uploadFile(member, team.id, await shape(5), 'mine.png', { collectionId: open.id })).body.results[0].item;
    const curated = (await uploadFile(admin, team.id, await shape(6), 'cur.png', { collectionId: closed.id })).body.results[0].item;

    expect(
      (await member.send('patch', `/api/teams/${team.id}/art/${mine.id}`, { collectionIds: [open2.id] })).body.collections.map(
        (c: { name: string }) => c.name,
      ),
    ).toEqual(['Open too']);
    expect((await member.send('patch', `/api/teams/${team.id}/art/${mine.id}`, { collectionIds: [closed.id] })).status).toBe(403);
    expect((await member.send('patch', `/api/teams/${team.id}/art/${curated.id}`, { collectionIds: [open.id] })).status).toBe(403);
    const bulk = await admin.post(`/api/teams/${team.id}/art/bulk`, { action: 'move', ids: [mine.id, curated.id], collectionId: open.id });
    expect(bulk.body).toEqual({ changed: 2 });
    const inOpen = await member.get(`/api/teams/${team.id}/art?collectionId=${open.id}`);
    expect(inOpen.body.total).toBe(2);
  });

  it('licences: set by owners and admins, inherited from the collection, with a proof file', async () => {
    const { team, admin, member, viewer } = await setup();
    const pack = (
      await admin.post(`/api/teams/${team.id}/collections`, {
        name: 'Bought bundle',
        licence: { kind: 'commercial_limited', source: 'Hollyhock Bundles', unitLimit: 500 },
      })
    ).body;
    expect(pack.licence).toMatchObject({ kind: 'commercial_limited', unitLimit: 500 });
    const item = (await uploadFile(member, team.id, await shape(7), 'owl.png', { collectionId: pack.id })).body.results[0].item;
    expect(item.licence).toMatchObject({
      kind: 'commercial_limited',
      source: 'Hollyhock Bundles',
      inheritedFrom: { collectionId: pack.id },
    });

    expect((await member.send('patch', `/api/teams/${team.id}/art/${item.id}`, { licence: { kind: 'commercial' } })).status).toBe(403);
    const bad = await admin.send('patch', `/api/teams/${team.id}/art/${item.id}`, { licence: { kind: 'commercial_limited' } });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields['licence.unitLimit']).toMatch(/number of units/);
    const own = await admin.send('patch', `/api/teams/${team.id}/art/${item.id}`, { licence: { kind: 'personal', source: 'A friend' } });
    expect(own.body.licence).toMatchObject({ kind: 'personal', inheritedFrom: null });

    await admin.refreshCsrf();
    const proof = await admin.agent
      .post(`/api/teams/${team.id}/art/${item.id}/licence-proof`)
      .set('x-csrf-token', admin.csrf)
      .attach('file', Buffer.from('Receipt #4411, personal use'), 'receipt.txt');
    expect(proof.status).toBe(200);
    expect(proof.body.licence.proofName).toBe('receipt.txt');
    const download = await viewer.get(proof.body.licence.proofUrl);
    expect(download.status).toBe(200);
    expect(String(download.text ?? download.body)).toContain('Receipt #4411');
    const filtered = await viewer.get(`/api/teams/${team.id}/art?licence=personal`);
    expect(filtered.body.items.map((i: { id: string }) => i.id)).toEqual([item.id]);
  });
});

describe('art in several collections', () => {
  it('art sits in two collections at once; its licence comes from its pack and survives moves, keyword edits and leaving the pack', async () => {
    const { team, admin, member } = await setup();
    const pack = (
      await admin.post(`/api/teams/${team.id}/collections`, {
        name: 'Harvest Moon Pack',
        licence: { kind: 'commercial_limited', source: 'Hollyhock Bundles', unitLimit: 200 },
      })
    ).body;
    const theme = (await admin.post(`/api/teams/${team.id}/collections`, { name: 'Autumn Market' })).body;
    const plain = (await admin.post(`/api/teams/${team.id}/collections`, { name: 'Loose Doodles', licence: { kind: 'personal' } })).body;
    const item = (await uploadFile(member, team.id, await shape(60), 'gourd.png', { collectionId: pack.id })).body.results[0].item;
    const licence = { kind: 'commercial_limited', unitLimit: 200, inheritedFrom: { collectionId: pack.id, name: 'Harvest Moon Pack' } };
    expect(item.licence).toMatchObject(licence);

    const both = await member.send('patch', `/api/teams/${team.id}/art/${item.id}`, { collectionIds: [pack.id, theme.id] });
    expect(both.body.collections.map((c: { name: string }) => c.name)).toEqual(['Harvest Moon Pack', 'Autumn Market']);
    expect(both.body.licence).toMatchObject(licence);
    for (const id of [pack.id, theme.id])
      expect((await member.get(`/api/teams/${team.id}/art?collectionId=${id}`)).body.items.map((i: { id: string }) => i.id)).toEqual([
        item.id,
      ]);
    expect((await member.get(`/api/teams/${team.id}/art?q=autumn`)).body.total).toBe(1);
    const counts = (await member.get(`/api/teams/${team.id}/collections`)).body.collections;
    expect(counts.filter((c: { id: string }) => [pack.id, theme.id].includes(c.id)).map((c: { artCount: number }) => c.artCount)).toEqual([
      1, 1,
    ]);

    // A keyword edit alone sends only keywords and changes nothing else.
    const keyworded = await member.send('patch', `/api/teams/${team.id}/art/${item.id}`, { keywords: ['gourd', 'harvest'] });
    expect(keyworded.body.collections).toHaveLength(2);
    expect(keyworded.body.licence).toMatchObject(licence);
    // Moved out of its pack into a collection with another licence: still the pack's licence.
    const moved = await admin.post(`/api/teams/${team.id}/art/bulk`, { action: 'move', ids: [item.id], collectionId: plain.id });
    expect(moved.status).toBe(200);
    const after = (await member.get(`/api/teams/${team.id}/art/${item.id}`)).body;
    expect(after.collections.map((c: { name: string }) => c.name)).toEqual(['Loose Doodles']);
    expect(after.licence).toMatchObject(licence);
    expect((await member.get(`/api/teams/${team.id}/art?licence=commercial_limited`)).body.items.map((i: { id: string }) => i.id)).toEqual([
      item.id,
    ]);
  });
});

describe('search', () => {
  it('finds art by keyword, plural or singular, hyphenated or joined forms, case, and collection name', async () => {
    const { team, owner, viewer } = await setup();
    const space = (await owner.post(`/api/teams/${team.id}/collections`, { name: 'Cosmic Doodles' })).body;
    await uploadFile(owner, team.id, await shape(8), 'Sun-Flower_01.png', { keywords: 'garden, Yellow Petals' });
    await uploadFile(owner, team.id, await shape(9), 'strawberries.png', { keywords: 'fruit' });
    await uploadFile(owner, team.id, await shape(10), 'rocket.png', { collectionId: space.id, keywords: 'ship' });
    const names = async (q: string) =>
      (await viewer.get(`/api/teams/${team.id}/art?q=${encodeURIComponent(q)}`)).body.items.map((i: { name: string }) => i.name).sort();

    expect(await names('sunflower')).toEqual(['Sun-Flower 01']);
    expect(await names('sun flower')).toEqual(['Sun-Flower 01']);
    expect(await names('Sun-Flowers')).toEqual(['Sun-Flower 01']);
    expect(await names('PETAL')).toEqual(['Sun-Flower 01']);
    expect(await names('strawberry')).toEqual(['strawberries']);
    expect(await names('fruits')).toEqual(['strawberries']);
    expect(await names('cosmic')).toEqual(['rocket']);
    expect(await names('doodle ships')).toEqual(['rocket']);
    expect(await names('gard')).toEqual(['Sun-Flower 01']); // prefix
    expect(await names('submarine')).toEqual([]);
    expect((await names('')).length).toBe(3);
  });

  it('pages and sorts, and filters by transparency and uploader', async () => {
    const { team, users, owner, member } = await setup();
    for (const [i, name] of ['cherry', 'apple', 'banana'].entries()) await uploadFile(owner, team.id, await shape(20 + i), `${name}.png`);
    // Opaque art: a flat sky with a sun on it (a flat colour alone would be refused: nothing to cut).
    const opaque = await sharp({ create: { width: 64, height: 64, channels: 3, background: '#abcdef' } })
      .composite([
        {
          input: Buffer.from(
            '<svg xmlns="http://www.w3.org/2000/svg" width="64" height="64"><circle cx="32" cy="32" r="14" fill="#f5c542"/></svg>',
          ),
        },
      ])
      .jpeg()
      .toBuffer();
    await uploadFile(member, team.id, opaque, 'sky.jpg');
    const page1 = await owner.get(`/api/teams/${team.id}/art?sort=name&dir=asc&pageSize=2&page=1`);
    const page2 = await owner.get(`/api/teams/${team.id}/art?sort=name&dir=asc&pageSize=2&page=2`);
    expect(page1.body.total).toBe(4);
    expect([...page1.body.items, ...page2.body.items].map((i: { name: string }) => i.name)).toEqual(['apple', 'banana', 'cherry', 'sky']);
    expect((await owner.get(`/api/teams/${team.id}/art?transparency=no`)).body.items.map((i: { name: string }) => i.name)).toEqual(['sky']);
    expect((await owner.get(`/api/teams/${team.id}/art?uploadedBy=${users.member.id}`)).body.total).toBe(1);
    const bad = await owner.get(`/api/teams/${team.id}/art?sort=colour&from=yesterday`);
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.body.error.fields).sort()).toEqual(['query.from', 'query.sort']);
  });
});

describe('keywords, bulk actions and deleting', () => {
  it('adds and removes a keyword on many items at once', async () => {
    const { team, member } = await setup();
    const ids = [];
    for (let i = 0; i < 3; i++) ids.push((await uploadFile(member, team.id, await shape(30 + i), `leaf-${i}.png`)).body.results[0].item.id);
    await member.post(`/api/teams/${team.id}/art/bulk`, { action: 'addKeyword', ids, keyword: 'Autumn' });
    expect((await member.get(`/api/teams/${team.id}/art?q=autumn`)).body.total).toBe(3);
    await member.post(`/api/teams/${team.id}/art/bulk`, { action: 'removeKeyword', ids: ids.slice(0, 2), keyword: 'autumn' });
    expect((await member.get(`/api/teams/${team.id}/art?q=autumn`)).body.total).toBe(1);
    const item = await member.get(`/api/teams/${team.id}/art/${ids[2]}`);
    expect(item.body.keywords).toEqual(['autumn']);
    expect(item.body.largestPrint.at300.widthMm).toBeCloseTo((160 / 300) * 25.4, 6);
    expect(item.body.largestPrint.at150.widthMm).toBeCloseTo((160 / 150) * 25.4, 6);
  });

  it('soft-deletes: members their own uploads only, admins any; the file stays for sheets that use it', async () => {
    const { team, admin, member } = await setup();
    const mine = (await uploadFile(member, team.id, await shape(40), 'mine.png')).body.results[0].item;
    const theirs = (await uploadFile(admin, team.id, await shape(41), 'theirs.png')).body.results[0].item;
    expect((await member.send('delete', `/api/teams/${team.id}/art/${theirs.id}`)).status).toBe(403);
    expect((await member.send('delete', `/api/teams/${team.id}/art/${mine.id}`)).status).toBe(204);
    expect((await member.get(`/api/teams/${team.id}/art/${mine.id}`)).status).toBe(404);
    expect((await member.get(`/api/teams/${team.id}/art`)).body.items.map((i: { id: string }) => i.id)).toEqual([theirs.id]);
    const row = await t.db.getRepository(ArtItem).findOneByOrFail({ id: mine.id });
    expect(row.deletedAt).not.toBeNull();
    expect(await storage.exists(row.storageKey)).toBe(true);
    expect((await admin.post(`/api/teams/${team.id}/art/bulk`, { action: 'delete', ids: [theirs.id] })).body).toEqual({ changed: 1 });
    // Uploading the same bytes again brings the item back instead of storing it twice.
    const back = await uploadFile(member, team.id, await shape(40), 'mine again.png');
    expect(back.body.results[0]).toMatchObject({ status: 'stored', item: { id: mine.id } });
  });
});

describe('cross-team access answers 404', () => {
  it('for art, collections, bulk actions and files of another team', async () => {
    const a = await setup();
    const b = await setup();
    const art = (await uploadFile(b.owner, b.team.id, await shape(50), 'secret.png')).body.results[0].item;
    const col = (await b.owner.post(`/api/teams/${b.team.id}/collections`, { name: 'Private' })).body;
    expect((await a.owner.get(`/api/teams/${b.team.id}/art`)).status).toBe(404);
    expect((await a.owner.get(`/api/teams/${a.team.id}/art/${art.id}`)).status).toBe(404);
    expect((await a.owner.get(`/api/teams/${a.team.id}/art/${art.id}/file`)).status).toBe(404);
    expect((await a.owner.send('patch', `/api/teams/${a.team.id}/collections/${col.id}`, { name: 'Mine now' })).status).toBe(404);
    expect((await a.owner.post(`/api/teams/${a.team.id}/art/bulk`, { action: 'delete', ids: [art.id] })).status).toBe(404);
    expect((await uploadFile(a.owner, a.team.id, await shape(51), 'x.png', { collectionId: col.id })).status).toBe(404);
    expect((await b.owner.get(`/api/teams/${b.team.id}/art/${art.id}`)).status).toBe(200);
  });
});
