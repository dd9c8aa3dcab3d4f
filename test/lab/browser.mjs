// Headless Debian chromium through playwright-core (no browser download), a fresh profile per run, and the
// console errors of every page collected so a test can assert there are none.
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { chromium } from 'playwright-core';

export const CHROMIUM = process.env.MULTIPLET_CHROMIUM ?? '/usr/bin/chromium';

export async function openBrowser() {
  const profile = mkdtempSync(join(tmpdir(), 'multiplet-chromium-'));
  const context = await chromium.launchPersistentContext(profile, {
    executablePath: CHROMIUM,
    headless: true,
    viewport: { width: 1400, height: 900 },
    args: [
      '--no-sandbox',
      '--disable-gpu',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
      '--no-first-run',
      '--disable-quic',
    ],
  });
  const consoleErrors = [];
  const watch = (page) => {
    page.on('console', (message) => {
      if (message.type() === 'error') consoleErrors.push(`${message.text()} @ ${message.location().url ?? ''}`);
    });
    page.on('pageerror', (error) => consoleErrors.push(`page error: ${error.message}`));
  };
  context.on('page', watch);
  for (const page of context.pages()) watch(page);
  return {
    context,
    consoleErrors,
    async close() {
      await context.close();
      rmSync(profile, { recursive: true, force: true });
    },
  };
}
