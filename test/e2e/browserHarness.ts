/**
 * Drives the browser build in Debian's Chromium for the end-to-end tests and the browser benchmark:
 * builds the renderer once, serves dist/ on 127.0.0.1 with the project's static server, and launches
 * Chromium headless through playwright-core (never a downloaded browser).
 */
import { existsSync, mkdirSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { chromium, type Browser, type Page } from 'playwright-core';
import { buildRenderer } from '../../scripts/buildApp.mjs';
import { serveStatic } from '../../scripts/staticServer.mjs';

/** Debian's Chromium, installed by .ci/run. */
export const CHROMIUM_PATH = '/usr/bin/chromium';
/** Why the browser tests are skipped, or null when they can run. */
export const SKIP_REASON = existsSync(CHROMIUM_PATH) ? null : `${CHROMIUM_PATH} is absent: the end-to-end tests of the browser build need Debian's chromium package (.ci/run installs it)`;

const ROOT = fileURLToPath(new URL('../..', import.meta.url));
/** Where screenshots go (git-ignored). */
export const SCREENSHOT_DIR = `${ROOT}test-output/screenshots`;

export interface BrowserSession {
  browser: Browser;
  page: Page;
  /** Base URL of the served build, ending in `/`. */
  url: string;
  /** Console messages and page errors seen so far. */
  console: string[];
  close(): Promise<void>;
}

/**
 * Builds (unless `build: false`), serves and opens a page.
 * @param opts - viewport size; `build: false` reuses an existing dist/
 */
export async function openBrowserBuild(opts: { width?: number; height?: number; build?: boolean } = {}): Promise<BrowserSession> {
  if (opts.build !== false || !existsSync(`${ROOT}dist/index.html`)) await buildRenderer();
  const server = await serveStatic(`${ROOT}dist`, { port: 0 });
  const browser = await chromium.launch({
    executablePath: CHROMIUM_PATH,
    headless: true,
    args: ['--no-sandbox', '--disable-background-networking', '--disable-gpu', '--disable-component-update', '--disable-sync', '--no-first-run'],
  });
  const context = await browser.newContext({ viewport: { width: opts.width ?? 1500, height: opts.height ?? 950 }, acceptDownloads: true });
  // tsx/esbuild (keepNames) wraps functions passed to page.evaluate in a __name() helper the page lacks
  await context.addInitScript('globalThis.__name = (f) => f;');
  const page = await context.newPage();
  const log: string[] = [];
  page.on('console', (m) => log.push(`${m.type()}: ${m.text()}`));
  page.on('pageerror', (e) => log.push(`pageerror: ${e.message}`));
  mkdirSync(SCREENSHOT_DIR, { recursive: true });
  return {
    browser,
    page,
    url: server.url,
    console: log,
    close: async () => {
      await browser.close();
      await server.close();
    },
  };
}
