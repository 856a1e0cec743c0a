/// <reference lib="dom" />
/// <reference lib="dom.iterable" />
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { afterEach, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { baseUrl, openBrowser, outputDir, signInThroughForm, type Browser } from './browser';

const FLOW_DEMO = 'Dispensing robot line sensor, flow';
const opened: Browser[] = [];

function literally(text: string): string {
  return text.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');
}

afterEach(async () => {
  for (const browser of opened.splice(0)) await browser.close();
});

async function browserFor(email: string, startAt = '/'): Promise<Page> {
  const browser = await openBrowser({ width: 1280, height: 800 });
  opened.push(browser);
  const { page } = browser;
  await page.goto(`${baseUrl()}${startAt}`);
  await page.waitForURL(/\/sign-in/);
  await signInThroughForm(page, email);
  await page.waitForURL((url) => !url.pathname.startsWith('/sign-in'));
  return page;
}

function shot(page: Page, name: string, fullPage = true): Promise<Buffer> {
  return page.screenshot({ path: path.join(outputDir, `${name}-1280x800.png`), fullPage });
}

/** The version number the workbench shows as being edited. */
async function editedVersion(page: Page): Promise<number> {
  await expect.poll(() => page.getByTestId('edited-version').textContent()).toMatch(/Version \d+/);
  return Number(/Version (\d+)/.exec((await page.getByTestId('edited-version').textContent())!)![1]);
}

async function shareWithReviewer(page: Page, note: string): Promise<void> {
  await page.getByTestId('share-for-review').click();
  await page.getByTestId('reviewer-email').fill('reviewer@example.com');
  await page.getByTestId('share-note').fill(note);
  await page.getByTestId('confirm-share').click();
  await expect.poll(() => page.getByTestId('share-result').textContent()).toMatch(/shared with reviewer@example\.com\.\s+The e-mail (has been sent|is pending)/);
}

/** The admin's Mailbox page: the newest message to the reviewer about this version, opened, and the review link it carries. */
async function reviewLinkFromMailbox(admin: Page, versionNumber: number): Promise<string> {
  const subject = `Review requested: ${FLOW_DEMO}, version ${versionNumber}`;
  await admin.goto(`${baseUrl()}/mailbox`);
  const message = admin.getByRole('link', { name: subject }).first();
  await expect.poll(async () => {
    await admin.getByTestId('mailbox-reload').click();
    return message.count();
  }, { timeout: 20000, interval: 500 }).toBeGreaterThan(0);
  await message.click();
  await expect.poll(() => admin.getByTestId('mail-subject').textContent()).toBe(subject);
  await expect.poll(() => admin.getByTestId('mail-html').count()).toBe(1);
  expect(await admin.getByTestId('mail-html').getAttribute('sandbox')).toBe('');
  const link = admin.getByTestId('mail-links').getByRole('link', { name: /\/reviews\// });
  return (await link.getAttribute('href'))!;
}

describe('review of a design version in the browser', () => {
  it('runs the loop: share, comment on a stage, request changes, save and share again, approve, download the report', async () => {
    const designer = await browserFor('designer@example.com');
    await designer.getByRole('link', { name: FLOW_DEMO }).click();
    await designer.waitForURL(/\/designs\/[0-9a-f-]{36}$/);
    const designUrl = designer.url();
    const first = await editedVersion(designer);
    await shareWithReviewer(designer, 'Please check the low-pass against the ripple.');
    await shot(designer, 'review-share-dialog', false);
    await designer.getByTestId('share-done').click();
    await expect.poll(() => designer.getByTestId(`review-state-${first}`).textContent()).toMatch(/In review/);

    // The reviewer opens the link from the e-mail the mail catcher holds, signs in and lands on the review.
    const admin = await browserFor('admin@example.com', '/mailbox');
    const firstLink = await reviewLinkFromMailbox(admin, first);
    await shot(admin, 'review-mailbox');
    const reviewer = await browserFor('reviewer@example.com', new URL(firstLink).pathname);
    await reviewer.waitForURL(/\/reviews\/[0-9a-f-]{36}$/);
    await expect.poll(() => reviewer.getByTestId('review-title').textContent()).toContain(`${FLOW_DEMO} version ${first}`);
    await expect.poll(() => reviewer.locator('[data-stage="lp"]').count()).toBe(1);
    expect(await reviewer.getByTestId('review-note').textContent()).toContain('low-pass against the ripple');

    // The snapshot is recomputed in the browser: the budget tab shows the resolution.
    await reviewer.getByRole('tab', { name: 'Budget' }).click();
    await expect.poll(() => reviewer.getByTestId('resolution').textContent()).toMatch(/aF/);
    await reviewer.getByRole('tab', { name: 'Chain' }).click();

    await reviewer.getByRole('button', { name: 'Comment on lp Corner frequency' }).click();
    await reviewer.getByTestId('comment-body').fill('The corner leaves too much carrier ripple at the ADC; go lower.');
    await reviewer.getByTestId('add-comment').click();
    await expect.poll(() => reviewer.getByTestId('comment-anchor').first().textContent()).toContain('lp · Corner frequency');
    await reviewer.getByTestId('decide-changes').click();
    await reviewer.getByTestId('decision-note').fill('Lower the low-pass corner, then share again.');
    await reviewer.getByTestId('send-decision').click();
    await expect.poll(() => reviewer.getByTestId('decision-shown').textContent()).toMatch(/Changes requested/);
    await shot(reviewer, 'review-changes-requested');

    // The designer sees the decision on the version, lowers the corner, saves and shares the new version.
    await designer.goto(designUrl);
    await expect.poll(() => designer.getByTestId(`review-state-${first}`).textContent()).toMatch(/Changes requested/);
    await expect.poll(() => designer.getByTestId('audit-trail').textContent()).toMatch(/requested changes to version \d+: Lower the low-pass corner/);
    const corner = designer.getByTestId('field-chain[4].corner');
    await corner.fill('100 Hz');
    await expect.poll(() => designer.getByTestId('draft-state').textContent()).toMatch(/Unsaved changes/);
    await designer.getByTestId('save-version').click();
    await designer.getByTestId('version-message').fill('Low-pass corner down to 100 Hz as the review asked');
    await designer.getByTestId('confirm-save').click();
    await expect.poll(() => designer.getByTestId('edited-version').textContent()).toMatch(new RegExp(`Version ${first + 1}`));
    const second = first + 1;
    await shareWithReviewer(designer, 'Corner lowered to 100 Hz.');
    await designer.getByTestId('share-done').click();
    await expect.poll(() => designer.getByTestId(`review-state-${second}`).textContent()).toMatch(/In review/);
    await shot(designer, 'review-workbench-history');

    // The reviewer finds the new request in their list, sees what changed since the last review and approves.
    await reviewer.goto(`${baseUrl()}/reviews`);
    const request = reviewer.getByRole('row', { name: new RegExp(`${FLOW_DEMO}\\s*v${second}`) });
    await expect.poll(() => request.count()).toBe(1);
    await shot(reviewer, 'review-list');
    await request.getByRole('link', { name: FLOW_DEMO }).click();
    await reviewer.waitForURL(/\/reviews\/[0-9a-f-]{36}$/);
    await reviewer.getByRole('tab', { name: `Compare with v${first}` }).click();
    const cornerRow = reviewer.locator('[data-testid="compare-fields"] tr[data-path="chain[4].corner"]');
    await expect.poll(() => cornerRow.textContent()).toMatch(/\d+ Hz\s*arrow_forward\s*100 Hz/);
    expect(await reviewer.locator('[data-figure="ripple"] [data-direction]').getAttribute('data-direction')).toBe('better');
    await shot(reviewer, 'review-compare');
    await reviewer.getByTestId('decide-approve').click();
    await reviewer.getByTestId('decision-note').fill('Ripple is now well below one LSB.');
    await reviewer.getByTestId('send-decision').click();
    await expect.poll(() => reviewer.getByTestId('decision-shown').textContent()).toMatch(/Approved/);

    // The report of the approved version downloads as a PDF with pages.
    const [download] = await Promise.all([reviewer.waitForEvent('download'), reviewer.getByTestId('report-link').click()]);
    const pdf = readFileSync((await download.path())!);
    expect(pdf.subarray(0, 5).toString('latin1')).toBe('%PDF-');
    const pages = pdf.toString('latin1').match(/\/Type\s*\/Page\b/g) ?? [];
    expect(pages.length).toBeGreaterThanOrEqual(2);

    await designer.reload();
    await expect.poll(() => designer.getByTestId(`review-state-${second}`).textContent()).toMatch(/Approved/);
    await designer.goto(`${baseUrl()}/designs`);
    await expect.poll(() => designer.getByRole('row', { name: new RegExp(FLOW_DEMO) }).locator('qb-design-review-state').textContent()).toMatch(/Approved\s*v\d+/);
    await shot(designer, 'review-designs-table');
    for (const browser of opened) expect(browser.policyViolations).toEqual([]);
  });

  it('creates a reviewer account from a one-time invitation link and opens the review', async () => {
    const designer = await browserFor('designer@example.com');
    await designer.getByRole('link', { name: FLOW_DEMO }).click();
    await designer.waitForURL(/\/designs\/[0-9a-f-]{36}$/);
    const version = await editedVersion(designer);
    const invited = `colleague-${Date.now()}@example.com`;
    await designer.getByTestId('share-for-review').click();
    await designer.getByTestId('reviewer-email').fill(invited);
    await designer.getByTestId('confirm-share').click();
    await expect.poll(() => designer.getByTestId('share-result').textContent()).toContain(invited);

    const admin = await browserFor('admin@example.com', '/mailbox');
    const link = await (async () => {
      const subject = `Invitation to review: ${FLOW_DEMO}, version ${version}`;
      const row = admin.getByRole('row', { name: new RegExp(literally(invited)) }).getByRole('link', { name: subject });
      await expect.poll(async () => {
        await admin.getByTestId('mailbox-reload').click();
        return row.count();
      }, { timeout: 20000, interval: 500 }).toBe(1);
      await row.click();
      return (await admin.getByTestId('mail-links').getByRole('link', { name: /\/sign-up\?token=/ }).getAttribute('href'))!;
    })();

    const browser = await openBrowser({ width: 1280, height: 800 });
    opened.push(browser);
    const page = browser.page;
    const signUp = new URL(link);
    await page.goto(`${baseUrl()}${signUp.pathname}${signUp.search}`);
    await expect.poll(() => page.getByTestId('invitation').textContent()).toMatch(new RegExp(`Demo Designer invited ${literally(invited)}`));
    await page.getByLabel('Display name').fill('Invited Colleague');
    await page.getByLabel('Password', { exact: true }).fill('short');
    await page.getByLabel('Confirm password').fill('other');
    await page.getByTestId('create-account').click();
    await expect.poll(() => page.locator('mat-error').allTextContents()).toEqual(['A password needs at least 10 characters.', 'The two passwords differ.']);
    await page.getByLabel('Password', { exact: true }).fill('quiet-bridge-review-2026');
    await page.getByLabel('Confirm password').fill('quiet-bridge-review-2026');
    await expect.poll(() => page.locator('mat-error').count()).toBe(0);
    await shot(page, 'review-sign-up');
    await page.getByTestId('create-account').click();
    await page.waitForURL(/\/reviews\/[0-9a-f-]{36}$/);
    await expect.poll(() => page.getByTestId('review-title').textContent()).toContain(`${FLOW_DEMO} version ${version}`);

    // The link works once.
    await page.goto(`${baseUrl()}${signUp.pathname}${signUp.search}`);
    await expect.poll(() => page.getByTestId('invitation-gone').textContent()).toMatch(/This link has been used or has expired/);
    await shot(page, 'review-sign-up-used');
  });
});
