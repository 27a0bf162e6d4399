// The lot report in headless Chromium: a seeded lot of 42 gate loops logged with real `log add` runs into
// two shard logs, merged by `report --lot`, rendered, screenshotted, and checked that it shows the yields,
// the capability table and a drawn histogram per quantity with the design value and the limits.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import type { Browser, Page } from 'playwright-core';
import { runCli } from '../../main/cli/program';
import type { CliIo } from '../../main/cli/io';
import { createRandom } from '../../core/random';
import { NOMINAL_LOOP, writeLoopCapture, writeLoopDesign, type LoopValues } from '../fixtures/benchLog/captures';
import { CHROMIUM, hasChromium, inkFraction, launchChromium, outputDir } from './benchHarness';

if (!hasChromium) console.warn(`lotReportScreenshot: ${CHROMIUM} is absent (install the Debian package 'chromium'); skipping the lot report test`);

/** Units in the lot: enough for the histograms to have shape (the issue asks for 40 or more). */
const UNITS = 42;
const SEED = 1313;
/** Part spreads of our bench scenario (relative, one sigma): resistor 1 %, loop inductance 2 %, capacitor 1 %. */
const SPREAD = { R: 0.01, L: 0.02, C: 0.01 };
/** Units built with a faulty part, found and reworked: a resistor 30 % high (wrong reel), an inductance 25 % high (long lead). */
const FAULTS: Record<number, Partial<LoopValues>> = { 7: { R: 1.95 }, 19: { R: 1.95 }, 31: { L: 15e-9 }, 36: { R: 1.95 } };
/** Of the faulty units, those reworked and measured again (in the other shard); 36 is left failed. */
const REWORKED = [7, 19, 31];

