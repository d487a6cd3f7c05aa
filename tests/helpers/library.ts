import { readdir } from 'node:fs/promises';
import path from 'node:path';
import type { Client } from './app';

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
