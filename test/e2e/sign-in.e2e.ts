/// <reference lib="dom" />
/// <reference lib="dom.iterable" />
import path from 'node:path';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { baseUrl, openBrowser, outputDir, signInThroughForm, type Browser } from './browser';

let browser: Browser;

beforeEach(async () => {
  browser = await openBrowser();
});

afterEach(async () => {
  await browser.close();
});

describe('signing in through the browser', () => {
  it('takes the demo designer to the Designs page, loading nothing from any host but 127.0.0.1', async () => {
    const { page } = browser;
    await page.goto(baseUrl());
    await page.waitForURL(/\/sign-in/);
    await signInThroughForm(page, 'designer@example.com');
    await page.waitForURL(/\/designs$/);
    await expect.poll(() => page.getByRole('heading', { name: 'Designs', exact: true }).isVisible()).toBe(true);
    await expect.poll(() => page.getByText('Demo Designer').first().isVisible()).toBe(true);
    await page.screenshot({ path: path.join(outputDir, 'designs-designer-1280x800.png'), fullPage: true });
    expect([...browser.requestHosts]).toEqual(['127.0.0.1']);
    const loadedFonts = await page.evaluate(() => [...document.fonts].filter((font) => font.status === 'loaded').map((font) => font.family));
    expect(loadedFonts).toEqual(expect.arrayContaining(['Roboto', 'Material Icons']));
    const iconFont = await page.evaluate(() => getComputedStyle(document.querySelector('mat-icon')!).fontFamily);
    expect(iconFont).toContain('Material Icons');
    expect(browser.policyViolations).toEqual([]);
  });

  it('shows the reason on the form when the password is wrong', async () => {
    const { page } = browser;
    await page.goto(`${baseUrl()}/sign-in`);
    await signInThroughForm(page, 'designer@example.com', 'not-the-password');
    await expect.poll(() => page.getByRole('alert').textContent()).toMatch(/e-mail or the password is wrong/);
    expect(page.url()).toMatch(/\/sign-in/);
  });

  it('sends a signed-out visitor to sign-in and back to the page they asked for', async () => {
    const { page } = browser;
    await page.goto(`${baseUrl()}/accounts`);
    await page.waitForURL(/\/sign-in\?returnUrl=%2Faccounts/);
    await signInThroughForm(page, 'admin@example.com');
    await page.waitForURL(/\/accounts$/);
    await expect.poll(() => page.getByRole('cell', { name: 'reviewer@example.com', exact: true }).isVisible()).toBe(true);
    await page.screenshot({ path: path.join(outputDir, 'accounts-admin-1280x800.png'), fullPage: true });
    expect([...browser.requestHosts]).toEqual(['127.0.0.1']);
  });

  it('signs out from the user menu and ends the session', async () => {
    const { page } = browser;
    await page.goto(`${baseUrl()}/sign-in`);
    await signInThroughForm(page, 'reviewer@example.com');
    await page.waitForURL(/\/designs$/);
    await page.getByRole('button', { name: /Demo Reviewer/ }).click();
    await page.getByRole('menuitem', { name: /Sign out/ }).click();
    await page.waitForURL(/\/sign-in/);
    const me = await page.evaluate(async () => (await fetch('/api/auth/me')).status);
    expect(me).toBe(401);
  });
});
