import path from 'node:path';
import { env } from './config/env';
import { createDataSource } from './db/data-source';
import { createApp } from './app';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from './db/demo/accounts';
import { createLog } from './lib/log';
import { createStorage } from './storage/create';
import { sweepStorage } from './storage/sweep';
import { startFakePayments } from './payments/fake-api';
import type { FakePayments } from './payments/fake-api';

const log = createLog(env);

async function main() {
  const dataSource = await createDataSource(env.DB_NAME, env, log).initialize();
  const storage = createStorage(env);
  const { app, close } = createApp({ env, dataSource, log, storage, clientDir: path.resolve('dist') });
  // No payments key: the local payments fake takes the SDK's calls and sends its notices here.
  let fakePayments: FakePayments | null = null;
  if (!env.STRIPE_SECRET_KEY) {
    const fakeUrl = new URL(env.PAYMENTS_FAKE_URL);
    fakePayments = await startFakePayments({
      host: fakeUrl.hostname,
      port: Number(fakeUrl.port),
      endpoints: [{ url: `${env.appUrl}/api/payments/notices`, secret: env.STRIPE_WEBHOOK_SECRET }],
    }).catch((error: NodeJS.ErrnoException) => {
      // Another app process of this install already runs it (several processes on one machine).
      if (error.code !== 'EADDRINUSE') throw error;
      log.info({ url: env.PAYMENTS_FAKE_URL }, 'payments fake already running');
      return null;
    });
    if (fakePayments) log.info({ url: fakePayments.url }, 'local payments fake: test payments only, no real money');
  }
  const server = app.listen(env.PORT, env.HOST);
  server.on('error', (error: NodeJS.ErrnoException) => {
    // Without this the process would print "running" and serve nothing.
    const reason =
      error.code === 'EADDRINUSE'
        ? `port ${env.PORT} on ${env.HOST} is already in use by another program. Stop it, or set PORT in .env to a free port.`
        : error.code === 'EACCES'
          ? `this user may not listen on port ${env.PORT}. Pick a port above 1024 (PORT in .env).`
          : error.message;
    log.fatal({ code: error.code }, `could not start: ${reason}`);
    console.error(`[sheetsmith] could not start: ${reason}`);
    void dataSource.destroy().finally(() => process.exit(1));
  });
  server.on('listening', () => {
    log.info({ host: env.HOST, port: env.PORT, demo: env.demoMode }, 'listening');
    const url = `http://${env.HOST}:${env.PORT}`;
    console.log(`\n  Sheetsmith is running at ${url}\n`);
    if (env.demoMode) {
      console.log(`  Demo sign-ins (password "${DEMO_PASSWORD}"):`);
      for (const account of DEMO_ACCOUNTS) console.log(`    ${account.email.padEnd(20)} ${account.role}`);
      console.log('');
    }
    console.log(`  Press Ctrl-C to stop.\n`);
  });

  // Files an interrupted upload left behind, replaced previews and the like: swept every six hours.
  const sweep = () =>
    sweepStorage(dataSource, storage, env.STORAGE_GRACE_HOURS * 3_600_000)
      .then((report) => log.info(report, 'storage sweep'))
      .catch((error) => log.warn({ err: error }, 'storage sweep failed'));
  setTimeout(sweep, 10 * 60_000).unref();
  setInterval(sweep, 6 * 3_600_000).unref();

  let stopping = false;
  const shutdown = (signal: string) => {
    if (stopping) return;
    stopping = true;
    console.log(`\n[sheetsmith] ${signal}: finishing open requests and stopping`);
    server.close(async () => {
      await close().catch(() => undefined);
      await fakePayments?.close().catch(() => undefined);
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
  console.error('[sheetsmith] could not start:', error instanceof Error ? error.message : error);
  process.exit(1);
});
