// A capture of two ringing modes in the window: the fit panel's modes table and order line, each mode's
// contribution drawn in a strip under the fit (shown and hidden by the plot's Modes button), the residual strip of
// the whole fit, a forced order of one mode, and R, L, C for the mode chosen.

import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { TWO_MODES, twoModeCapture } from '../fixtures/twoModeCapture';
import { CHROMIUM, closeServedBench, dropFile, fitCount, hasChromium, openServedBench, outputDir, waitForFit, waitForRefit, type OpenedBench } from './benchHarness';

if (!hasChromium) console.warn(`test/e2e/windowModes.test.ts: skipped, no browser at ${CHROMIUM} (apt-get install chromium)`);

/** Building, opening and fitting two modes (the order search fits one, two and three) on a shared test machine. */
const TEST_MS = 300_000;
const FIT_WAIT_MS = 240_000;
const FILE = 'two-mode-ringdown.csv';

/** The names and points of the traces on the fit plot, from the plot's own data. */
async function plotTraces(page: Page): Promise<{ name: string; yaxis: string; y: number[] }[]> {
  return page.evaluate(() =>
    ((document.querySelector('#fit-plot') as unknown as { data: { name: string; yaxis: string; y: ArrayLike<number> }[] }).data ?? []).map((t) => ({
      name: t.name,
      yaxis: t.yaxis,
      y: Array.from(t.y ?? []),
    })),
  );
}

describe.skipIf(!hasChromium)('two ringing modes in the window', () => {
  let opened: OpenedBench | undefined;
  let folder: string;
  let page: Page;

  beforeAll(async () => {
    opened = await openServedBench('modes', { width: 1280, height: 800 }, (dir) => writeFileSync(join(dir, FILE), twoModeCapture()));
    ({ folder, page } = opened);
  }, TEST_MS);

  afterAll(() => closeServedBench(opened));

  it('shows each mode in the fit panel and draws its contribution under the fit, with a toggle', async () => {
    // One ring: no modes table and no Modes button, but the order line.
    expect(await page.locator('#modes-table').count()).toBe(0);
    expect(await page.locator('#plot-modes').isHidden()).toBe(true);
    await expect.poll(() => page.locator('#modes-order').innerText()).toMatch(/one ringing mode/);

    await dropFile(page, join(folder, FILE), FILE);
    await waitForFit(page, FILE, FIT_WAIT_MS);
    expect(await page.locator('#fit-state').getAttribute('data-status')).toBe('converged');
    const rows = page.locator('#modes-table tbody tr');
    expect(await rows.count()).toBe(2);
    const f0 = await rows.evaluateAll((trs) => trs.map((tr) => Number((tr as HTMLElement).dataset.f0)));
    TWO_MODES.forEach((mode, k) => expect(Math.abs(f0[k] / mode.f0 - 1)).toBeLessThan(0.01));
    expect(await page.locator('#modes-order').innerText()).toMatch(/two ringing modes \(BIC/);

    // Drawn under the fit: each mode's contribution on the final level, before the fit in the plot's order.
    const modesButton = page.locator('#plot-modes');
    expect(await modesButton.isVisible()).toBe(true);
    expect(await modesButton.getAttribute('aria-pressed')).toBe('true');
    let names = (await plotTraces(page)).map((t) => t.name);
    expect(names).toEqual(expect.arrayContaining(['mode 1', 'mode 2', 'Fit', 'Residual']));
    expect(names.indexOf('mode 2')).toBeLessThan(names.indexOf('Fit'));
    // In their own strip, about zero: the dominant mode's swing is its amplitude, not the fit's level.
    const mode1 = (await plotTraces(page)).find((t) => t.name === 'mode 1')!;
    expect(mode1.yaxis).toBe('y3');
    expect(Math.max(...mode1.y) / TWO_MODES[0].amplitude).toBeGreaterThan(0.8);
    // The residual strip shows what the whole fit leaves: about the noise, far below either mode.
    const residual = (await plotTraces(page)).find((t) => t.name === 'Residual' && t.yaxis === 'y2')!;
    expect(Math.max(...residual.y.map(Math.abs))).toBeLessThan(0.2 * TWO_MODES[1].amplitude);
    await page.screenshot({ path: join(outputDir, 'window-two-modes-1280.png') });

    await modesButton.click();
    await expect.poll(async () => (await plotTraces(page)).map((t) => t.name)).not.toContain('mode 1');
    expect(await modesButton.getAttribute('aria-pressed')).toBe('false');
    await page.screenshot({ path: join(outputDir, 'window-two-modes-hidden-1280.png') });
    await modesButton.click();
    names = (await plotTraces(page)).map((t) => t.name);
    expect(names).toContain('mode 2');
  }, TEST_MS);

  it('derives R, L, C for the mode chosen, and refits with the order forced', async () => {
    await page.fill('#known-value', '1n');
    await page.press('#known-value', 'Enter');
    let before = await fitCount(page);
    await page.selectOption('#mode-select', '2');
    await waitForRefit(page, before);
    expect(await page.locator('#modes-table tr.chosen').getAttribute('data-mode')).toBe('2');
    await expect.poll(() => page.locator('#components-panel').innerText()).toMatch(/mode 2 of 2/);

    before = await fitCount(page);
    await page.selectOption('#modes-select', '1');
    await waitForRefit(page, before);
    expect(await page.locator('#modes-table').count()).toBe(0);
    expect(await page.locator('#modes-order').innerText()).toMatch(/order forced/);
    expect(await page.locator('#plot-modes').isHidden()).toBe(true);
  }, TEST_MS);
});
