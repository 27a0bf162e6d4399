// The extraction panel with real capacitors: a derating per capture, the switch's output capacitance split off C_p,
// and L_p cross-checked on a turn-on edge chosen from a file; the screenshot shows the whole panel.

import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { CHROMIUM, closeServedBench, hasChromium, openServedBench, outputDir, type OpenedBench } from './benchHarness';
import { turnOnEdge, turnOnEdgeCsv } from '../core/turnOnEdgeCapture';

if (!hasChromium) console.warn(`test/e2e/windowExtractionReal.test.ts: skipped, no browser at ${CHROMIUM} (apt-get install chromium)`);

/** The extraction fits three captures: up to a few minutes on a busy shared test machine. */
const USE_CASE_TEST_MS = 240_000;
/** L_p of the sample set with nominal parts (`parasitics --added C=470p,1n`), H; both parts at 0.9 make the line's slope L_p / 0.9. */
const NOMINAL_LP = 6.4979e-9;
const DERATING = 0.9;

describe.skipIf(!hasChromium)('extraction with real capacitors', () => {
  let opened: OpenedBench | undefined;
  let folder: string;
  let page: Page;

  beforeAll(async () => {
    opened = await openServedBench('extraction-real', { width: 1600, height: 1000 }, (dir) => writeFileSync(join(dir, 'turn-on-edge.csv'), turnOnEdgeCsv(turnOnEdge({ L: NOMINAL_LP / DERATING, seed: 21 }))));
    ({ folder, page } = opened);
  });

  afterAll(() => closeServedBench(opened));

  it('a derating without its tolerance is refused in plain words before any fit', async () => {
    await page.click('#use-sample-set');
    await page.waitForFunction(() => document.querySelectorAll('#extraction-rows .extraction-row').length === 3);
    const derating = page.locator('#extraction-rows .extraction-row input.derating');
    await derating.nth(1).fill('0.9');
    await derating.nth(2).fill('90%');
    await page.click('#run-extraction');
    await page.waitForSelector('#extraction-error');
    expect(await page.locator('#extraction-error').innerText()).toMatch(/derating tolerance: give the tolerance of the derating factors/);
  });

  it('fits the line to the derated values, splits off the switch, and the edge agrees with L_p', async () => {
    await page.fill('#derating-tol', '5');
    // Taken as exact, as the command line's L_p the slope is compared with.
    await page.fill('#added-c-tol', '0');
    await page.fill('#switch-coss', '120p,10');
    const chooser = page.waitForEvent('filechooser');
    await page.click('#choose-edge');
    await (await chooser).setFiles(join(folder, 'turn-on-edge.csv'));
    await page.waitForFunction(() => document.querySelector('#edge-file')?.textContent === 'turn-on-edge.csv');
    await page.fill('#edge-current-channel', 'I_D');
    await page.fill('#edge-voltage-channel', 'V_SW');
    await page.click('#run-extraction');
    await page.waitForSelector('#edge-check', { timeout: 120_000 });
    const lp = Number(await page.locator('#parasitic-results tr[data-quantity="Lp"]').getAttribute('data-value'));
    expect(lp / (NOMINAL_LP / DERATING) - 1).toBeCloseTo(0, 3);
    expect(await page.locator('#extraction-captures td.effective-c').count()).toBe(3);
    expect(await page.locator('#parasitic-results tr[data-quantity="Crest"]').count()).toBe(1);
    expect(await page.locator('#edge-check').getAttribute('data-verdict')).toBe('agree');
    expect(await page.locator('#edge-verdict').innerText()).toMatch(/L from the edge .* against L_p .*: agree/);
    // The plot's points sit at the derated values, on the line whose slope is the L_p shown.
    await page.waitForFunction(() => (document.querySelector('#extraction-line-plot') as HTMLElement).dataset.points === '3');
    expect(Number(await page.locator('#extraction-line-plot').getAttribute('data-slope'))).toBe(lp);
    await page.waitForTimeout(300);
    await page.locator('#parasitic-panel').screenshot({ path: join(outputDir, 'extraction-real-capacitors-1600.png') });
  }, USE_CASE_TEST_MS);
});
