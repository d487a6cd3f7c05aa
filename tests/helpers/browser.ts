import { mkdirSync } from 'node:fs';
import type { AddressInfo } from 'node:net';
import type { Server } from 'node:http';
import path from 'node:path';
import { chromium } from 'playwright-core';
import type { Browser, Page } from 'playwright-core';
import type { DataSource } from 'typeorm';
import { createApp } from '../../server/app';
import { env } from '../../server/config/env';

export const SCREENSHOT_DIR = path.resolve('tests/output/screenshots');

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

/** The real app (API + built client) listening on a free loopback port. */
export async function serveApp(dataSource: DataSource) {
  const sheetsmith = createApp({ env, dataSource, clientDir: path.resolve('dist') });
  const server: Server = await new Promise((resolve) => {
    const s = sheetsmith.app.listen(0, '127.0.0.1', () => resolve(s));
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
