// End to end in Chromium: the bench-log panel amends a logged measurement's labels and withdraws another, each
// kept in the log as a correction with its reason (the earlier lines untouched), and marks both in its list.

import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Browser, Page } from 'playwright-core';
import { buildBench, CHROMIUM, hasChromium, launchChromium, outputDir, serveBench, waitForFit, type ServedBench } from './benchHarness';
import { readBenchLog } from '../../main/io/benchLog';
import { sampleRecord } from '../fixtures/benchLog/sampleRecord';

if (!hasChromium) console.warn(`test/e2e/benchLogAmend.test.ts: skipped, no browser at ${CHROMIUM}`);

const KEPT = '0000000000a1';
const RETYPED = '0000000000a2';
const WRONG_BOARD = '0000000000a3';

describe.skipIf(!hasChromium)('amending and withdrawing in the bench-log panel', () => {
  let bench: ServedBench;
  let browser: Browser;
  let page: Page;
  let folder: string;
  let logPath: string;
  let logged: Buffer;
  const problems: string[] = [];

  beforeAll(async () => {
    buildBench();
    mkdirSync(outputDir, { recursive: true });
    folder = mkdtempSync(join(tmpdir(), 'ringbench-e2e-amend-'));
    logPath = join(folder, 'bench-log.jsonl');
    const records = [
      sampleRecord({ id: KEPT, unit: 'GD-0101', time: '2026-11-30T09:10:00.000Z' }),
      sampleRecord({ id: RETYPED, unit: 'GD-01O2', operator: 'night shift', time: '2026-11-30T09:20:00.000Z' }),
      sampleRecord({ id: WRONG_BOARD, unit: 'GD-0103', time: '2026-11-30T09:30:00.000Z' }),
    ];
    writeFileSync(logPath, records.map((r) => `${JSON.stringify(r)}\n`).join(''));
    logged = readFileSync(logPath);
    bench = await serveBench(logPath, folder);
    browser = await launchChromium();
    page = await (await browser.newContext({ viewport: { width: 1600, height: 1000 }, deviceScaleFactor: 1 })).newPage();
    page.on('pageerror', (error) => problems.push(`page error: ${error.message}`));
    await page.goto(bench.url);
    await waitForFit(page, 'input-filter-step.csv');
    await page.waitForSelector(`#log-list tr[data-record="${KEPT}"]`);
  }, 180_000);

  afterAll(async () => {
    await browser?.close();
    await bench?.stop();
    if (folder) rmSync(folder, { recursive: true, force: true });
  });

  it('refuses a change without a reason, saying so in the panel and logging nothing', async () => {
    await page.click(`#log-change-${RETYPED}`);
    expect(await page.locator('#log-change-title').innerText()).toContain('GD-01O2');
    expect(await page.locator('#log-change-unit').inputValue()).toBe('GD-01O2');
    await page.fill('#log-change-unit', 'GD-0102');
    await page.click('#log-amend');
    await page.waitForSelector('#log-message.error-text');
    expect(await page.locator('#log-message').innerText()).toMatch(/say why the measurement of GD-01O2 is amended/);
    expect(readFileSync(logPath)).toEqual(logged);
  });

  it('amends the unit with a reason: the row shows the new unit marked amended, the log gains one correction line', async () => {
    await page.fill('#log-change-reason', 'letter O typed for a zero');
    await page.click('#log-amend');
    await page.waitForSelector(`#log-list tr[data-record="${RETYPED}"] .log-tag`);
    expect(await page.locator(`#log-list tr[data-record="${RETYPED}"] td`).first().innerText()).toMatch(/^GD-0102\s*amended$/);
    expect(await page.locator('#log-change').isHidden()).toBe(true);
    expect(await page.locator('#log-message').innerText()).toMatch(/Amended the measurement of GD-01O2/);
    const after = readFileSync(logPath);
    expect(after.subarray(0, logged.length)).toEqual(logged);
    const { corrections } = readBenchLog(logPath);
    expect(corrections).toHaveLength(1);
    expect(corrections[0]).toMatchObject({ target: RETYPED, action: 'amend', changes: { unit: 'GD-0102' }, reason: 'letter O typed for a zero' });
  });

  it('withdraws a measurement with its reason: it leaves the table and is listed apart, struck through', async () => {
    await page.click(`#log-change-${WRONG_BOARD}`);
    await page.fill('#log-change-reason', 'wrong board on the jig');
    await page.click('#log-withdraw');
    await page.waitForSelector(`#log-withdrawn li[data-record="${WRONG_BOARD}"]`);
    expect(await page.locator(`#log-list tr[data-record="${WRONG_BOARD}"]`).count()).toBe(0);
    expect(await page.locator(`#log-withdrawn li[data-record="${WRONG_BOARD}"]`).innerText()).toMatch(/GD-0103, 2026-11-30 09:30 withdrawn: wrong board on the jig/);
    expect(await page.locator('#log-path').innerText()).toMatch(/^2 measurements in bench-log\.jsonl/);
    expect(readBenchLog(logPath).corrections.map((c) => [c.target, c.action, c.reason])).toEqual([
      [RETYPED, 'amend', 'letter O typed for a zero'],
      [WRONG_BOARD, 'withdraw', 'wrong board on the jig'],
    ]);
    await page.locator('#log-panel').screenshot({ path: join(outputDir, 'bench-log-amended-1600.png') });
  });

  it('shows the panel with its change form whole at 1280x720', async () => {
    await page.setViewportSize({ width: 1280, height: 720 });
    await page.click(`#log-change-${KEPT}`);
    await page.locator('#log-panel').screenshot({ path: join(outputDir, 'bench-log-change-form-1280.png') });
    const form = await page.locator('#log-change').boundingBox();
    const panel = await page.locator('#log-panel').boundingBox();
    expect(form!.x + form!.width).toBeLessThanOrEqual(panel!.x + panel!.width + 0.5);
    await page.click('#log-change-cancel');
    expect(await page.locator('#log-change').isHidden()).toBe(true);
    expect(problems).toEqual([]);
  });
});