describe.skipIf(!hasChromium)('lot report in Chromium', () => {
  let folder: string;
  let browser: Browser;
  let page: Page;
  const exits: number[] = [];

  beforeAll(async () => {
    folder = mkdtempSync(join(tmpdir(), 'ringbench-e2e-lot-'));
    writeLoopDesign(folder);
    const io: CliIo = { out: () => {}, err: () => {}, cwd: folder, interactive: false };
    const random = createRandom(SEED);
    const logAdd = async (unit: string, loop: LoopValues, shard: string, seed: number) => {
      const file = `${unit.toLowerCase()}-${seed}.csv`;
      writeLoopCapture(folder, file, loop, seed);
      exits.push(await runCli(['log', 'add', file, '--log', shard, '--unit', unit, '--design', 'gate-loop.json', '--operator', 'line 2'], io));
    };
    for (let u = 1; u <= UNITS; u++) {
      const built: LoopValues = {
        ...NOMINAL_LOOP,
        R: NOMINAL_LOOP.R * (1 + SPREAD.R * random.normal()),
        L: NOMINAL_LOOP.L * (1 + SPREAD.L * random.normal()),
        C: NOMINAL_LOOP.C * (1 + SPREAD.C * random.normal()),
      };
      await logAdd(`SN${String(u).padStart(3, '0')}`, { ...built, ...FAULTS[u] }, u % 2 ? 'shard-a.jsonl' : 'shard-b.jsonl', 1000 + u);
    }
    for (const u of REWORKED) await logAdd(`SN${String(u).padStart(3, '0')}`, NOMINAL_LOOP, u % 2 ? 'shard-b.jsonl' : 'shard-a.jsonl', 2000 + u);
    expect(await runCli(['report', 'shard-a.jsonl', 'shard-b.jsonl', '--lot', '--out', 'lot.html'], io)).toBe(0);

    browser = await launchChromium();
    page = await browser.newPage({ viewport: { width: 1100, height: 1400 } });
    // Nothing may be fetched: the report is self-contained.
    await page.route(/^(?!file:)/, (route) => route.abort());
    await page.goto(pathToFileURL(join(folder, 'lot.html')).href);
  }, 300_000);

  afterAll(async () => {
    await browser?.close();
    if (folder) rmSync(folder, { recursive: true, force: true });
  });

  it('logged every capture (pass 0 or out of tolerance 3, no failed fit)', () => {
    expect(exits).toHaveLength(UNITS + REWORKED.length);
    for (const code of exits) expect([0, 3]).toContain(code);
  });

  it('shows first-pass and final yield over the 42 units of both shards, and counts every unit in a zone', async () => {
    const tiles = Object.fromEntries(
      await page.locator('#yield .tile').evaluateAll((nodes) => nodes.map((n) => [n.querySelector('.label')!.textContent, n.querySelector('.value')!.textContent])),
    );
    expect(tiles['units checked']).toBe(String(UNITS));
    // The yields agree with the list of units to look at (every unit not in it passed first and is accepted).
    const flagged = (await page.locator('table.flagged tbody tr').allInnerTexts()).map((row) => row.split('\t'));
    const percent = (count: number) => `${((100 * count) / UNITS).toFixed(1)} %`;
    expect(tiles['first-pass yield']).toBe(percent(UNITS - flagged.filter((cells) => cells[3] === 'no').length));
    expect(tiles['final yield']).toBe(percent(UNITS - flagged.filter((cells) => cells[2] === 'no').length));
    // Every faulty unit failed its first measurement; rework can only raise the yield.
    for (const u of Object.keys(FAULTS)) expect(flagged.find((cells) => cells[0] === `SN${u.padStart(3, '0')}`)?.[3]).toBe('no');
    expect(Number.parseFloat(tiles['final yield'])).toBeGreaterThanOrEqual(Number.parseFloat(tiles['first-pass yield']));
    const zones = ['pass', 'conditional pass', 'conditional fail', 'fail'].reduce((sum, z) => sum + Number(tiles[z]), 0);
    expect(zones).toBe(UNITS);
    expect(await page.locator('header .meta').innerText()).toMatch(/45 measurements of 42 units[\s\S]*shard-a\.jsonl[\s\S]*shard-b\.jsonl/);
  });

  it('tabulates each quantity over 42 units, with Cp and Cpk or why they are not defined', async () => {
    const heads = (await page.locator('table.capability thead th').allInnerTexts()).map((h) => h.toLowerCase());
    const column = (name: string) => heads.indexOf(name);
    const rows = await page.locator('table.capability tbody tr').allInnerTexts();
    expect(rows.length).toBeGreaterThanOrEqual(6);
    for (const row of rows) {
      const cells = row.split('\t');
      expect(cells[column('n')]).toBe(String(UNITS));
      // Cp and Cpk: a number with its 95 % interval around it, or 'not defined (...)'; never NaN, never an empty cell.
      for (const index of [cells[column('cp')].trim(), cells[column('cpk')].trim()]) {
        // Two decimals below 10, three significant digits above (215, 12.3).
        const number = '-?(?:\\d\\.\\d\\d|\\d\\d\\.\\d|\\d{3,})';
        expect(index).toMatch(new RegExp(`^(${number}\\s+\\[${number}, ${number}\\]|not defined \\(.+\\))$`));
        const [value, lower, upper] = (index.match(/-?\d+(\.\d+)?/g) ?? []).map(Number);
        if (lower !== undefined) expect(lower <= value && value <= upper).toBe(true);
      }
    }
    expect(await page.locator('body').innerText()).not.toMatch(/NaN|Infinity/);
    // The table stays inside the page's column (nothing cut off in print).
    const table = (await page.locator('table.capability').boundingBox())!;
    const textColumn = (await page.locator('#quantities-1 h2').boundingBox())!;
    expect(table.x + table.width).toBeLessThanOrEqual(textColumn.x + textColumn.width + 0.5);
    expect(await page.locator('#quantities-1').innerText()).toContain('s is the sample standard deviation (n - 1)');
  });

  it('draws a histogram per quantity with bars, the design line, and the limits where given', async () => {
    mkdirSync(outputDir, { recursive: true });
    writeFileSync(join(outputDir, 'lot-report.png'), await page.screenshot({ fullPage: true }));
    const rows = await page.locator('table.capability tbody tr').count();
    const plots = page.locator('svg.lot-histogram');
    expect(await plots.count()).toBe(rows);
    for (let i = 0; i < rows; i++) {
      const plot = plots.nth(i);
      const box = (await plot.boundingBox())!;
      expect(box.width).toBeGreaterThan(400);
      expect(box.height).toBeGreaterThan(150);
      const bars = await plot.locator('rect.bar').evaluateAll((nodes) => nodes.map((n) => (n as SVGRectElement).getBBox().height));
      expect(bars.length).toBeGreaterThan(1);
      for (const height of bars) expect(height).toBeGreaterThan(0);
      expect(await plot.locator('line.design').count()).toBe(1);
    }
    // The bars are really painted: the first histogram as pixels holds more than axes and labels.
    const shot = await plots.first().screenshot();
    writeFileSync(join(outputDir, 'lot-report-histogram.png'), shot);
    expect(await inkFraction(browser, shot)).toBeGreaterThan(0.05);
    // Limits are drawn exactly where the table gives them.
    const heads = (await page.locator('table.capability thead th').allInnerTexts()).map((h) => h.toLowerCase());
    const limitColumns = [heads.indexOf('lsl'), heads.indexOf('usl')];
    const limitCells = (await page.locator('table.capability tbody tr').allInnerTexts()).map(
      (row) => limitColumns.filter((k) => row.split('\t')[k] !== '–').length,
    );
    for (let i = 0; i < rows; i++) expect(await plots.nth(i).locator('line.limit').count()).toBe(limitCells[i]);
  });

  it('bins the failures by likely cause and lists the reworked and failed units', async () => {
    const causes = await page.locator('table.causes tbody tr').allInnerTexts();
    // SN036 (resistor 30 % high, not reworked) fails at its latest measurement, named under R.
    expect(causes.some((row) => /^R\t\d+\t.*SN036/.test(row))).toBe(true);
    const flagged = await page.locator('table.flagged tbody tr').allInnerTexts();
    for (const unit of ['SN007', 'SN019', 'SN031', 'SN036']) expect(flagged.some((row) => row.startsWith(unit))).toBe(true);
    expect(flagged.find((row) => row.startsWith('SN007'))).toMatch(/\t(yes|no)\tno\t2\t/);
  });

  it('uses only what is inline: no scripts and no resource requests', async () => {
    expect(await page.locator('script').count()).toBe(0);
    expect(await page.evaluate(() => performance.getEntriesByType('resource').map((e) => e.name))).toEqual([]);
    expect(readFileSync(join(folder, 'lot.html'), 'utf8')).toContain('<style>');
  });
});
