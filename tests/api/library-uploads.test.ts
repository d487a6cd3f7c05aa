import { zipSync } from 'fflate';
import JSZip from 'jszip';
import sharp from 'sharp';
import { describe, expect, it } from 'vitest';
import { ArtItem } from '../../server/modules/art/art-item.entity';
import { storedFileCount, uploadFile, useLibraryTestApp } from '../helpers/library';
import { pngHeaderClaiming } from '../helpers/png';

const { t, storageDir, setup, shape } = useLibraryTestApp('library-uploads-test');

describe('zip packs', () => {
  it('unpacks images, skips and reports the rest, turns folders into keywords; a reference unzip sees the same entries', async () => {
    const { team, member } = await setup();
    const files: Record<string, Uint8Array> = {
      'Garden_Pack/Tulips/red-tulip.png': await shape(60),
      'Garden_Pack/Tulips/pink-tulip.png': await shape(61),
      'Garden_Pack/bee.jpg': await sharp(await shape(62))
        .flatten({ background: '#ffffff' })
        .jpeg()
        .toBuffer(),
      'Garden_Pack/readme.txt': new TextEncoder().encode('Thanks for downloading!'),
      'Garden_Pack/extras.zip': zipSync({ 'inner.png': await shape(63) }),
      '__MACOSX/Garden_Pack/._bee.jpg': new Uint8Array([0, 5, 22, 7]),
      'Garden_Pack/copy-of-red-tulip.png': await shape(60),
    };
    const zip = Buffer.from(zipSync(files));
    // The reference: JSZip (an independent unzip package, test-only) lists the same file entries.
    const reference = Object.values((await JSZip.loadAsync(zip)).files)
      .filter((f) => !f.dir)
      .map((f) => f.name)
      .sort();
    expect(reference).toEqual(Object.keys(files).sort());

    const res = await uploadFile(member, team.id, zip, 'garden.zip', { keywords: 'spring' });
    expect(res.status).toBe(201);
    const byFile = Object.fromEntries(res.body.results.map((r: { file: string; status: string }) => [r.file, r.status]));
    expect(Object.keys(byFile).sort()).toEqual(reference);
    expect(byFile).toEqual({
      'Garden_Pack/Tulips/red-tulip.png': 'stored',
      'Garden_Pack/Tulips/pink-tulip.png': 'stored',
      'Garden_Pack/bee.jpg': 'stored',
      'Garden_Pack/readme.txt': 'skipped',
      'Garden_Pack/extras.zip': 'skipped',
      '__MACOSX/Garden_Pack/._bee.jpg': 'skipped',
      'Garden_Pack/copy-of-red-tulip.png': 'duplicate',
    });
    const tulip = res.body.results.find((r: { file: string }) => r.file === 'Garden_Pack/Tulips/red-tulip.png').item;
    expect(tulip.keywords).toEqual(expect.arrayContaining(['garden', 'spring', 'tulip']));
    expect((await member.get(`/api/teams/${team.id}/art?q=tulips`)).body.total).toBe(2);
    const again = await uploadFile(member, team.id, zip, 'garden.zip');
    expect(again.body.results.filter((r: { status: string }) => r.status === 'stored')).toEqual([]);
    expect(await t.db.getRepository(ArtItem).countBy({ teamId: team.id })).toBe(3);
  });
});

describe('nothing to cut inside a pack', () => {
  it('refuses the empty images by name with the reason and stores the rest', async () => {
    const { team, member } = await setup();
    const clear = await sharp({ create: { width: 120, height: 90, channels: 4, background: { r: 0, g: 0, b: 0, alpha: 0 } } })
      .png()
      .toBuffer();
    const zip = Buffer.from(zipSync({ 'pack/ghost.png': await shape(80), 'pack/layer-empty.png': clear }));
    const res = await uploadFile(member, team.id, zip, 'pack.zip');
    expect(res.status).toBe(201);
    const byFile = Object.fromEntries(res.body.results.map((r: { file: string }) => [r.file, r]));
    expect(byFile['pack/ghost.png'].status).toBe('stored');
    expect(byFile['pack/layer-empty.png']).toMatchObject({
      status: 'rejected',
      reason: expect.stringMatching(/^Nothing to cut: every pixel/),
    });
    expect(await t.db.getRepository(ArtItem).countBy({ teamId: team.id })).toBe(1);
  });
});

