// End to end: the design panel shows each quantity's limits and decision zone, the unit's decision and the rule
// (ISO 14253-1:2017 / ILAC-G8:09/2019 terms); a design's own limits and rule stay with values edited in the form.

import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { CHROMIUM, closeServedBench, hasChromium, openServedBench, outputDir, type OpenedBench } from './benchHarness';

if (!hasChromium) console.warn(`test/e2e/guardBandPanel.test.ts: skipped, no browser at ${CHROMIUM} (apt-get install chromium)`);

describe.skipIf(!hasChromium)('decision zones in the design panel', () => {
  let opened: OpenedBench | undefined;
  let page: Page;

  beforeAll(async () => {
    opened = await openServedBench('zones', { width: 1600, height: 1200 });
    ({ page } = opened);
  });

  afterAll(() => closeServedBench(opened));

  const row = (name: string) => page.locator(`#verdict tr[data-quantity="${name}"]`);

  it('shows the stated limits, the zones and the rule the design chose', async () => {
    await page.selectOption('#design-select', 'input-filter-step-limits');
    await page.waitForSelector('#verdict tr[data-quantity="f0"]');
    expect(await page.locator('#verdict-overall').getAttribute('data-decision')).toBe('pass');
    expect(await page.locator('#verdict-overall').innerText()).toContain('(accepted: pass)');
    expect(await row('f0').getAttribute('data-zone')).toBe('pass');
    expect(await row('f0').innerText()).toContain('8 kHz to 9.8 kHz');
    expect(await row('overshoot').innerText()).toContain('at most 60 %');
    // R from the fit with C at its design value: shown, not counted.
    expect(await row('R').getAttribute('data-counted')).toBe('false');
    expect(await row('R').innerText()).toContain('(not counted)');
    expect(await page.locator('#verdict-rule').innerText()).toMatch(/^Decision rule: guarded-acceptance, guard band w = 1 U, U = k u with k = 2 \(chosen by the design\)/);
    await page.evaluate(() => document.querySelector('#design-panel')?.scrollIntoView());
    await page.locator('#design-panel').screenshot({ path: join(outputDir, 'design-panel-zones.png') });
  });

  it('keeps the loaded design\'s limits and rule when values are edited in the form', async () => {
    await page.locator('#design-form').evaluate((form) => ((form as HTMLDetailsElement).open = true));
    // The damping ratio's stated limits are 0.15 to 0.25; R at 250 mΩ designs zeta 0.33, but the board's is measured,
    // so only the design column moves: f0 and zeta keep their stated limits and zones.
    const designedZeta = () => page.locator('#verdict tr[data-quantity="zeta"] td.number').first().innerText();
    const before = await designedZeta();
    await page.fill('#design-R', '250m');
    await page.click('#check-design');
    await page.waitForFunction((shown) => document.querySelector('#verdict tr[data-quantity="zeta"] td.number')?.textContent !== shown, before);
    expect(await designedZeta()).toMatch(/^0\.3[23]/);
    expect(await row('f0').innerText()).toContain('8 kHz to 9.8 kHz');
    expect(await row('zeta').innerText()).toContain('0.15 to 0.25');
    expect(await page.locator('#verdict-rule').innerText()).toContain('chosen by the design');
  });
});
