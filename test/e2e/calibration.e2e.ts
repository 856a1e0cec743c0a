/// <reference lib="dom" />
/// <reference lib="dom.iterable" />
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { baseUrl, openBrowser, outputDir, signInThroughForm, type Browser } from './browser';

const demoBatch = fileURLToPath(new URL('../fixtures/calibration/demo-batch.csv', import.meta.url));

let browser: Browser;

beforeEach(async () => {
  browser = await openBrowser();
});

afterEach(async () => {
  await browser.close();
});

describe('calibration in the browser', () => {
  it('goes from the demo CSV to a fit, a batch verdict and a C header', async () => {
    const { page } = browser;
    await page.goto(`${baseUrl()}/sign-in`);
    await signInThroughForm(page, 'designer@example.com');
    await page.waitForURL(/\/designs$/);

    await page.getByRole('link', { name: 'Calibration' }).click();
    await page.waitForURL(/\/calibration$/);
    await page.getByTestId('design-picker').click();
    await page.getByRole('option', { name: 'Dispensing robot line sensor, pressure' }).click();
    await page.waitForURL(/\/designs\/[0-9a-f-]+\/calibration$/);
    // The seed's generated batch is listed already.
    await expect.poll(() => page.getByTestId('dataset-list').textContent()).toContain('Demo batch, six cells (generated)');

    await page.getByTestId('upload-start').click();
    await page.getByTestId('bench-file').setInputFiles(demoBatch);
    await expect.poll(() => page.getByTestId('preview-table').isVisible()).toBe(true);
    // Map the columns: the header gives a first guess; set the readout explicitly, as a user would check it.
    await page.getByTestId('map-readout').click();
    await page.getByRole('option', { name: 'output_V' }).click();
    await expect.poll(() => page.getByTestId('map-reference').textContent()).toContain('pressure_kPa');
    await page.getByTestId('check-rows').click();
    await expect.poll(() => page.getByTestId('rows-ok').textContent()).toContain('All 312 rows read');
    await page.getByTestId('store-dataset').click();
    await expect.poll(() => page.getByTestId('dataset-list').textContent()).toContain('demo-batch');

    // The stored dataset opens in the fit panel: a quadratic calibration curve of cell C1.
    const coefficients = page.getByTestId('coefficients');
    await expect.poll(() => coefficients.locator('tbody tr').count()).toBe(3);
    const r2 = Number(await page.getByTestId('r2').textContent());
    expect(r2).toBeGreaterThan(0.999);
    const figures = await page.getByTestId('percent-figures').locator('tbody tr').allTextContents();
    expect(figures.some((row) => row.startsWith('nonlinearity') && row.includes('least-squares quadratic'))).toBe(true);
    expect(figures.some((row) => row.startsWith('hysteresis') && row.includes('upscale and downscale'))).toBe(true);
    expect(await page.getByTestId('degree-comparison').locator('tbody tr').count()).toBe(5);

    await page.getByTestId('reference-cell-C1').click();
    await page.getByTestId('reference-cell-C2').click();
    await page.getByTestId('batch-evaluate').click();
    await expect.poll(() => page.getByTestId('batch-cells').locator('tbody tr').count()).toBe(4);
    expect(await page.getByTestId('batch-cells').locator('caption').textContent()).toMatch(/Reference cells C1, C2; two-point gain and offset trim/);
    await page.getByTestId('batch-every-k').click();
    await expect.poll(() => page.getByTestId('batch-sweep').locator('tbody tr').count()).toBe(5);

    const download = page.waitForEvent('download');
    await page.getByTestId('export-header').click();
    const header = await download;
    expect(header.suggestedFilename()).toMatch(/^demo-batch-C1-calibration-degree-2\.h$/);
    const text = readFileSync((await header.path())!, 'utf8');
    expect(text).toMatch(/static const double demo_batch_calibration_coefficients\[3\] = \{/);
    expect(text).toContain('Design: Dispensing robot line sensor, pressure. Dataset: demo-batch. Cells: C1.');

    await page.screenshot({ path: path.join(outputDir, 'calibration-designer-1280x800.png'), fullPage: true });
    await page.setViewportSize({ width: 1280, height: 800 });
    await page.getByTestId('batch-sweep').scrollIntoViewIfNeeded();
    await page.screenshot({ path: path.join(outputDir, 'calibration-batch-1280x800.png') });
    expect([...browser.requestHosts]).toEqual(['127.0.0.1']);
    expect(browser.policyViolations).toEqual([]);
  });
});
