import { mkdirSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { chromium, type BrowserContext, type Page } from 'playwright-core';
import { projectRoot } from '../../../server/project-root';

/** Where end-to-end screenshots are saved (kept after the run for people to look at). */
export const SCREENSHOT_DIR = join(projectRoot(), 'test-results', 'screenshots');

/** A headless Chromium with a fresh profile, and the problems its pages reported. */
export interface TestBrowser {
  /** The browser context (one profile). */
  context: BrowserContext;
  /** Console errors and CSP violations seen so far. */
  problems: string[];
  /** Opens a new page that records its problems. */
  newPage(): Promise<Page>;
  /** Closes the browser and removes the profile. */
  close(): Promise<void>;
}

/** Launches Debian's Chromium (never a downloaded browser) with a fresh profile. */
export async function launchBrowser(colorScheme: 'light' | 'dark' = 'light'): Promise<TestBrowser> {
  const profile = mkdtempSync(join(tmpdir(), 'cellsmith-chromium-'));
  const context = await chromium.launchPersistentContext(profile, {
    executablePath: process.env['CHROMIUM_PATH'] ?? '/usr/bin/chromium',
    headless: true,
    viewport: { width: 1280, height: 800 },
    colorScheme,
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
  const problems: string[] = [];
  const watch = (page: Page): Page => {
    page.on('console', (message) => {
      if (message.type() === 'error') problems.push(`console: ${message.text()}`);
    });
    page.on('pageerror', (error) => problems.push(`page error: ${error.message}`));
    return page;
  };
  context.on('page', watch);
  return {
    context,
    problems,
    newPage: async () => context.newPage(),
    async close() {
      await context.close();
      rmSync(profile, { recursive: true, force: true });
    },
  };
}

/** Browsers a test file starts, so that all of them are closed once it ends. */
export interface BrowserPool {
  /** Launches a browser in `colorScheme` and keeps it for {@link BrowserPool.closeAll}. */
  launch(colorScheme: 'light' | 'dark'): Promise<TestBrowser>;
  /** The problems every browser launched so far has reported. */
  problems(): string[];
  /** Closes every browser launched (a browser left open keeps Jest from exiting). */
  closeAll(): Promise<void>;
}

/** A pool of test browsers: launch per test, close all in `afterAll`. */
export function browserPool(): BrowserPool {
  const launched: TestBrowser[] = [];
  return {
    async launch(colorScheme) {
      const browser = await launchBrowser(colorScheme);
      launched.push(browser);
      return browser;
    },
    problems: () => launched.flatMap((browser) => browser.problems),
    async closeAll() {
      await Promise.all(launched.splice(0).map((browser) => browser.close()));
    },
  };
}

/** Saves a full-page screenshot under test-results/screenshots/<name>.png. */
export async function screenshot(page: Page, name: string): Promise<void> {
  mkdirSync(SCREENSHOT_DIR, { recursive: true });
  await page.screenshot({ path: join(SCREENSHOT_DIR, `${name}.png`), fullPage: true });
}
