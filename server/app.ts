import { refreshTerms } from './modules/art/terms';
import path from 'node:path';
import { existsSync } from 'node:fs';
import express from 'express';
import session from 'express-session';
import MySQLStoreFactory from 'express-mysql-session';
import { csrfSync } from 'csrf-sync';
import type { DataSource } from 'typeorm';
import type { Env } from './config/env';
import type { Mailer } from './mail/mailer';
import { createMailer } from './mail/mailer';
import { apiNotFound, errorHandler } from './middleware/errors';
import { noStore, securityHeaders } from './middleware/security-headers';
import type { Log } from './lib/log';
import { createLog, requestLog } from './lib/log';
import { AuthService } from './modules/auth/auth.service';
import { authRouter, SESSION_COOKIE_NAME } from './modules/auth/auth.router';
import { sessionGuard } from './modules/auth/session-guard';
import { createPassport } from './modules/auth/passport';
import { SignInThrottle } from './modules/auth/throttle';
import { limitRules, RateLimits } from './lib/rate-limits';
import { outboxRouter } from './modules/dev/outbox.router';
import { healthRouter } from './modules/health/health.router';
import { TeamsService } from './modules/teams/teams.service';
import { teamsRouter } from './modules/teams/teams.router';
import { artRouter } from './modules/art/art.router';
import { ArtService } from './modules/art/art.service';
import { CollectionsService } from './modules/collections/collections.service';
import { collectionsRouter } from './modules/collections/collections.router';
import type { PackLimits } from './modules/art/zip-pack';
import { ProfilesService } from './modules/sheets/profiles.service';
import { SheetsService } from './modules/sheets/sheets.service';
import { sheetsRouter } from './modules/sheets/sheets.router';
import { ExportsService } from './modules/exports/exports.service';
import { exportsRouter } from './modules/exports/exports.router';
import { JobQueues } from './jobs/queues';
import { jobSettingsFrom, startAnalysisWorker, startArrangeWorker, startExportWorker, startOutlineWorker } from './jobs/workers';
import { ArrangeRunsService } from './modules/arrange/arrange.service';
import { arrangeRouter } from './modules/arrange/arrange.router';
import { defaultThreads } from './engine/arrange/parallel';
import { OutlineService } from './modules/outlines/outline.service';
import { outlinesRouter } from './modules/outlines/outlines.router';
import { OutlinePool } from './engine/outline/pool';
import { CostingService } from './modules/shop/costing.service';
import { MachinesService } from './modules/shop/machines.service';
import { RunsService } from './modules/shop/runs.service';
import { SheetAnalysisService } from './modules/shop/sheet-analysis.service';
import { shopRouter } from './modules/shop/shop.router';
import { StockService } from './modules/shop/stock.service';
import { createStorage } from './storage/create';
import { createPayments } from './payments/client';
import type { Payments } from './payments/client';
import { OrdersService } from './modules/orders/orders.service';
import { ProofsService } from './modules/orders/proofs.service';
import { PaymentsService } from './modules/orders/payments.service';
import { ordersRouter } from './modules/orders/orders.router';
import { proofPageRouter } from './modules/orders/proof-page';
import { paymentNoticesRoute } from './modules/orders/notices.route';
import { OrderProduction } from './modules/orders/production';
import type { Storage } from './storage/storage';

export type AppOptions = {
  env: Env;
  dataSource: DataSource;
  mailer?: Mailer;
  storage?: Storage;
  /** Outline worker pool; shared between apps in tests, made per app otherwise. */
  outlinePool?: OutlinePool;
  packLimits?: PackLimits;
  /** Extra API routes mounted after the built-in ones (tests use this for probes). */
  extraApi?: (api: express.Router) => void;
  /** Folder with the built client; served with a fallback to index.html for client routes. */
  clientDir?: string;
  /** Where logs go; made from the environment when not given. */
  log?: Log;
  /** Separates rate-limit counters of apps sharing one database (tests give each app its own). */
  rateLimitPrefix?: string;
  /** Separates job queues of apps sharing one Redis (tests give each app its own); QUEUE_PREFIX otherwise. */
  queuePrefix?: string;
  /** The payments SDK client; made from the environment when not given. */
  payments?: Payments;
};

