import { mkdirSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { chromium, type BrowserContext, type Page } from 'playwright-core';

// Set from BASE_URL by e2e/vitest.config.ts (vitest replaces BASE_URL itself inside tests).
export const BASE_URL = (process.env.E2E_BASE_URL || 'http://localhost:3000').replace(/\/$/, '');
/** web/test-results/screenshots (ignored by git) unless the test runner names another folder. */
export const SCREENSHOT_DIR =
  process.env.SCREENSHOT_DIR ||
  new URL('../../test-results/screenshots/', import.meta.url).pathname;

export interface Session {
  context: BrowserContext;
  page: Page;
  /** Uncaught page errors and requests to other hosts: a journey must end with none. */
  problems: string[];
  close(): Promise<void>;
}

/** Debian's chromium with a fresh profile (cookies from one test never leak into the next). */
export async function launch(): Promise<Session> {
  const origin = new URL(BASE_URL).origin;
  const profile = mkdtempSync(join(tmpdir(), 'stavemark-e2e-'));
  let context: BrowserContext;
  try {
    context = await chromium.launchPersistentContext(profile, {
      executablePath: process.env.CHROMIUM_PATH || '/usr/bin/chromium',
      headless: true,
      viewport: { width: 1280, height: 800 },
      locale: 'en-GB',
      args: [
        '--no-sandbox',
        '--disable-gpu',
        '--disable-quic',
        '--no-first-run',
        '--disable-background-networking',
        '--disable-component-update',
        '--disable-sync',
      ],
    });
  } catch (error) {
    rmSync(profile, { recursive: true, force: true });
    throw error;
  }
  const page = context.pages()[0] ?? (await context.newPage());
  const problems: string[] = [];
  page.on('pageerror', (error) => problems.push(`page error: ${error.message}`));
  // Fonts, icons and scripts all ship with the app; nothing may come from elsewhere.
  page.on('request', (request) => {
    const url = request.url();
    if (!url.startsWith(origin) && !url.startsWith('data:') && !url.startsWith('blob:'))
      problems.push(`request to another host: ${url}`);
  });
  return {
    context,
    page,
    problems,
    async close() {
      await context.close();
      rmSync(profile, { recursive: true, force: true });
    },
  };
}

export async function screenshot(page: Page, name: string): Promise<string> {
  mkdirSync(SCREENSHOT_DIR, { recursive: true });
  const path = join(SCREENSHOT_DIR, `${name}.png`);
  await page.screenshot({ path, fullPage: true });
  return path;
}
