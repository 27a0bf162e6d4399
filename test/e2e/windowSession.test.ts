// What the browser bench keeps across a reload: the recent captures (a dropped file opened again from the list), a last
// capture a previous version kept (reopened, stored once), and the session as it was left (window and known part) put
// back on that same capture only, never on another.

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

  it('reopens the last capture a previous version kept whole, and drops its recent list', async () => {
    const fresh = await (await browser.newContext({ viewport: { width: 1280, height: 720 }, deviceScaleFactor: 1 })).newPage();
    const warnings: string[] = [];
    fresh.on('console', (message) => ['warning', 'error'].includes(message.type()) && warnings.push(message.text()));
    await fresh.goto(bench.url);
    await waitForFit(fresh, `${SAMPLE}.csv`);
    // The previous layout: the last capture with its content in 'ringbench' version 1, the recent list apart.
    await fresh.evaluate(async (text) => {
      const done = (request: IDBRequest | IDBOpenDBRequest) => new Promise((resolve, reject) => ((request.onsuccess = () => resolve(request.result)), (request.onerror = () => reject(request.error))));
      await done(indexedDB.deleteDatabase('ringbench'));
      const open = indexedDB.open('ringbench', 1);
      open.onupgradeneeded = () => open.result.createObjectStore('last-capture').put({ kind: 'file', name: 'kept-whole.csv', path: null, channel: 0, text }, 'last');
      (await done(open) as IDBDatabase).close();
      const recent = indexedDB.open('ringbench-recent', 1);
      recent.onupgradeneeded = () => recent.result.createObjectStore('contents').put({ text }, 'old-id');
      (await done(recent) as IDBDatabase).close();
      localStorage.setItem('ringbench.recent-captures', JSON.stringify([{ id: 'old-id', name: 'listed-before.csv', sampleId: null, path: null, openedAt: '2020-01-01T00:00:00Z' }]));
    }, rcStepCapture());
    await fresh.reload();
    await waitForFit(fresh, 'kept-whole.csv');
    expect(await fresh.locator('#capture-samples').innerText()).toBe('1,500');
    expect(await recentNames(fresh)).toEqual(['kept-whole.csv']);
    // Reopened, its content is stored once, under its digest, and the last capture only refers to it.
    const left = await fresh.evaluate(async () => {
      const done = <T>(request: IDBRequest<T>) => new Promise<T>((resolve, reject) => ((request.onsuccess = () => resolve(request.result)), (request.onerror = () => reject(request.error))));
      const db = (await done(indexedDB.open('ringbench'))) as IDBDatabase;
      const tx = db.transaction(['contents', 'memory']);
      const [keys, last] = await Promise.all([done(tx.objectStore('contents').getAllKeys()), done(tx.objectStore('memory').get('last'))]);
      db.close();
      const databases = (await indexedDB.databases()).map((d) => `${d.name} ${d.version}`).sort();
      return { databases, list: localStorage.getItem('ringbench.recent-captures'), keys, lastKeeps: Object.keys(last).sort() };
    });
    expect(left).toMatchObject({ databases: ['ringbench 2'], list: null, keys: [expect.stringMatching(/^[0-9a-f]{64}$/)] });
    expect(left.lastKeeps).toEqual(['channel', 'kind', 'name', 'path', 'reading', 'sha256']);
    expect(warnings).toEqual([]);
  }, SESSION_TEST_MS);
});
