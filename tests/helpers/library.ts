import { readdir } from 'node:fs/promises';
import path from 'node:path';
import { env } from '../../server/config/env';
import { LocalDiskStorage } from '../../server/storage/local-disk';
import { svgArt } from './art';
import { Client, makeTeamWithRoles, useTestApp } from './app';

export async function uploadFile(client: Client, teamId: string, file: Buffer, name: string, fields: Record<string, string> = {}) {
  if (!client.csrf) await client.refreshCsrf();
  let req = client.agent.post(`/api/teams/${teamId}/art`).set('x-csrf-token', client.csrf);
  for (const [k, v] of Object.entries(fields)) req = req.field(k, v);
  return req.attach('file', file, name);
}

/** Number of files in a storage folder: uploads that fail must leave it unchanged. */
export async function storedFileCount(root: string): Promise<number> {
  const walk = async (dir: string): Promise<number> => {
    let n = 0;
    for (const entry of await readdir(dir, { withFileTypes: true }).catch(() => [])) {
      n += entry.isDirectory() ? await walk(path.join(dir, entry.name)) : 1;
    }
    return n;
  };
  return walk(root);
}

/**
 * One test app for a library test file, with the file's own storage folder (so other suites running
 * alongside never change its file counts) and small pack limits; `setup()` makes a team with a
 * signed-in client per role; `shape(i)` is a distinct circle per index (no two are the same image).
 */
export function useLibraryTestApp(label: string) {
  const storageDir = path.join(env.dataDir, `storage-${label}`);
  const storage = new LocalDiskStorage(storageDir);
  const t = useTestApp({
    pool: true,
    extra: () => ({
      storage,
      packLimits: { maxEntries: 50, maxTotalBytes: 3 * 1024 * 1024, maxEntryBytes: 20 * 1024 * 1024, maxRatio: 200 },
    }),
  });
  const signedIn = async (email: string) => {
    const client = new Client(t.sheetsmith.app);
    await client.signIn(email);
    return client;
  };
  const setup = async () => {
    const { team, users } = await makeTeamWithRoles(t.db);
    const owner = await signedIn(users.owner.email);
    const admin = await signedIn(users.admin.email);
    const member = await signedIn(users.member.email);
    const viewer = await signedIn(users.viewer.email);
    return { team, users, owner, admin, member, viewer };
  };
  const shape = (i: number) =>
    svgArt(160, 160, `<circle cx="80" cy="80" r="${30 + i}" fill="#${(0x224466 + i * 0x101010).toString(16).slice(-6)}"/>`);
  return { t, storage, storageDir, setup, shape };
}
