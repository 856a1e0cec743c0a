import { mkdirSync, mkdtempSync, rmSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { chromium, type BrowserContext, type Page } from 'playwright-core';

export const outputDir = fileURLToPath(new URL('../output', import.meta.url));
export const demoPassword = process.env.DEMO_PASSWORD || 'bridge-demo-2026';

export function baseUrl(): string {
  const url = process.env.E2E_BASE_URL;
  if (!url) throw new Error('E2E_BASE_URL is not set: run the suite through vitest --project e2e');
  return url;
}

export interface Browser {
  context: BrowserContext;
  page: Page;
  /** Every host the page asked for, to prove the app loads nothing from outside. */
  requestHosts: Set<string>;
  /** Console messages reporting a Content-Security-Policy violation. */
  policyViolations: string[];
  close(): Promise<void>;
}

/** Debian's Chromium, headless, with a fresh profile and the flags a closed network needs. */
export async function openBrowser(viewport = { width: 1280, height: 800 }): Promise<Browser> {
  mkdirSync(outputDir, { recursive: true });
  const profile = mkdtempSync(path.join(process.env.TMPDIR ?? '/tmp', 'qb-e2e-'));
  const context = await chromium.launchPersistentContext(profile, {
    executablePath: process.env.CHROME_BIN ?? '/usr/bin/chromium',
    headless: true,
    viewport,
    args: [
      '--no-sandbox',
      '--disable-gpu',
      '--disable-dev-shm-usage',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
      '--no-first-run',
      '--disable-quic',
    ],
  });
  const requestHosts = new Set<string>();
  context.on('request', (request) => {
    const url = new URL(request.url());
    if (url.protocol === 'http:' || url.protocol === 'https:' || url.protocol === 'ws:' || url.protocol === 'wss:') requestHosts.add(url.hostname);
  });
  const page = context.pages()[0] ?? (await context.newPage());
  const policyViolations: string[] = [];
  page.on('console', (message) => {
    if (/Content Security Policy/i.test(message.text())) policyViolations.push(message.text());
  });
  return {
    context,
    page,
    requestHosts,
    policyViolations,
    async close() {
      await context.close();
      rmSync(profile, { recursive: true, force: true });
    },
  };
}

export async function signInThroughForm(page: Page, email: string, password = demoPassword): Promise<void> {
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
}
