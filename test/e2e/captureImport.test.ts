// End to end: the capture panel shows how the file was read (delimiter, decimal mark, time source), in a real browser.

import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Browser, Page } from 'playwright-core';
import { twoSegmentCapture } from './generatedCaptures';
import { buildBench, CHROMIUM, dropFile, hasChromium, launchChromium, outputDir, repoRoot, serveBench, waitForFit, type ServedBench } from './benchHarness';

if (!hasChromium) console.warn(`test/e2e/captureImport.test.ts: skipped, no browser at ${CHROMIUM} (apt-get install chromium)`);

describe.skipIf(!hasChromium)('the capture panel in a browser', () => {
  let bench: ServedBench;
  let browser: Browser;
  let page: Page;
  let folder: string;

  beforeAll(async () => {
    buildBench();
    mkdirSync(outputDir, { recursive: true });
    folder = mkdtempSync(join(tmpdir(), 'ringbench-import-'));
    bench = await serveBench(join(folder, 'bench-log.jsonl'), folder);
    browser = await launchChromium();
    page = await (await browser.newContext({ viewport: { width: 1600, height: 1000 }, deviceScaleFactor: 1 })).newPage();
  });

  afterAll(async () => {
    await browser?.close();
    await bench?.stop();
    if (folder) rmSync(folder, { recursive: true, force: true });
  });

  it('shows the delimiter and the time column of the sample opened on first start', async () => {
    await page.goto(bench.url);
    await waitForFit(page, 'input-filter-step.csv');
    expect(await page.locator('#import-import').innerText()).toBe('UTF-8, comma-separated, decimal point, LF line ends');
    expect(await page.locator('#import-time-axis').innerText()).toBe("column 'Time (s)' in s, every 400 ns");
  });

  it('shows a semicolon table with a decimal comma, and an interval stated in the preamble', async () => {
    await dropFile(page, join(repoRoot, 'test/fixtures/capture/lc-filter-decimal-comma.csv'), 'lc-filter-decimal-comma.csv');
    await waitForFit(page, 'lc-filter-decimal-comma.csv');
    expect(await page.locator('#import-import').innerText()).toContain('semicolon-separated, decimal comma');
    expect(await page.locator('#import-time-axis').innerText()).toBe("column 't [us]' in µs, every 500 ns");
    await page.locator('#capture-panel').screenshot({ path: join(outputDir, 'capture-panel-import.png') });
    await dropFile(page, join(repoRoot, 'sample-captures/pulse-jig-discharge.csv'), 'pulse-jig-discharge.csv');
    await waitForFit(page, 'pulse-jig-discharge.csv');
    expect(await page.locator('#import-time-axis').innerText()).toBe("interval 40 ns from 'Sample Interval' on line 2");
    expect(await page.locator('#import-import').innerText()).toContain('one column');
  });

  it('reads a dropped file from its bytes: UTF-16 with a byte-order mark, and a Windows-1252 micro sign', async () => {
    const text = readFileSync(join(repoRoot, 'sample-captures/input-filter-step.csv'), 'utf8');
    const utf16 = join(folder, 'utf16.csv');
    writeFileSync(utf16, Buffer.from(`\ufeff${text}`, 'utf16le'));
    await dropFile(page, utf16, 'utf16.csv');
    await waitForFit(page, 'utf16.csv');
    expect(await page.locator('#import-import').innerText()).toContain('UTF-16LE');
    expect(await page.locator('#capture-samples').innerText()).toBe('2,500');
    const [, ...rows] = text.trim().split('\n');
    const micro = join(folder, 'micro.csv');
    writeFileSync(micro, Buffer.from(['Time (\u00b5s),CH1 (V)', ...rows.map((row) => row.replace(/^[^,]+/, (t) => String(Number(t) * 1e6)))].join('\r\n'), 'latin1'));
    await dropFile(page, micro, 'micro.csv');
    await waitForFit(page, 'micro.csv');
    expect(await page.locator('#import-import').innerText()).toContain('Windows-1252');
    expect(await page.locator('#import-time-axis').innerText()).toBe("column 'Time (\u00b5s)' in µs, every 400 ns");
    await page.locator('#capture-panel').screenshot({ path: join(outputDir, 'capture-panel-windows-1252.png') });
  });

  it("names the channels that vary when the first one is flat", async () => {
    const lines = ['Time (s),Probe off (V),Node (V)'];
    for (let i = 0; i < 600; i++) {
      const t = -1e-6 + i * 1e-8;
      const ring = t < 0 ? 0 : Math.exp(-t * 1.5e6) * Math.sin(2 * Math.PI * 5e6 * t) + 0.01 * Math.sin(i * 12.9898);
      lines.push(`${t.toExponential(6)},0.25,${ring.toFixed(5)}`);
    }
    const file = join(folder, 'flat-first.csv');
    writeFileSync(file, `${lines.join('\n')}\n`);
    await dropFile(page, file, 'flat-first.csv');
    await waitForFit(page, 'flat-first.csv');
    expect(await page.locator('#fit-message').innerText()).toContain("channel 'Node' of this capture varies: choose the channel to fit");
  });

  it("refuses to fit a channel whose unit does not read, with empty window fields, and fits the channel chosen instead", async () => {
    const lines = ['Time (s),Temp (degC),Node (V)'];
    for (let i = 0; i < 600; i++) {
      const t = -1e-6 + i * 1e-8;
      const ring = t < 0 ? 0 : Math.exp(-t * 1.5e6) * Math.sin(2 * Math.PI * 5e6 * t) + 0.01 * Math.sin(i * 12.9898);
      lines.push(`${t.toExponential(6)},${(24.5 + 0.01 * (i % 3)).toFixed(2)},${ring.toFixed(5)}`);
    }
    const file = join(folder, 'with-temperature.csv');
    writeFileSync(file, `${lines.join('\n')}\n`);
    await dropFile(page, file, 'with-temperature.csv');
    await waitForFit(page, 'with-temperature.csv');
    expect(await page.locator('#fit-status').innerText()).toBe(
      "line 1: column 'Temp (degC)': unit 'degC' is not recognised; state the channel's unit with the 'Values in' choice, or choose another channel with the 'Channel' choice ('Node')",
    );
    // The last capture's window is not offered for this one.
    expect(await page.locator('#window-start').inputValue()).toBe('');
    expect(await page.locator('#window-end').inputValue()).toBe('');
    const fits = Number(await page.locator('#fit-panel').getAttribute('data-fit-count'));
    await page.locator('#channel-select').selectOption('1');
    await page.waitForFunction((n) => Number(document.querySelector('#fit-panel')?.getAttribute('data-fit-count')) > n && document.querySelector('#progress')?.textContent === '', fits, { timeout: 90_000 });
    expect(await page.locator('#fit-state').getAttribute('data-status')).toBe('converged');
    expect(await page.locator('#window-start').inputValue()).not.toBe('');
  });

  it('offers the segments of a file of repeated acquisitions and fits the one chosen', async () => {
    const file = join(folder, 'two-segments.csv');
    writeFileSync(file, twoSegmentCapture());
    await dropFile(page, file, 'two-segments.csv');
    await waitForFit(page, 'two-segments.csv');
    const choice = page.locator('#segment-select');
    expect(await choice.inputValue()).toBe('1');
    expect(await choice.locator('option').count()).toBe(2);
    const finalValue = async () => Number(await page.locator('#fit-results tr[data-quantity="finalValue"]').getAttribute('data-value'));
    const first = await finalValue();
    const fits = Number(await page.locator('#fit-panel').getAttribute('data-fit-count'));
    await choice.selectOption('2');
    await page.waitForFunction((n) => Number(document.querySelector('#fit-panel')?.getAttribute('data-fit-count')) > n && document.querySelector('#progress')?.textContent === '', fits, { timeout: 90_000 });
    expect(await page.locator('#segment-select').inputValue()).toBe('2');
    // The second acquisition is the first at half the amplitude.
    expect((await finalValue()) / first).toBeCloseTo(0.5, 3);
    await page.locator('#capture-panel').screenshot({ path: join(outputDir, 'capture-panel-segments.png') });
  });

  it('a capture caught after its step: no step metrics, no initial level judged, no prediction drawn', async () => {
    // The bundled input-filter step without its first 120 us: the record starts in the ring, after the event.
    const [header, ...rows] = readFileSync(join(repoRoot, 'sample-captures', 'input-filter-step.csv'), 'utf8').trim().split('\n');
    const file = join(folder, 'late-filter-step.csv');
    writeFileSync(file, `${[header, ...rows.filter((row) => Number(row.split(',')[0]) >= 120e-6)].join('\n')}\n`);
    await dropFile(page, file, 'late-filter-step.csv');
    await waitForFit(page, 'late-filter-step.csv');
    expect(await page.locator('#fit-state').getAttribute('data-status')).toBe('converged');
    expect(await page.locator('#transition-reason').innerText()).toMatch(/starts inside the response/);
    expect(await page.locator('#fit-results tr[data-quantity="t0"]').innerText()).toMatch(/^t₀\s*fit start\s+\d[\d.]* ?µs$/);
    await page.selectOption('#design-select', 'input-filter-step');
    await page.waitForSelector('#verdict tr[data-quantity="final value"]', { timeout: 90_000 });
    expect(await page.locator('#verdict tr[data-quantity="initial level"]').count()).toBe(0);
    expect(await page.locator('#design-panel').innerText()).toMatch(/No event time is known/);
    const traces = await page.evaluate(() => ((document.querySelector('#fit-plot') as unknown as { data?: { name: string }[] }).data ?? []).map((t) => t.name));
    expect(traces).toContain('Fit');
    expect(traces).not.toContain('Design prediction');
  });
});
