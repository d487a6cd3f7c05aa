import { createHash, randomBytes } from 'node:crypto';
import { mkdir, readFile, rename, rm, stat, writeFile } from 'node:fs/promises';
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
    if (!(await this.exists(key))) {
      await mkdir(path.dirname(file), { recursive: true });
      const tmp = `${file}.${randomBytes(6).toString('hex')}.tmp`;
      await writeFile(tmp, data);
      await rename(tmp, file);
    }
    return { key, size: data.length };
  }

  get(key: string): Promise<Buffer> {
    return readFile(this.pathOf(key));
  }

  async exists(key: string): Promise<boolean> {
    try {
      await stat(this.pathOf(key));
      return true;
    } catch {
      return false;
    }
  }

  async delete(key: string): Promise<void> {
    await rm(this.pathOf(key), { force: true });
  }
}
