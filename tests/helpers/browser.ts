import { mkdirSync } from 'node:fs';
import type { AddressInfo } from 'node:net';
import type { Server } from 'node:http';
import { createServer } from 'node:net';
import path from 'node:path';
import { afterAll, beforeAll } from 'vitest';
import { chromium } from 'playwright-core';
import type { Browser, Page } from 'playwright-core';
import { TEST_PASSWORD, openDatabase, unique } from './app';
import type { DataSource } from 'typeorm';
import { createApp } from '../../server/app';
import { env } from '../../server/config/env';
import type { Env } from '../../server/config/env';
import type { AppOptions } from '../../server/app';

const SCREENSHOT_DIR = path.resolve('tests/output/screenshots');

/**
 * Time allowed for one browser test. A browser test is a chain of real steps (sign-in, uploads,
 * outlines, saves), and with Chromium, the app and MariaDB sharing two cores beside another test
 * worker, it can take well past the 30 s the other tests get. Each wait inside has its own limit.
 */
export const BROWSER_TEST_TIMEOUT = 90_000;

/** Debian's Chromium, headless, with the flags this machine needs (no background networking). */
export function launchChromium(): Promise<Browser> {
  return chromium.launch({
    executablePath: '/usr/bin/chromium',
    args: [
      '--headless',
      '--no-sandbox',
      '--disable-gpu',
      '--disable-quic',
      '--no-first-run',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
    ],
  });
}

/** A port free on loopback just now (for an app that must know its own address before it starts). */
export async function freePort(): Promise<number> {
  const probe = createServer();
  await new Promise<void>((resolve) => probe.listen(0, '127.0.0.1', resolve));
  const { port } = probe.address() as AddressInfo;
  await new Promise((resolve) => probe.close(resolve));
  return port;
}

/** The real app (API + built client) listening on a free loopback port (or `options.port`). */
export async function serveApp(dataSource: DataSource, options: { env?: Partial<Env>; port?: number; extra?: Partial<AppOptions> } = {}) {
  const sheetsmith = createApp({
    env: { ...env, ...options.env },
    dataSource,
    clientDir: path.resolve('dist'),
    rateLimitPrefix: unique('e2e'),
    queuePrefix: unique('e2eq'),
    ...options.extra,
  });
  const server: Server = await new Promise((resolve) => {
    const s = sheetsmith.app.listen(options.port ?? 0, '127.0.0.1', () => resolve(s));
  });
  const { port } = server.address() as AddressInfo;
  return {
    url: `http://127.0.0.1:${port}`,
    close: async () => {
      server.closeAllConnections();
      await new Promise((resolve) => server.close(resolve));
      await sheetsmith.close();
    },
  };
}

export async function screenshot(page: Page, name: string) {
  mkdirSync(SCREENSHOT_DIR, { recursive: true });
  const file = path.join(SCREENSHOT_DIR, `${name}.png`);
  await page.screenshot({ path: file, fullPage: true });
  return file;
}

/**
 * For a browser test file: the test database, the real app on a free port, and Chromium; all closed
 * after the file. `prepare` runs on the database before the app starts (e.g. seeding).
 */
export function useBrowserApp(prepare?: (db: DataSource) => Promise<unknown>) {
  const t = {} as { db: DataSource; served: Awaited<ReturnType<typeof serveApp>>; browser: Browser; cspViolations: string[] };
  beforeAll(async () => {
    t.db = await openDatabase();
    await prepare?.(t.db);
    t.served = await serveApp(t.db);
    t.browser = await launchChromium();
    t.cspViolations = watchContentSecurityPolicy(t.browser);
  });
  afterAll(async () => {
    // Every screen a browser test opened ran under the app's CSP; a blocked script, style, font,
    // image or worker would have broken it for real users.
    const violations = t.cspViolations ?? [];
    await t.browser?.close();
    await t.served?.close();
    await t.db?.destroy();
    if (violations.length > 0) throw new Error(`Content Security Policy blocked something:\n${violations.join('\n')}`);
  });
  return t;
}

/** Signs in through the form and waits for the library of the user's active team. */
export async function signInThroughForm(page: Page, baseUrl: string, email: string, password = TEST_PASSWORD) {
  await page.goto(`${baseUrl}/sign-in`);
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL(/\/t\/\d+\/library$/);
}

/** Collects every CSP violation the browser reports on any page of `browser`. */
export function watchContentSecurityPolicy(browser: Browser): string[] {
  const violations: string[] = [];
  const watched = new WeakSet<Page>();
  const watch = (page: Page) => {
    if (watched.has(page)) return;
    watched.add(page);
    page.on('console', (message) => {
      if (/Content Security Policy/i.test(message.text())) violations.push(`${page.url()}: ${message.text()}`);
    });
  };
  const newContext = browser.newContext.bind(browser);
  browser.newContext = async (options) => {
    const context = await newContext(options);
    context.on('page', watch);
    return context;
  };
  const newPage = browser.newPage.bind(browser);
  browser.newPage = async (options) => {
    const page = await newPage(options);
    watch(page);
    return page;
  };
  return violations;
}
