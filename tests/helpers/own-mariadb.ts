import { execFile } from 'node:child_process';
import { createServer } from 'node:net';
import path from 'node:path';
import { promisify } from 'node:util';
import { env } from '../../server/config/env';

const run = promisify(execFile);

async function freePort(): Promise<number> {
  const server = createServer();
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const { port } = server.address() as { port: number };
  await new Promise((resolve) => server.close(resolve));
  return port;
}

/**
 * A MariaDB server of the test's own, started and stopped by the project's scripts (scripts/env.sh)
 * with a data folder under the test data folder and a free loopback port: a test may stop it
 * without touching the database every other suite uses.
 */
export async function ownMariaDb(label: string) {
  const port = await freePort();
  const dataDir = path.join(env.dataDir, `own-db-${label}`);
  const database = `sheetsmith_${label}`;
  const shell = (script: string) =>
    run('bash', ['-c', `. scripts/env.sh && ${script}`], {
      env: { ...process.env, DATA_DIR: dataDir, DB_PORT: String(port) },
      timeout: 120_000,
    });
  return {
    port,
    database,
    dbEnv: { DB_HOST: '127.0.0.1', DB_PORT: port, DB_USER: env.DB_USER, DB_PASSWORD: env.DB_PASSWORD },
    start: () => shell(`start_db && ensure_database ${database}`),
    stop: () => shell('stop_db'),
  };
}
