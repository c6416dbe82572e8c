import { existsSync, mkdirSync, mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { chromium, type BrowserContext, type Page } from 'playwright-core';

export const CHROMIUM_PATH = '/usr/bin/chromium';
export const SCREENSHOTS_DIR = fileURLToPath(new URL('../e2e/screenshots/', import.meta.url));

/** Debian's Chromium, headless, in a fresh profile folder that close() removes. */
export async function launchBrowser(): Promise<{ context: BrowserContext; close(): Promise<void> }> {
  if (!existsSync(CHROMIUM_PATH)) {
    throw new Error(`Browser tests need Debian's Chromium at ${CHROMIUM_PATH}: apt-get install -y chromium`);
  }
  const profile = mkdtempSync(path.join(os.tmpdir(), 'bifolio-chromium-'));
  const context = await chromium.launchPersistentContext(profile, {
    executablePath: CHROMIUM_PATH,
    headless: true,
    args: [
      '--no-sandbox',
      '--disable-gpu',
      '--disable-quic',
      '--no-first-run',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
      '--disable-dev-shm-usage',
    ],
  });
  return {
    context,
    async close() {
      await context.close().catch(() => undefined);
      rmSync(profile, { recursive: true, force: true });
    },
  };
}

/** Saves a full-page screenshot as tests/e2e/screenshots/<name>.png (git-ignored). */
export async function saveScreenshot(page: Page, name: string): Promise<string> {
  mkdirSync(SCREENSHOTS_DIR, { recursive: true });
  const file = path.join(SCREENSHOTS_DIR, `${name}.png`);
  await page.screenshot({ path: file, fullPage: true });
  return file;
}
