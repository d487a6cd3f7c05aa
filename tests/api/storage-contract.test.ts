import { createHash } from 'node:crypto';
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { LocalDiskStorage } from '../../server/storage/local-disk';
import { S3Storage } from '../../server/storage/s3';
import type { Storage } from '../../server/storage/storage';
import { StorageKeyError } from '../../server/storage/storage';
import { startS3Fake } from '../helpers/s3-fake';

// One contract, two drivers: the local disk and S3 (against s3rver, a local S3 fake from npm, on
// loopback). Keys are the SHA-256 of the bytes (FIPS 180-4), checked with Node's own crypto.
const drivers: Array<{ name: string; make: () => Promise<{ storage: Storage; close: () => Promise<void> }> }> = [
  {
    name: 'local disk',
    make: async () => {
      const root = await mkdtemp(path.join(tmpdir(), 'ss-disk-'));
      return { storage: new LocalDiskStorage(root), close: () => rm(root, { recursive: true, force: true }) };
    },
  },
  {
    name: 'S3 (s3rver)',
    make: async () => {
      const fake = await startS3Fake();
      return { storage: new S3Storage({ ...fake.settings, prefix: 'files' }), close: fake.close };
    },
  },
];

describe.each(drivers)('storage contract: $name', ({ make }) => {
  let storage: Storage;
  let close: () => Promise<void>;
  beforeAll(async () => ({ storage, close } = await make()));
  afterAll(() => close());

  it('stores bytes under their SHA-256 and gives the same bytes back', async () => {
    const data = Buffer.from('a hedgehog sticker, 2 in wide');
    const { key, size } = await storage.put(data);
    expect(key).toBe(createHash('sha256').update(data).digest('hex'));
    expect(size).toBe(data.length);
    expect(await storage.exists(key)).toBe(true);
    expect(Buffer.compare(await storage.get(key), data)).toBe(0);
    // A larger binary body survives byte for byte.
    const big = Buffer.alloc(3 * 1024 * 1024, 0);
    for (let i = 0; i < big.length; i += 4099) big[i] = i % 251;
    const stored = await storage.put(big);
    expect(Buffer.compare(await storage.get(stored.key), big)).toBe(0);
  });

  it('stores the same bytes once and renews their time when put again', async () => {
    const data = Buffer.from(`renewed ${Math.random()}`);
    const first = await storage.put(data);
    const before = (await storage.modifiedAt(first.key))!;
    await new Promise((r) => setTimeout(r, 1100)); // S3 times have whole seconds
    const again = await storage.put(data);
    expect(again.key).toBe(first.key);
    expect((await storage.modifiedAt(first.key))!.getTime()).toBeGreaterThan(before.getTime());
    let copies = 0;
    for await (const entry of storage.list()) if (entry.key === first.key) copies++;
    expect(copies).toBe(1);
  });

  it('lists what it holds, deletes, and reports a missing key as ENOENT', async () => {
    const { key } = await storage.put(Buffer.from(`listed ${Math.random()}`));
    const keys: string[] = [];
    for await (const entry of storage.list()) keys.push(entry.key);
    expect(keys).toContain(key);
    await storage.delete(key);
    expect(await storage.exists(key)).toBe(false);
    expect(await storage.modifiedAt(key)).toBeNull();
    await expect(storage.get(key)).rejects.toMatchObject({ code: 'ENOENT' });
    await storage.delete(key); // deleting twice is fine
  });

  it('refuses anything that is not a storage key (no path tricks)', async () => {
    await expect(storage.get('../../etc/passwd')).rejects.toBeInstanceOf(StorageKeyError);
    await expect(storage.exists('ab/cd')).rejects.toBeInstanceOf(StorageKeyError);
  });
});