export type SheetsmithApp = { app: express.Express; close: () => Promise<void> };

/** Builds the Express app without listening, so tests drive it with supertest. */
export function createApp({
  env,
  dataSource,
  mailer = createMailer(env),
  storage = createStorage(env),
  outlinePool,
  packLimits,
  extraApi,
  clientDir,
  rateLimitPrefix = 'ss',
  queuePrefix = env.QUEUE_PREFIX,
  log = createLog(env),
  payments = createPayments(env),
}: AppOptions): SheetsmithApp {
  const app = express();
  app.disable('x-powered-by');
  if (env.COOKIE_SECURE) app.set('trust proxy', 1);
  app.use(requestLog(log));
  app.use(securityHeaders(env));

  const MySQLStore = MySQLStoreFactory(session as never);
  const store = new MySQLStore({
    host: env.DB_HOST,
    port: env.DB_PORT,
    user: env.DB_USER,
    password: env.DB_PASSWORD,
    database: dataSource.options.database as string,
    createDatabaseTable: false, // the migration made it
    // Idle timeout: a row unused this long expires (rolling cookies renew it on every request).
    expiration: env.SESSION_IDLE_SECONDS * 1000,
    clearExpired: true,
    schema: { tableName: 'sessions', columnNames: { session_id: 'session_id', expires: 'expires', data: 'data' } },
  });

  const { csrfSynchronisedProtection, generateToken } = csrfSync({
    getTokenFromRequest: (req) => req.get('x-csrf-token') ?? undefined,
  });

  const auth = new AuthService(dataSource, mailer, env);
  const teams = new TeamsService(dataSource, mailer, env);
  const passport = createPassport(auth);
  const throttle = new SignInThrottle(dataSource, env, rateLimitPrefix);
  const limits = new RateLimits(dataSource, limitRules(env), rateLimitPrefix);
  const ownPool = !outlinePool;
  const pool =
    outlinePool ??
    new OutlinePool(
      { maxInputPixels: env.OUTLINE_MAX_PIXELS, maxOutputPixels: env.OUTLINE_MAX_OUTPUT_PIXELS },
      env.OUTLINE_THREADS || undefined,
    );
  const art = new ArtService(dataSource, storage, env.OUTLINE_MAX_PIXELS, packLimits);
  const collections = new CollectionsService(dataSource, storage, refreshTerms);
  const profiles = new ProfilesService(dataSource);
  const sheets = new SheetsService(dataSource, storage, profiles);
  const jobSettings = jobSettingsFrom(env, queuePrefix);
  const queues = new JobQueues(jobSettings);
  const outlines = new OutlineService(dataSource, storage, pool, queues);
  const analysis = new SheetAnalysisService(dataSource, storage, outlines, queues);
  const exportsService = new ExportsService(dataSource, storage, pool, sheets, analysis, log, queues);
  const workers = env.WORKERS_EMBEDDED
    ? [
        startExportWorker(exportsService, jobSettings, env, log, 'embedded'),
        startOutlineWorker(outlines, jobSettings, log, 'embedded', Math.max(2, pool.size)),
        startArrangeWorker(queues, jobSettings, log, 'embedded', env.ARRANGE_THREADS || defaultThreads()),
        startAnalysisWorker(analysis, jobSettings, log, 'embedded'),
      ]
    : [];
  const arrangeRuns = new ArrangeRunsService(sheets, queues);
  // Running exports whose job the queue no longer runs end as failed, even if nobody looks at them.
  const reconciler = setInterval(() => void exportsService.reconcile().catch(() => undefined), 15_000);
  reconciler.unref();
  const stock = new StockService(dataSource);
  const machines = new MachinesService(dataSource);
  const runs = new RunsService(dataSource, storage, sheets, stock, machines, analysis);
  const costing = new CostingService(dataSource, sheets, analysis);
  const orders = new OrdersService(dataSource, profiles, costing);
  const proofs = new ProofsService(dataSource, orders, outlines, profiles, storage, mailer, env);
  const orderPayments = new PaymentsService(dataSource, orders, payments, mailer, log);
  const production = new OrderProduction(dataSource, orders, outlines, profiles, sheets, costing, analysis, {
    seconds: 3,
    threads: env.ARRANGE_THREADS || defaultThreads(),
  });
  orders.costOf = (teamId, orderId) => production.costMinor(teamId, orderId);
  // The payment service's notices come signed over the exact bytes: read raw, before any JSON parser.
  app.post('/api/payments/notices', ...paymentNoticesRoute(orderPayments));
  app.use(proofPageRouter({ proofs, payments: orderPayments, limits, appUrl: env.appUrl, paymentsOrigin: payments.checkoutOrigin }));

  const api = express.Router();
  api.use(noStore);
  api.use(express.json({ limit: '1mb' }));
  api.use(
    session({
      name: SESSION_COOKIE_NAME,
      secret: env.SESSION_SECRET,
      store,
      resave: false,
      saveUninitialized: false,
      rolling: true,
      cookie: { httpOnly: true, sameSite: 'lax', secure: env.COOKIE_SECURE, maxAge: env.SESSION_IDLE_SECONDS * 1000 },
    }),
  );
  api.use(passport.initialize());
  api.use(passport.session());
  api.use(sessionGuard(env));
  api.use(healthRouter(dataSource));
  // Every state-changing route needs the session's token in X-CSRF-Token (GET/HEAD/OPTIONS are exempt).
  api.use(csrfSynchronisedProtection);
  api.use(authRouter({ auth, passport, throttle, limits, csrfToken: generateToken }));
  api.use(teamsRouter({ dataSource, teams, auth, limits, csrfToken: generateToken }));
  api.use(artRouter({ dataSource, art, sheetsUsing: (teamId, ids) => sheets.usingArt(teamId, ids), maxBytes: env.ART_MAX_BYTES }));
  api.use(sheetsRouter({ dataSource, sheets, profiles, listExtras: (teamId, list) => costing.attach(teamId, list) }));
  api.use(exportsRouter({ dataSource, exports: exportsService }));
  api.use(arrangeRouter({ dataSource, runs: arrangeRuns }));
  api.use(shopRouter({ dataSource, sheets, stock, machines, runs, costing, analysis }));
  api.use(collectionsRouter({ dataSource, collections }));
  api.use(outlinesRouter({ dataSource, art, outlines }));
  api.use(ordersRouter({ dataSource, orders, proofs, payments: orderPayments, production, env }));
  // The outbox holds reset links: listed in development and on a laptop (demo mode: loopback only), never on a shop's server.
  if (mailer.outboxDir && (env.NODE_ENV !== 'production' || env.demoMode)) api.use(outboxRouter(mailer.outboxDir));
  extraApi?.(api);
  api.use(apiNotFound);
  api.use(errorHandler);
  app.use('/api', api);

  if (clientDir && existsSync(path.join(clientDir, 'index.html'))) {
    app.use(express.static(clientDir, { index: false, maxAge: '1h' }));
    app.get(/^(?!\/api\/).*/, (_req, res) => res.sendFile(path.join(clientDir, 'index.html')));
  }

  return {
    app,
    close: async () => {
      clearInterval(reconciler);
      await Promise.allSettled(workers.map((w) => w.waitUntilReady()));
      await Promise.all(workers.map((w) => w.close()));
      await queues.close();
      await store.close();
      if (ownPool) await pool.close();
    },
  };
}