describe('bad uploads: a clear message each, and nothing half-stored', () => {
  const encrypt = (zip: Uint8Array) => {
    // Set bit 0 (encrypted) of the general purpose flags in every local and central header
    // (APPNOTE.TXT §4.3.7 and §4.3.12, flags at offsets 6 and 8).
    const out = Buffer.from(zip);
    for (let i = 0; i < out.length - 4; i++) {
      const sig = out.readUInt32LE(i);
      if (sig === 0x04034b50) out[i + 6] |= 1;
      if (sig === 0x02014b50) out[i + 8] |= 1;
    }
    return out;
  };
  const noise = async (seed: number) => {
    const raw = Buffer.alloc(700 * 700 * 4);
    let s = seed;
    for (let i = 0; i < raw.length; i++) raw[i] = (s = (s * 1103515245 + 12345) & 0x7fffffff) >> 16;
    return sharp(raw, { raw: { width: 700, height: 700, channels: 4 } })
      .png({ compressionLevel: 0 })
      .toBuffer();
  };

  const cases: Array<[string, () => Promise<[Buffer, string]>, number, RegExp]> = [
    ['a corrupt image', async () => [(await shape(70)).subarray(0, 200), 'broken.png'], 422, /damaged or cut short/],
    ['a text file renamed to .png', async () => [Buffer.from('just words, honestly'), 'words.png'], 415, /not an image/],
    [
      'an image over the pixel limit',
      async () => [pngHeaderClaiming(30000, 30000), 'huge.png'],
      422,
      /30000 × 30000 px; the limit is 50 megapixels/,
    ],
    [
      'a zip with ../ entries',
      async () => [Buffer.from(zipSync({ 'ok.png': await shape(71), '../escape.png': await shape(72) })), 'evil.zip'],
      422,
      /"\.\.\/escape\.png"\) whose path points outside the zip's own folder/,
    ],
    [
      'a zip bomb (compression ratio)',
      async () => [
        Buffer.from(zipSync({ 'good.png': await shape(73), 'bomb.png': new Uint8Array(12 * 1024 * 1024) }, { level: 9 })),
        'bomb.zip',
      ],
      422,
      /looks like a zip bomb/,
    ],
    [
      'a zip over the total size',
      async () => [
        Buffer.from(zipSync({ 'a.png': await noise(1), 'b.png': await noise(2), 'c.png': await noise(3) }, { level: 0 })),
        'big.zip',
      ],
      422,
      /more than 3 MB in all/,
    ],
    [
      'a fully transparent PNG (nothing to cut)',
      async () => [
        await sharp({ create: { width: 200, height: 200, channels: 4, background: { r: 255, g: 0, b: 0, alpha: 0 } } })
          .png()
          .toBuffer(),
        'blank.png',
      ],
      422,
      /^Nothing to cut: every pixel of this image is transparent or nearly so\./,
    ],
    [
      'a flat white JPEG, a background without its art (nothing to cut)',
      async () => [
        await sharp({ create: { width: 300, height: 200, channels: 3, background: '#ffffff' } })
          .jpeg()
          .toBuffer(),
        'white.jpg',
      ],
      422,
      /^Nothing to cut: this image is one flat colour \(#ffffff\) from edge to edge/,
    ],
    ['an encrypted zip', async () => [encrypt(zipSync({ 'secret.png': await shape(74) })), 'locked.zip'], 422, /password-protected/],
    [
      'a 60 MB file over the upload limit',
      async () => [Buffer.alloc(60 * 1024 * 1024, 7), 'enormous.png'],
      413,
      /^That file is larger than the 50 MB limit for this upload\.$/,
    ],
  ];

  for (const [label, make, status, message] of cases) {
    it(label, async () => {
      const { team, member } = await setup();
      const filesBefore = await storedFileCount(storageDir);
      const [file, name] = await make();
      const res = await uploadFile(member, team.id, file, name);
      expect(res.status).toBe(status);
      expect(res.body.error.message).toMatch(message);
      expect(await t.db.getRepository(ArtItem).countBy({ teamId: team.id })).toBe(0);
      expect(await storedFileCount(storageDir)).toBe(filesBefore);
    });
  }
});
