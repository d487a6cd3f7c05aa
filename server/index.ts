import path from 'node:path';
import { env } from './config/env';
import { createDataSource } from './db/data-source';
import { createApp } from './app';
import { DEMO_PASSWORD, DEMO_ACCOUNTS } from '../scripts/demo-accounts';

async function main() {
  const dataSource = await createDataSource().initialize();
  const { app, close } = createApp({ env, dataSource, clientDir: path.resolve('dist') });
  const server = app.listen(env.PORT, env.HOST, () => {
    const url = `http://${env.HOST}:${env.PORT}`;
    console.log(`\n  Sheetsmith is running at ${url}\n`);
    console.log(`  Demo sign-ins (password "${DEMO_PASSWORD}"):`);
    for (const account of DEMO_ACCOUNTS) console.log(`    ${account.email.padEnd(20)} ${account.role}`);
    console.log(`\n  Press Ctrl-C to stop the app and its database.\n`);
  });

  let stopping = false;
  const shutdown = (signal: string) => {
    if (stopping) return;
    stopping = true;
    console.log(`\n[sheetsmith] ${signal}: finishing open requests and stopping`);
    server.close(async () => {
      await close().catch(() => undefined);
      await dataSource.destroy().catch(() => undefined);
      process.exit(0);
    });
    server.closeIdleConnections();
    setTimeout(() => process.exit(0), 5000).unref();
  };
  process.on('SIGINT', () => shutdown('SIGINT'));
  process.on('SIGTERM', () => shutdown('SIGTERM'));
}

main().catch((error) => {
  console.error('[sheetsmith] could not start:', error);
  process.exit(1);
});
