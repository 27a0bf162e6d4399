// The plots of the work over several captures: 1/(2π f0)² against the added capacitance with the extraction's line,
// and the before / after captures overlaid with their fits; each drawn from what its use case returned.

import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { CHROMIUM, closeServedBench, hasChromium, openServedBench, outputDir, type OpenedBench } from './benchHarness';

if (!hasChromium) console.warn(`test/e2e/windowComparePlots.test.ts: skipped, no browser at ${CHROMIUM} (apt-get install chromium)`);

/** Each use case fits several captures: up to a few minutes on a busy shared test machine. */
const USE_CASE_TEST_MS = 240_000;

/** Lines plotly drew in a plot: each trace's path with some length. */
async function drawnTraces(page: Page, selector: string): Promise<number> {
  return page.locator(`${selector} .scatterlayer .trace`).evaluateAll((traces) => traces.filter((t) => (t.querySelector('path.js-line')?.getAttribute('d') ?? '').length > 10 || t.querySelectorAll('path.point').length > 0).length);
}

describe.skipIf(!hasChromium)('plots over several captures', () => {
  let opened: OpenedBench | undefined;
  let page: Page;

  beforeAll(async () => {
    opened = await openServedBench('compareplots', { width: 1600, height: 1000 });
    ({ page } = opened);
  });

  afterAll(() => closeServedBench(opened));

  it('plots 1/f0² of each capture against its added C with the line whose slope is the extracted L_p', async () => {
    await page.click('#use-sample-set');
    await page.waitForFunction(() => document.querySelectorAll('#extraction-rows .extraction-row').length === 3);
    await page.fill('#added-c-tol', '5');
    await page.click('#run-extraction');
    await page.waitForSelector('#parasitic-results', { timeout: 120_000 });
    await page.waitForFunction(() => (document.querySelector('#extraction-line-plot') as HTMLElement).dataset.points === '3');
    expect(await drawnTraces(page, '#extraction-line-plot')).toBe(2);
    const lp = Number(await page.locator('#parasitic-results tr[data-quantity="Lp"]').getAttribute('data-value'));
    expect(Number(await page.locator('#extraction-line-plot').getAttribute('data-slope'))).toBe(lp);
    await page.locator('#parasitic-panel').screenshot({ path: join(outputDir, 'extraction-line-1600.png') });
    // Drawn again in the other theme's colours.
    const stroke = () => page.locator('#extraction-line-plot .scatterlayer .trace path.js-line').first().evaluate((path) => getComputedStyle(path).stroke);
    const light = await stroke();
    await page.click('#theme-toggle');
    await page.waitForFunction((before) => getComputedStyle(document.querySelector('#extraction-line-plot .scatterlayer .trace path.js-line') as Element).stroke !== before, light);
    await page.click('#theme-toggle');
  }, USE_CASE_TEST_MS);

  it('overlays the before and after captures with their fits', async () => {
    await page.selectOption('#before-sample', 'switch-node-before');
    await page.waitForFunction(() => document.querySelector('#before-name')?.textContent === 'switch-node-before.csv');
    await page.selectOption('#after-sample', 'switch-node-after-470p');
    await page.waitForFunction(() => document.querySelector('#after-name')?.textContent === 'switch-node-after-470p.csv');
    await page.click('#run-compare');
    await page.waitForSelector('#compare-verdict', { timeout: 120_000 });
    await page.waitForFunction(() => (document.querySelector('#compare-overlay') as HTMLElement).dataset.traces === '4');
    expect(await drawnTraces(page, '#compare-overlay')).toBe(4);
    await page.locator('#before-after-panel').screenshot({ path: join(outputDir, 'before-after-overlay-1600.png') });
  }, USE_CASE_TEST_MS);
});
