// The fit under the bench engineer's hand: a long fit stopped from the top bar (the page usable at once, the capture
// still open for a refit), and the probe ratio and polarity scaling the channel before the fit.

import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { createRandom } from '../../core/random';
import { CHROMIUM, closeServedBench, fitCount, hasChromium, openServedBench, outputDir, waitForRefit, type OpenedBench } from './benchHarness';

if (!hasChromium) console.warn(`test/e2e/windowFitControl.test.ts: skipped, no browser at ${CHROMIUM} (apt-get install chromium)`);

/** Long enough that its fit runs for seconds on a shared test machine, so the stop lands while it fits. */
const LONG_SAMPLES = 2_000_000;
/** After a stop the bench is idle again at once: well under the time the fit itself takes. */
const STOP_SETTLES_MS = 3000;
/** Writing, reading and starting to fit two million rows on a shared test machine. */
const LONG_TEST_MS = 300_000;
/** The probe's ratio scales the fitted final value exactly, up to the fit's last digits. */
const SCALE_AGREEMENT = 1e-6;

/** A 12 V step ringing at about 4.8 MHz, sampled every nanosecond, with seeded noise. */
function writeLongCapture(path: string): void {
  const random = createRandom(77);
  const lines = ['Time (s),CH1 (V)'];
  for (let i = 0; i < LONG_SAMPLES; i++) {
    const t = (i - 50_000) * 1e-9;
    const y = t < 0 ? 0 : 12 * (1 - Math.exp(-2e5 * t) * (Math.cos(3e7 * t) + (2e5 / 3e7) * Math.sin(3e7 * t)));
    lines.push(`${t.toExponential(6)},${(y + 0.05 * random.normal()).toFixed(4)}`);
  }
  writeFileSync(path, `${lines.join('\n')}\n`);
}

async function finalValue(page: Page): Promise<number> {
  return Number(await page.locator('#fit-results tr[data-quantity="finalValue"]').getAttribute('data-value'));
}

describe.skipIf(!hasChromium)('fit control in the window', () => {
  let opened: OpenedBench | undefined;
  let folder: string;
  let page: Page;

  beforeAll(async () => {
    opened = await openServedBench('fitcontrol', { width: 1280, height: 720 });
    ({ folder, page } = opened);
  });

  afterAll(() => closeServedBench(opened));

  it('scales the fitted final value by the probe ratio, turns it over when inverted, and refuses a bad ratio', async () => {
    const plain = await finalValue(page);
    let before = await fitCount(page);
    await page.fill('#probe-ratio', '10');
    await page.press('#probe-ratio', 'Enter');
    await waitForRefit(page, before);
    expect(Math.abs((await finalValue(page)) / plain - 10)).toBeLessThan(10 * SCALE_AGREEMENT);
    before = await fitCount(page);
    await page.check('#probe-invert');
    await waitForRefit(page, before);
    expect(Math.abs((await finalValue(page)) / plain + 10)).toBeLessThan(10 * SCALE_AGREEMENT);
    await page.screenshot({ path: join(outputDir, 'probe-inverted-1280.png') });
    await page.fill('#probe-ratio', 'ten');
    await page.press('#probe-ratio', 'Enter');
    await page.waitForSelector('#error-text');
    expect(await page.locator('#error-text').innerText()).toContain("probe ratio 'ten'");
    // Nothing changed: the inverted, scaled fit stays.
    expect(Math.abs((await finalValue(page)) / plain + 10)).toBeLessThan(10 * SCALE_AGREEMENT);
  }, LONG_TEST_MS);

  it('stops a long fit from the top bar, leaves the page usable, and refits the same capture after', async () => {
    const path = join(folder, 'long-step.csv');
    writeLongCapture(path);
    const before = await fitCount(page);
    const chooser = page.waitForEvent('filechooser');
    await page.click('#open-capture');
    await (await chooser).setFiles(path);
    await page.waitForFunction(() => /fitting/.test(document.querySelector('#progress')?.textContent ?? ''), undefined, { timeout: 120_000 });
    expect(await page.locator('#stop-work').isVisible()).toBe(true);
    await page.click('#stop-work');
    await page.waitForFunction(() => document.querySelector('#progress')?.textContent === '', undefined, { timeout: STOP_SETTLES_MS });
    expect(await page.locator('#stop-work').isVisible()).toBe(false);
    expect(await page.locator('#fit-status').innerText()).toContain('Fit stopped');
    expect(await fitCount(page)).toBe(before);
    expect(await page.locator('#capture-name').innerText()).toBe('long-step.csv');
    await page.screenshot({ path: join(outputDir, 'fit-stopped-1280.png') });
    // The capture is still open in the fresh worker: a short window fits.
    await page.fill('#window-start', '0');
    await page.fill('#window-end', '20us');
    await page.click('#apply-window');
    await waitForRefit(page, before);
    expect(await page.locator('#fit-state').getAttribute('data-status')).toBe('converged');
  }, LONG_TEST_MS);
});
