// What the browser bench keeps across a reload: the recent captures (a dropped file opened again from the list), and the
// session as it was left (window and known part) put back on that same capture only, never on another.

import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Browser, Page } from 'playwright-core';
import { rcStepCapture } from './generatedCaptures';
import { buildBench, CHROMIUM, dropFile, fitCount, hasChromium, launchChromium, outputDir, serveBench, waitForFit, waitForRefit, type ServedBench } from './benchHarness';

if (!hasChromium) console.warn(`test/e2e/windowSession.test.ts: skipped, no browser at ${CHROMIUM} (apt-get install chromium)`);

const SAMPLE = 'input-filter-step';
/** Each test opens and fits captures several times and reloads the page: minutes on a busy shared test machine. */
const SESSION_TEST_MS = 300_000;

async function recentNames(page: Page): Promise<string[]> {
  return page.locator('#recent-select option').evaluateAll((options) => options.filter((o) => (o as HTMLOptionElement).value !== '').map((o) => o.textContent ?? ''));
}

describe.skipIf(!hasChromium)('session kept across reloads', () => {
  let bench: ServedBench;
  let browser: Browser;
  let folder: string;
  let page: Page;
  let rcPath: string;

  beforeAll(async () => {
    buildBench();
    mkdirSync(outputDir, { recursive: true });
    folder = mkdtempSync(join(tmpdir(), 'ringbench-session-'));
    rcPath = join(folder, 'rc-charge.csv');
    writeFileSync(rcPath, rcStepCapture());
    bench = await serveBench(join(folder, 'bench-log.jsonl'), folder);
    browser = await launchChromium();
    page = await (await browser.newContext({ viewport: { width: 1280, height: 720 }, deviceScaleFactor: 1 })).newPage();
    await page.goto(bench.url);
    await waitForFit(page, `${SAMPLE}.csv`);
  });

  afterAll(async () => {
    await browser?.close();
    await bench?.stop();
    if (folder) rmSync(folder, { recursive: true, force: true });
  });

  it('lists the captures opened, and opens a dropped file again from the list after a reload', async () => {
    await dropFile(page, rcPath, 'rc-charge.csv');
    await waitForFit(page, 'rc-charge.csv');
    await page.selectOption('#sample-select', SAMPLE);
    await waitForFit(page, `${SAMPLE}.csv`);
    await page.reload();
    await waitForFit(page, `${SAMPLE}.csv`);
    expect(await recentNames(page)).toEqual([`${SAMPLE}.csv`, 'rc-charge.csv']);
    const id = await page.locator('#recent-select option', { hasText: 'rc-charge.csv' }).getAttribute('value');
    await page.selectOption('#recent-select', id as string);
    await waitForFit(page, 'rc-charge.csv');
    expect(await page.locator('#capture-samples').innerText()).toBe('1,500');
  }, SESSION_TEST_MS);

  it('reopens the capture with the window and known part it was left with, and never puts them on another capture', async () => {
    await page.selectOption('#sample-select', SAMPLE);
    await waitForFit(page, `${SAMPLE}.csv`);
    await page.fill('#known-value', '50u');
    await page.press('#known-value', 'Tab');
    const before = await fitCount(page);
    await page.fill('#window-start', '0');
    await page.fill('#window-end', '600us');
    await page.click('#apply-window');
    await waitForRefit(page, before);
    await page.reload();
    await waitForFit(page, `${SAMPLE}.csv`);
    await page.waitForFunction(() => (document.querySelector('#window-end') as HTMLInputElement).value === '600µs', undefined, { timeout: 60_000 });
    expect(await page.inputValue('#known-value')).toBe('50u');
    expect(await page.inputValue('#window-start')).toBe('0s');
    await page.screenshot({ path: join(outputDir, 'session-restored-1280.png') });
    // Another capture gets neither the window nor the typed part.
    await dropFile(page, rcPath, 'rc-charge.csv');
    await waitForFit(page, 'rc-charge.csv');
    expect(await page.inputValue('#known-value')).toBe('');
    expect(await page.inputValue('#window-end')).not.toBe('600µs');
  }, SESSION_TEST_MS);
});
