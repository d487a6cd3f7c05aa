import sharp from 'sharp';
import { describe, expect, it } from 'vitest';
import { svgArt } from '../helpers/art';
import { In } from 'typeorm';
import { inTransaction } from '../../server/db/transaction';
import { Team } from '../../server/modules/accounts/team.entity';
import { Client, makeTeam, makeTeamWithRoles, useTestApp } from '../helpers/app';
import { uploadFile } from '../helpers/library';
import { testPiece } from '../helpers/sheets';

// A shop of three works at once: saves and uploads that run side by side must all succeed.
// Before the retrying transaction helper and the ordered diffs, 12 of 20 parallel saves and 7 of
// 20 parallel uploads answered 500 (MariaDB deadlock 1213 on sheet_art and art_terms).
const t = useTestApp({ pool: true });

async function shop() {
  const { team, users } = await makeTeamWithRoles(t.db);
  const member = new Client(t.sheetsmith.app);
  await member.signIn(users.member.email);
  return { team, member };
}

/** A distinct, noisy image per index, so every upload stores a new item with its own terms. */
const noisyArt = (i: number, size = 400) =>
  sharp({
    create: {
      width: size,
      height: size,
      channels: 4,
      background: { r: 0, g: 0, b: 0, alpha: 1 },
      noise: { type: 'gaussian', mean: 120 + i, sigma: 40 },
    },
  })
    .png()
    .toBuffer();

describe('concurrent work', () => {
  it('20 parallel saves of 20 different sheets that share art all succeed, twice over', async () => {
    const { team, member } = await shop();
    const arts: Array<{ id: string }> = [];
    for (let i = 0; i < 3; i++)
      arts.push(
        (
          await uploadFile(
            member,
            team.id,
            await svgArt(200, 200, `<circle cx="100" cy="100" r="${60 + i * 10}" fill="#2a6"/>`),
            `dot-${i}.png`,
          )
        ).body.results[0].item,
      );
    const sheets: Array<{ id: string; document: { pieces: unknown[] } }> = [];
    for (let i = 0; i < 20; i++) sheets.push((await member.post(`/api/teams/${team.id}/sheets`, { name: `Parallel ${i}` })).body);
    for (const round of [1, 2]) {
      const results = await Promise.all(
        sheets.map((sheet, i) => {
          const pieces = arts.map((art, k) => testPiece(`p${k}`, art.id, 30 + 45 * k, 40 + round, { width: 30 }));
          // Each sheet uses a different subset of the shared art, so the sheet_art rows change.
          const document = { ...sheet.document, pieces: pieces.filter((_, k) => (i + k + round) % 3 !== 0) };
          return member.send('put', `/api/teams/${team.id}/sheets/${sheet.id}`, { version: round, document });
        }),
      );
      expect(results.map((r) => r.status)).toEqual(sheets.map(() => 200));
    }
    const read = await member.get(`/api/teams/${team.id}/sheets/${sheets[7].id}`);
    expect(read.body.version).toBe(3);
  });

  it('20 parallel uploads with keywords all succeed and are all searchable', async () => {
    const { team, member } = await shop();
    const results = await Promise.all(
      Array.from({ length: 20 }, async (_, i) =>
        uploadFile(member, team.id, await noisyArt(i), `market-critter-${i}.png`, { keywords: 'autumn, market, critter' }),
      ),
    );
    expect(results.map((r) => r.status)).toEqual(results.map(() => 201));
    const found = await member.get(`/api/teams/${team.id}/art?q=critter&pageSize=50`);
    expect(found.body.total).toBe(20);
  });

  it('parallel keyword edits of different art in one collection all succeed', async () => {
    const { team, member } = await shop();
    const items: Array<{ id: string }> = [];
    for (let i = 0; i < 12; i++)
      items.push((await uploadFile(member, team.id, await noisyArt(i, 64), `leaf-${i}.png`)).body.results[0].item);
    const edits = await Promise.all(
      items.map((item, i) =>
        member.send('patch', `/api/teams/${team.id}/art/${item.id}`, { keywords: ['leaf', `batch${i % 3}`, 'green'] }),
      ),
    );
    expect(edits.map((r) => r.status)).toEqual(items.map(() => 200));
    expect((await member.get(`/api/teams/${team.id}/art?q=batch1&pageSize=50`)).body.total).toBe(4);
  });
});

describe('the transaction helper', () => {
  it('runs a deadlock victim again: two transactions locking two rows in opposite order both commit', async () => {
    const a = await makeTeam(t.db, 'lock-a');
    const b = await makeTeam(t.db, 'lock-b');
    let attempts = 0;
    // Both transactions take their first lock, wait until the other has too, then ask for the
    // other's row: InnoDB must pick a victim (errno 1213), which the helper runs again.
    let arrived = 0;
    const bothLocked = () =>
      new Promise<void>((resolve) => {
        arrived++;
        const poll = () => (arrived >= 2 ? resolve() : setTimeout(poll, 5));
        poll();
      });
    const swap = (first: string, second: string, label: string) =>
      inTransaction(t.db, async (manager) => {
        attempts++;
        await manager.update(Team, { id: first }, { name: `${label}-1` });
        if (attempts <= 2) await bothLocked();
        await manager.update(Team, { id: second }, { name: `${label}-2` });
      });
    await Promise.all([swap(a.id, b.id, 'ab'), swap(b.id, a.id, 'ba')]);
    expect(attempts).toBe(3);
    const names = (await t.db.getRepository(Team).findBy({ id: In([a.id, b.id]) })).map((x) => x.name).sort();
    expect(names.every((n) => /^(ab|ba)-[12]$/.test(n))).toBe(true);
  });

  it('does not retry other errors', async () => {
    let attempts = 0;
    await expect(
      inTransaction(t.db, async (manager) => {
        attempts++;
        await manager.query('SELECT * FROM no_such_table');
      }),
    ).rejects.toThrow(/no_such_table/);
    expect(attempts).toBe(1);
  });
});

describe('the same image uploaded by two people at once', () => {
  it('is stored once; the other uploads are told it is already in the library', async () => {
    const { team, member } = await shop();
    const image = await noisyArt(77, 120);
    const results = await Promise.all(Array.from({ length: 6 }, () => uploadFile(member, team.id, image, 'twin.png')));
    expect(results.map((r) => r.status).sort()).toEqual([200, 200, 200, 200, 200, 201]);
    expect(results.flatMap((r) => r.body.results.map((x: { status: string }) => x.status)).sort()).toEqual([
      'duplicate',
      'duplicate',
      'duplicate',
      'duplicate',
      'duplicate',
      'stored',
    ]);
  });
});
