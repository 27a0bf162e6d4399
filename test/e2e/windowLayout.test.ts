// The window's layout at the screen sizes a bench laptop and a desk monitor have: the fit's results and the verdict
// on screen without scrolling, one line per result row, the extraction at full width, nothing wider than the window.
// Screenshots of each size go to test-output/ to be looked at.

import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdirSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Browser, Page } from 'playwright-core';
import { buildBench, CHROMIUM, hasChromium, launchChromium, outputDir, serveBench, waitForFit, type ServedBench } from './benchHarness';

if (!hasChromium) console.warn(`test/e2e/windowLayout.test.ts: skipped, no browser at ${CHROMIUM} (apt-get install chromium)`);

/** The page's side margins (the bench's padding): the full width a section can take. */
const PAGE_MARGINS = 36;
/** A result row of one line: its text is 13 px with 5 px padding above and below; two lines would be about 45 px. */
const ONE_LINE_ROW = 34;
/** Opening the bench and fitting its first capture: up to a minute or two on a busy shared test machine. */
const PAGE_TEST_MS = 180_000;

interface Box {
  x: number;
  y: number;
  width: number;
  height: number;
}

async function box(page: Page, selector: string): Promise<Box> {
  const found = await page.locator(selector).first().boundingBox();
  if (!found) throw new Error(`${selector} is not shown`);
  return found;
}

describe.skipIf(!hasChromium)('window layout', () => {
  let bench: ServedBench;
  let browser: Browser;
  let folder: string;

  beforeAll(async () => {
    buildBench();
    mkdirSync(outputDir, { recursive: true });
    folder = mkdtempSync(join(tmpdir(), 'ringbench-layout-'));
    bench = await serveBench(join(folder, 'bench-log.jsonl'), folder);
    browser = await launchChromium();
  });

  afterAll(async () => {
    await browser?.close();
    await bench?.stop();
    if (folder) rmSync(folder, { recursive: true, force: true });
  });

  async function openAt(width: number, height: number): Promise<Page> {
    const page = await (await browser.newContext({ viewport: { width, height }, deviceScaleFactor: 1 })).newPage();
    await page.goto(bench.url);
    await waitForFit(page, 'input-filter-step.csv');
    await page.waitForSelector('#verdict-overall');
    // The plot's own layout pass after the fit.
    await page.waitForTimeout(400);
    await page.screenshot({ path: join(outputDir, `layout-${width}x${height}.png`) });
    return page;
  }

  for (const [width, height] of [
    [1280, 720],
    [1600, 1000],
  ] as const) {
    it(`shows the fit's results and the verdict without scrolling at ${width}x${height}`, async () => {
      const page = await openAt(width, height);
      expect(await page.evaluate(() => window.scrollY)).toBe(0);
      for (const selector of ['#fit-results', '#verdict-overall', '#fit-state']) {
        const b = await box(page, selector);
        expect(b.y, `${selector} top`).toBeGreaterThanOrEqual(0);
        expect(b.y + b.height, `${selector} bottom at ${width}x${height}`).toBeLessThanOrEqual(height);
        expect(b.x + b.width, `${selector} right edge`).toBeLessThanOrEqual(width);
      }
      const rows = await page.locator('#fit-results tbody tr').evaluateAll((trs) => trs.map((tr) => tr.getBoundingClientRect().height));
      expect(rows.length).toBeGreaterThan(5);
      for (const rowHeight of rows) expect(rowHeight, 'a result row wraps').toBeLessThanOrEqual(ONE_LINE_ROW);
      // One line is not bought by cutting the words short: each row's name shows whole (alpha's was cut at 1280 px).
      const cut = await page.locator('#fit-results tbody tr th').evaluateAll((ths) => ths.filter((th) => th.scrollWidth > th.clientWidth).map((th) => th.textContent));
      expect(cut, `result names cut short at ${width}x${height}`).toEqual([]);
      await page.context().close();
    }, PAGE_TEST_MS);
  }

  it('gives the extraction and the before / after comparison the full width', async () => {
    const page = await openAt(1280, 720);
    for (const selector of ['#parasitic-panel', '#before-after-panel']) {
      const b = await box(page, selector);
      expect(b.width, selector).toBeGreaterThanOrEqual(1280 - PAGE_MARGINS - 1);
    }
    await page.context().close();
  }, PAGE_TEST_MS);

  it('does not break at 1024x700: nothing wider than the window, the results and verdict still shown', async () => {
    const page = await openAt(1024, 700);
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(1024);
    const fit = await box(page, '#fit-results');
    const plot = await box(page, '#fit-plot');
    // Side by side, not on top of each other.
    expect(fit.x).toBeGreaterThanOrEqual(plot.x + plot.width);
    expect((await box(page, '#verdict-overall')).y).toBeLessThan(700);
    await page.context().close();
  }, PAGE_TEST_MS);
});
