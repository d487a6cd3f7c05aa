import { createHash, randomBytes } from 'node:crypto';
import { mkdir, readdir, readFile, rename, rm, stat, utimes, writeFile } from 'node:fs/promises';
import path from 'node:path';
import type { Storage } from './storage';
import { KEY_PATTERN, StorageKeyError } from './storage';

/** Content-addressed files under `root/ab/cd/<sha256>`, written to a temp name and renamed (atomic). */
export class LocalDiskStorage implements Storage {
  constructor(private readonly root: string) {}

  private pathOf(key: string): string {
    if (!KEY_PATTERN.test(key)) throw new StorageKeyError(`Not a storage key: ${key.slice(0, 80)}`);
    return path.join(this.root, key.slice(0, 2), key.slice(2, 4), key);
  }

  async put(data: Buffer) {
    const key = createHash('sha256').update(data).digest('hex');
    const file = this.pathOf(key);
    if (await this.exists(key)) {
      // Re-putting the same bytes renews the file, so a sweep never takes what a new row is about to use.
      const now = new Date();
      await utimes(file, now, now).catch(() => undefined);
    } else {
      await mkdir(path.dirname(file), { recursive: true });
      const tmp = `${file}.${randomBytes(6).toString('hex')}.tmp`;
      await writeFile(tmp, data);
      await rename(tmp, file);
    }
    return { key, size: data.length };
  }

  async get(key: string): Promise<Buffer> {
    return readFile(this.pathOf(key));
  }

  async exists(key: string): Promise<boolean> {
    const file = this.pathOf(key);
    try {
      await stat(file);
      return true;
    } catch {
      return false;
    }
  }

  async delete(key: string): Promise<void> {
    await rm(this.pathOf(key), { force: true });
  }

  async modifiedAt(key: string): Promise<Date | null> {
    try {
      return (await stat(this.pathOf(key))).mtime;
    } catch {
      return null;
    }
  }

  /** Walks root/ab/cd/; half-written `.tmp` files are listed under their own name for the sweep to clear. */
  async *list(): AsyncIterable<{ key: string; modifiedAt: Date }> {
    const dirs = async (dir: string) =>
      (await readdir(dir, { withFileTypes: true }).catch(() => []))
        .filter((d) => d.isDirectory() && /^[0-9a-f]{2}$/.test(d.name))
        .map((d) => d.name);
    for (const a of await dirs(this.root)) {
      for (const b of await dirs(path.join(this.root, a))) {
        const folder = path.join(this.root, a, b);
        for (const name of await readdir(folder).catch(() => [] as string[])) {
          const info = await stat(path.join(folder, name)).catch(() => null);
          if (info?.isFile()) yield { key: name, modifiedAt: info.mtime };
        }
      }
    }
  }

  /** Removes a leftover temporary file from an interrupted write (the sweep's job). */
  async deleteLeftover(name: string): Promise<void> {
    if (!/^[0-9a-f]{64}\.[0-9a-f]{12}\.tmp$/.test(name)) return;
    await rm(path.join(this.root, name.slice(0, 2), name.slice(2, 4), name), { force: true });
  }
}
