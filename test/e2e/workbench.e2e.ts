/// <reference lib="dom" />
/// <reference lib="dom.iterable" />
import path from 'node:path';
import { afterEach, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { baseUrl, openBrowser, outputDir, signInThroughForm, type Browser } from './browser';

let browser: Browser | undefined;

afterEach(async () => {
  await browser?.close();
  browser = undefined;
});

const PRESSURE_DEMO = 'Dispensing robot line sensor, pressure';

async function openPressureDemo(page: Page): Promise<void> {
  await page.goto(baseUrl());
  await page.waitForURL(/\/sign-in/);
  await signInThroughForm(page, 'designer@example.com');
  await page.waitForURL(/\/designs$/);
  await page.getByRole('link', { name: PRESSURE_DEMO }).click();
  await page.waitForURL(/\/designs\/[0-9a-f-]{36}$/);
  await expect.poll(() => page.getByTestId('live-resolution').textContent()).toMatch(/aF/);
}

function liveResolution(page: Page): Promise<string | null> {
  return page.getByTestId('live-resolution').textContent();
}

interface UpdateTiming {
  /** From the input event of the keystroke to the new figure in the DOM [ms]. */
  milliseconds: number;
  /** Animation frames begun from the keystroke to the new figure: 1 means it is painted in the first frame after the keystroke. */
  frames: number;
}

/** Types a value into a field and measures, in the page, how soon the resolution on screen shows the new figure. */
async function typeAndTime(page: Page, testId: string, text: string): Promise<UpdateTiming> {
  const field = page.getByTestId(testId);
  await field.fill(text.slice(0, -1));
  await page.waitForTimeout(100);
  await page.evaluate(() => {
    const target = document.querySelector('[data-testid="live-resolution"]')!;
    const record = window as unknown as { updateTiming: Promise<{ milliseconds: number; frames: number }> };
    record.updateTiming = new Promise((resolve) => {
      let typedAt = 0;
      let frames = 0;
      const countFrames = () => {
        frames++;
        requestAnimationFrame(countFrames);
      };
      // Capture on the document runs before the field's own listener, so this frame callback is queued ahead of the form's.
      document.addEventListener('input', () => ((typedAt = performance.now()), requestAnimationFrame(countFrames)), { capture: true, once: true });
      const before = target.textContent;
      const observer = new MutationObserver(() => {
        if (typedAt > 0 && target.textContent !== before) {
          observer.disconnect();
          resolve({ milliseconds: performance.now() - typedAt, frames });
        }
      });
      observer.observe(target, { characterData: true, childList: true, subtree: true });
    });
  });
  await field.press(text.slice(-1));
  return page.evaluate(() => (window as unknown as { updateTiming: Promise<UpdateTiming> }).updateTiming);
}

describe('the design workbench in the browser', () => {
  it('updates the resolution as the designer types, saves a version and finds it after a reload', async () => {
    browser = await openBrowser({ width: 1280, height: 800 });
    const { page } = browser;
    await openPressureDemo(page);
    await expect.poll(() => page.getByTestId('edited-version').textContent()).toMatch(/Version 3/);
    await page.screenshot({ path: path.join(outputDir, 'workbench-chain-1280x800.png') });

    const before = await liveResolution(page);
    const amplitude = page.getByTestId('field-excitation.amplitude');
    await expect.poll(() => amplitude.inputValue()).toBe('2 V');
    const timings: UpdateTiming[] = [];
    // Each last keystroke changes the number ("1." to "1.5"), so each one must change the figures.
    for (const text of ['1.5', '1.2', '1.8', '1.1', '1.4', '1.7', '1.3']) timings.push(await typeAndTime(page, 'field-excitation.amplitude', text));
    const milliseconds = timings.map((timing) => timing.milliseconds).sort((a, b) => a - b);
    console.info(
      `keystroke to updated resolution on screen: median ${milliseconds[3].toFixed(1)} ms (${milliseconds.map((t) => t.toFixed(1)).join(', ')}); ` +
        `frames begun: ${timings.map((timing) => timing.frames).join(', ')}; ${await page.locator('.live-time').textContent()}`,
    );
    // The figures are in the DOM before the first frame after the keystroke is painted.
    expect(timings.every((timing) => timing.frames <= 1)).toBe(true);
    await amplitude.fill('1 V');
    await expect.poll(() => liveResolution(page)).not.toBe(before);
    const after = await liveResolution(page);
    // Half the excitation, half the signal: the resolution in aF gets worse.
    expect(Number.parseFloat(after!)).toBeGreaterThan(Number.parseFloat(before!));
    expect(await page.getByTestId('draft-state').textContent()).toMatch(/Unsaved changes/);

    // A value that cannot be read keeps the last good figures and says what is wrong, in place.
    await amplitude.fill('1 kHz');
    await expect.poll(() => page.getByTestId('input-not-valid').textContent()).toMatch(/expected a voltage, got a frequency/);
    expect(await liveResolution(page)).toBe(after);
    await expect.poll(() => page.locator('mat-error').first().textContent()).toMatch(/expected a voltage/);
    await amplitude.fill('1 V');
    await expect.poll(() => page.getByTestId('input-not-valid').count()).toBe(0);

    await page.getByRole('tab', { name: 'Budget' }).click();
    await expect.poll(() => page.getByTestId('resolution').textContent()).toContain(after!.split(' · ')[0]);
    await expect.poll(() => page.getByTestId('noise-table').locator('tr.mat-mdc-row').count()).toBeGreaterThan(3);
    await page.screenshot({ path: path.join(outputDir, 'workbench-budget-1280x800.png'), fullPage: true });
    await page.getByRole('tab', { name: 'Levels' }).click();
    await expect.poll(() => page.getByTestId('closest-to-clipping').textContent()).toMatch(/Closest to clipping: adc/);
    await page.screenshot({ path: path.join(outputDir, 'workbench-levels-1280x800.png'), fullPage: true });

    // The time-domain simulation runs in a worker with visible progress, then its spectrum can be read.
    await page.getByRole('tab', { name: 'Simulation' }).click();
    await page.getByTestId('simulation-run').click();
    await page.getByTestId('simulation-progress').waitFor({ state: 'visible', timeout: 10000 });
    await page.getByTestId('simulation-result').waitFor({ state: 'visible', timeout: 60000 });
    await page.screenshot({ path: path.join(outputDir, 'workbench-simulation-1280x800.png'), fullPage: true });
    await page.getByRole('tab', { name: 'Spectra' }).click();
    // The spectrum is drawn once the worker has computed it: a line with a real path, no progress bar left.
    await expect.poll(() => page.getByTestId('spectrum-chart').locator('path.line').getAttribute('d'), { timeout: 30000 }).toMatch(/^M[\d.]+,[\d.]+L/);
    await expect.poll(() => page.locator('qb-spectra-tab mat-progress-bar').count()).toBe(0);
    await page.screenshot({ path: path.join(outputDir, 'workbench-spectra-1280x800.png'), fullPage: true });

    await page.getByTestId('save-version').click();
    await page.getByTestId('version-message').fill('Excitation down to 1 V to see the resolution it costs');
    await page.getByTestId('confirm-save').click();
    await expect.poll(() => page.getByTestId('edited-version').textContent()).toMatch(/Version 4/);
    await expect.poll(() => page.getByTestId('draft-state').textContent()).toMatch(/No unsaved changes/);
    await expect.poll(() => page.getByTestId('version-4').textContent()).toContain('Excitation down to 1 V');

    // An edit left unsaved survives the reload as a draft that is offered back.
    await page.getByRole('tab', { name: 'Chain' }).click();
    await page.getByTestId('field-excitation.amplitude').fill('1.5 V');
    await expect.poll(() => page.getByTestId('draft-state').textContent()).toMatch(/Unsaved changes/);
    await page.waitForTimeout(600);
    await page.reload();
    await expect.poll(() => page.getByTestId('version-4').textContent()).toContain('Excitation down to 1 V');
    expect(await page.getByTestId('edited-version').textContent()).toMatch(/Version 4/);
    await expect.poll(() => page.getByTestId('draft-offer').textContent()).toMatch(/Restore your unsaved draft from \d\d:\d\d\?/);
    expect(await page.getByTestId('field-excitation.amplitude').inputValue()).toBe('1 V');
    await page.getByTestId('restore-draft').click();
    await expect.poll(() => page.getByTestId('field-excitation.amplitude').inputValue()).toBe('1.5 V');
    await expect.poll(() => page.getByTestId('draft-state').textContent()).toMatch(/Unsaved changes/);
    expect(browser.policyViolations).toEqual([]);
    expect([...browser.requestHosts]).toEqual(['127.0.0.1']);
  });

  it('leads from a finding to its field and lays the workbench out at 1920x1080', async () => {
    browser = await openBrowser({ width: 1920, height: 1080 });
    const { page } = browser;
    await openPressureDemo(page);
    // A low-pass corner this close to the carrier leaves ripple the engine reports against the low-pass.
    await page.getByTestId('field-chain[4].corner').fill('20 kHz');
    await page.getByRole('tab', { name: 'Budget' }).click();
    const link = page.getByTestId('findings').getByRole('button', { name: /lp · / }).first();
    await expect.poll(() => link.count()).toBe(1);
    await page.screenshot({ path: path.join(outputDir, 'workbench-budget-1920x1080.png') });
    await link.click();
    await expect.poll(() => page.locator('qb-stage-form.highlighted').getAttribute('data-stage')).toBe('lp');
    await expect.poll(() => page.evaluate(() => document.activeElement?.getAttribute('data-path') ?? '')).toMatch(/^chain\[4\]\./);
    await expect.poll(() => page.getByTestId('block-lp').getAttribute('class')).toMatch(/highlighted/);
    await page.waitForTimeout(400);
    await page.screenshot({ path: path.join(outputDir, 'workbench-chain-1920x1080.png') });
    await page.getByRole('tab', { name: 'Sweep' }).click();
    await page.waitForTimeout(400);
    await page.screenshot({ path: path.join(outputDir, 'workbench-sweep-1920x1080.png') });
  });
});
