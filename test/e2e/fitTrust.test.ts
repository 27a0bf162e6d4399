// End to end: a fit that is not a measurement never sits beside a green badge, a refused unit can be stated in the window,
// and the events of a record holding several are marked on the plot and chosen there or in the fit panel.

import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Browser, Page } from 'playwright-core';
import { buildBench, CHROMIUM, dropFile, fitCount, hasChromium, launchChromium, outputDir, serveBench, waitForFit, waitForRefit, type ServedBench } from './benchHarness';
import { ambiguousMillisecondsCapture, flatNoiseCapture, rcStepCapture, squareWaveCapture } from './generatedCaptures';

if (!hasChromium) console.warn(`test/e2e/fitTrust.test.ts: skipped, no browser at ${CHROMIUM} (apt-get install chromium)`);

describe.skipIf(!hasChromium)('the fit badge, the unit choices and the events in a browser', () => {
  let bench: ServedBench;
  let browser: Browser;
  let page: Page;
  let folder: string;
  /** The sample's natural frequency as the window showed it on first start, Hz, and its standard error. */
  let sampleF0: { value: number; stderr: number };

  beforeAll(async () => {
    buildBench();
    mkdirSync(outputDir, { recursive: true });
    folder = mkdtempSync(join(tmpdir(), 'ringbench-trust-'));
    bench = await serveBench(join(folder, 'bench-log.jsonl'), folder);
    browser = await launchChromium();
    page = await (await browser.newContext({ viewport: { width: 1600, height: 1000 }, deviceScaleFactor: 1 })).newPage();
    await page.goto(bench.url);
    await waitForFit(page, 'input-filter-step.csv');
    sampleF0 = await f0Shown(page);
  });

  afterAll(async () => {
    await browser?.close();
    await bench?.stop();
    if (folder) rmSync(folder, { recursive: true, force: true });
  });

  it('shows a flat, noisy record in red, as no response, with no regime', async () => {
    const file = join(folder, 'flat-noise.csv');
    writeFileSync(file, flatNoiseCapture());
    await dropFile(page, file, 'flat-noise.csv');
    await waitForFit(page, 'flat-noise.csv');
    const badge = page.locator('#fit-state');
    expect(await badge.getAttribute('data-status')).toBe('no-response');
    expect(await badge.getAttribute('data-tone')).toBe('bad');
    expect(await badge.evaluate((e) => e.classList.contains('bad') && !e.classList.contains('ok'))).toBe(true);
    expect(await badge.innerText()).toBe('no second-order response found');
    expect(await page.locator('#fit-regime').count()).toBe(0);
    expect(await page.locator('#fit-results caption').innerText()).toContain('not a measurement');
    await page.locator('#fit-panel').screenshot({ path: join(outputDir, 'fit-panel-flat-noise.png') });
  });

  it('shows an RC step as first-order, with its time constant', async () => {
    const file = join(folder, 'rc-step.csv');
    writeFileSync(file, rcStepCapture());
    await dropFile(page, file, 'rc-step.csv');
    await waitForFit(page, 'rc-step.csv');
    expect(await page.locator('#fit-regime').getAttribute('data-regime')).toBe('first-order');
    const tau = page.locator('#fit-results tr[data-quantity="tau"]');
    const value = Number(await tau.getAttribute('data-value'));
    const stderr = Number(await tau.getAttribute('data-stderr'));
    // Generated with tau = 10 µs.
    expect(Math.abs(value - 10e-6)).toBeLessThan(3 * stderr);
    await page.locator('#fit-panel').screenshot({ path: join(outputDir, 'fit-panel-first-order.png') });
  });

  it('shows a file refused for its time unit with the one-line reason, and reads it once the unit is chosen', async () => {
    const file = join(folder, 'ms.csv');
    writeFileSync(file, ambiguousMillisecondsCapture());
    await dropFile(page, file, 'ms.csv');
    const refusal = page.locator('#capture-refusal');
    await refusal.waitFor({ timeout: 30_000 });
    expect(await refusal.getAttribute('data-unit')).toBe('time');
    expect(await refusal.innerText()).toContain("unit 'MS' is ambiguous");
    expect(await page.locator('#fit-state').count()).toBe(0);
    expect(await page.locator('#fit-status').innerText()).toBe('ms.csv was not read: state its time unit in the capture panel.');
    await page.locator('#capture-panel').screenshot({ path: join(outputDir, 'capture-panel-unit-refused.png') });
    await page.locator('#time-unit').selectOption('ms');
    await waitForFit(page, 'ms.csv');
    expect(await page.locator('#capture-refusal').count()).toBe(0);
    expect(await page.locator('#time-unit').inputValue()).toBe('ms');
    expect(await page.locator('#import-time-axis').innerText()).toContain('every 400 ns');
    // The same samples in other units: the same natural frequency as the sample itself.
    const f0 = await f0Shown(page);
    expect(Math.abs(f0.value - sampleF0.value)).toBeLessThan(3 * Math.hypot(f0.stderr, sampleF0.stderr));
    await page.locator('#capture-panel').screenshot({ path: join(outputDir, 'capture-panel-unit-stated.png') });
  });

  it('marks the events of a square-wave record on the plot, and fits the one clicked or chosen', async () => {
    const file = join(folder, 'square-wave.csv');
    writeFileSync(file, squareWaveCapture());
    await dropFile(page, file, 'square-wave.csv');
    await waitForFit(page, 'square-wave.csv');
    expect(await page.locator('#events-table tbody tr').count()).toBe(4);
    expect(await page.locator('#events-table tr.chosen').getAttribute('data-event')).toBe('1');
    const labels = page.locator('#fit-plot g.annotation');
    expect(await labels.count()).toBe(4);
    await page.evaluate(() => window.scrollTo(0, 0));
    await page.locator('#fit-plot').screenshot({ path: join(outputDir, 'plot-events.png') });
    let fits = await fitCount(page);
    await labels.nth(2).click();
    await waitForRefit(page, fits);
    expect(await page.locator('#event-select').inputValue()).toBe('3');
    expect(await page.locator('#events-table tr.chosen').getAttribute('data-event')).toBe('3');
    fits = await fitCount(page);
    await page.locator('#event-select').selectOption('2');
    await waitForRefit(page, fits);
    expect(await page.locator('#events-table tr.chosen').getAttribute('data-event')).toBe('2');
    // Generated at f0 = 1 MHz: each event's fit finds it within its stated uncertainty.
    const f0 = await f0Shown(page);
    expect(Math.abs(f0.value - 1e6)).toBeLessThan(3 * f0.stderr);
    await page.locator('#fit-panel').screenshot({ path: join(outputDir, 'fit-panel-events.png') });
  });
});

/** The natural frequency row of the fit table, as its data attributes carry it. */
async function f0Shown(page: Page): Promise<{ value: number; stderr: number }> {
  const row = page.locator('#fit-results tr[data-quantity="f0"]');
  return { value: Number(await row.getAttribute('data-value')), stderr: Number(await row.getAttribute('data-stderr')) };
}

