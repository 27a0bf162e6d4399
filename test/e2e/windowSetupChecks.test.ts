// The setup checks in the window: a capture whose preamble states a high-resolution acquisition and whose ring does
// not decay shows the refusal and the warning in the fit panel, each with its level; a bandwidth typed in the panel is weighed
// (screenshots for a person to look at).

import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { createRandom } from '../../core/random';
import { CHROMIUM, closeServedBench, dropFile, fitCount, hasChromium, openServedBench, outputDir, waitForFit, waitForRefit, type OpenedBench } from './benchHarness';

if (!hasChromium) console.warn(`test/e2e/windowSetupChecks.test.ts: skipped, no browser at ${CHROMIUM} (apt-get install chromium)`);

/** Opening the bench, fitting the first sample and the dropped capture on a shared test machine. */
const TEST_MS = 180_000;

/** A 5 V step ringing at 2 MHz that never decays, 1 % noise (seeded), under a preamble stating a high-resolution mode: invented data. */
function writeToneCapture(path: string): void {
  const random = createRandom(11);
  const omega = 2 * Math.PI * 2e6;
  const lines = ['Title,setup check demo', 'Acquisition Mode,High Res', '', 'Time (s),CH1 (V)'];
  for (let i = 0; i < 1200; i++) {
    const t = (i - 100) * 25e-9;
    const y = t < 0 ? 0 : 5 * (1 - Math.cos(omega * t));
    lines.push(`${t.toExponential(6)},${(y + 0.05 * random.normal()).toFixed(5)}`);
  }
  writeFileSync(path, `${lines.join('\n')}\n`);
}

describe.skipIf(!hasChromium)('setup checks in the window', () => {
  let opened: OpenedBench | undefined;
  let folder: string;
  let page: Page;

  beforeAll(async () => {
    opened = await openServedBench('setupchecks', { width: 1280, height: 860 });
    ({ folder, page } = opened);
  }, TEST_MS);

  afterAll(() => closeServedBench(opened));

  it('a sample capture shows no setup checks', async () => {
    expect(await page.locator('#setup-checks li').count()).toBe(0);
  });

  it('a scope bandwidth typed under "Scope and probe" refits and warns of its bias on alpha; cleared, the warning goes', async () => {
    await page.click('#setup-options summary');
    let before = await fitCount(page);
    await page.fill('#setup-bandwidth', '30k');
    await page.press('#setup-bandwidth', 'Enter');
    await waitForRefit(page, before);
    const item = page.locator('#setup-checks-list li[data-check="bandwidth"]');
    expect(await item.innerText()).toMatch(/warning\s+a first-order front end at 30 kHz \(the stated bandwidth\) moves the fitted alpha/);
    await item.scrollIntoViewIfNeeded();
    await page.screenshot({ path: join(outputDir, 'setup-bandwidth-1280.png') });
    await page.fill('#setup-bandwidth', 'wide');
    await page.press('#setup-bandwidth', 'Enter');
    expect(await page.locator('#setup-note').innerText()).toContain("scope bandwidth 'wide'");
    before = await fitCount(page);
    await page.fill('#setup-bandwidth', '');
    await page.click('#apply-setup');
    await waitForRefit(page, before);
    expect(await page.locator('#setup-checks li').count()).toBe(0);
  }, TEST_MS);

  it('shows the refusal first, then the acquisition-mode warning, each with its level', async () => {
    const file = join(folder, 'tone-hires.csv');
    writeToneCapture(file);
    await dropFile(page, file, 'tone-hires.csv');
    await waitForFit(page, 'tone-hires.csv');
    const items = page.locator('#setup-checks-list li');
    expect(await items.count()).toBe(2);
    expect(await items.nth(0).getAttribute('data-level')).toBe('refusal');
    expect(await items.nth(0).getAttribute('data-check')).toBe('sustained-oscillation');
    expect(await items.nth(0).innerText()).toMatch(/refused\s+the 2 MHz ring .* sustained oscillation, so alpha, zeta and Q cannot be given/);
    expect(await items.nth(1).getAttribute('data-check')).toBe('acquisition-mode');
    expect(await items.nth(1).innerText()).toContain("'Acquisition Mode: High Res'");
    // The badge says the answer was refused, in red, with no regime: never green beside a refusal.
    expect(await page.locator('#fit-state').getAttribute('data-tone')).toBe('bad');
    expect(await page.locator('#fit-state').innerText()).toContain('refused');
    expect(await page.locator('#fit-regime').count()).toBe(0);
    await page.locator('#fit-state').scrollIntoViewIfNeeded();
    await page.screenshot({ path: join(outputDir, 'setup-checks-badge-1280.png') });
    await page.screenshot({ path: join(outputDir, 'setup-checks-1280.png') });
  }, TEST_MS);
});
