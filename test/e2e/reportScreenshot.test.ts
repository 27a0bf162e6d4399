// The HTML report in headless Chromium: logged through the command line, rendered, screenshotted, and
// checked that its plots are really drawn (SVG boxes with size, fit and prediction colours in the pixels).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { existsSync, mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { inflateSync } from 'node:zlib';
import { chromium, type Browser, type Page } from 'playwright-core';
import { runCli } from '../../main/cli/program';
import type { CliIo } from '../../main/cli/io';
import { NOMINAL_LOOP, writeLoopCapture, writeLoopDesign } from '../fixtures/benchLog/captures';

const CHROMIUM = '/usr/bin/chromium';
const haveChromium = existsSync(CHROMIUM);
if (!haveChromium) console.warn(`reportScreenshot: ${CHROMIUM} is absent (install the Debian package 'chromium'); skipping the report screenshot test`);

const outputFolder = resolve(dirname(fileURLToPath(import.meta.url)), '../../test-output');

interface Png {
  width: number;
  height: number;
  /** RGBA, 4 bytes per pixel. */
  pixels: Uint8Array;
}

/** Decode an 8-bit RGB or RGBA, non-interlaced PNG (what Chromium writes) with node:zlib. */
function decodePng(data: Buffer): Png {
  let offset = 8;
  let width = 0;
  let height = 0;
  let channels = 0;
  const idat: Buffer[] = [];
  while (offset < data.length) {
    const length = data.readUInt32BE(offset);
    const type = data.toString('latin1', offset + 4, offset + 8);
    const body = data.subarray(offset + 8, offset + 8 + length);
    if (type === 'IHDR') {
      width = body.readUInt32BE(0);
      height = body.readUInt32BE(4);
      if (body[8] !== 8 || body[12] !== 0) throw new Error('only 8-bit non-interlaced PNG is decoded here');
      channels = body[9] === 6 ? 4 : body[9] === 2 ? 3 : 0;
      if (!channels) throw new Error(`PNG colour type ${body[9]} is not decoded here`);
    } else if (type === 'IDAT') idat.push(body);
    offset += 12 + length;
  }
  const raw = inflateSync(Buffer.concat(idat));
  const stride = width * channels;
  const rows = new Uint8Array(height * stride);
  for (let y = 0; y < height; y++) {
    const filter = raw[y * (stride + 1)];
    for (let x = 0; x < stride; x++) {
      const value = raw[y * (stride + 1) + 1 + x];
      const left = x >= channels ? rows[y * stride + x - channels] : 0;
      const up = y > 0 ? rows[(y - 1) * stride + x] : 0;
      const upLeft = y > 0 && x >= channels ? rows[(y - 1) * stride + x - channels] : 0;
      let predictor = 0;
      if (filter === 1) predictor = left;
      else if (filter === 2) predictor = up;
      else if (filter === 3) predictor = (left + up) >> 1;
      else if (filter === 4) {
        const p = left + up - upLeft;
        const [pa, pb, pc] = [Math.abs(p - left), Math.abs(p - up), Math.abs(p - upLeft)];
        predictor = pa <= pb && pa <= pc ? left : pb <= pc ? up : upLeft;
      }
      rows[y * stride + x] = (value + predictor) & 0xff;
    }
  }
  const pixels = new Uint8Array(width * height * 4);
  for (let i = 0; i < width * height; i++) {
    for (let c = 0; c < 3; c++) pixels[i * 4 + c] = rows[i * channels + c];
    pixels[i * 4 + 3] = channels === 4 ? rows[i * channels + 3] : 255;
  }
  return { width, height, pixels };
}

/** Pixels within `tolerance` of an RGB colour. */
function countColour(png: Png, [r, g, b]: [number, number, number], tolerance = 40): number {
  let count = 0;
  for (let i = 0; i < png.width * png.height; i++) {
    const p = png.pixels;
    if (Math.abs(p[4 * i] - r) + Math.abs(p[4 * i + 1] - g) + Math.abs(p[4 * i + 2] - b) <= tolerance) count++;
  }
  return count;
}

describe.skipIf(!haveChromium)('HTML report in Chromium', () => {
  let folder: string;
  let browser: Browser;
  let page: Page;

  beforeAll(async () => {
    folder = mkdtempSync(join(tmpdir(), 'ringbench-e2e-report-'));
    writeLoopCapture(folder, 'sn040.csv', NOMINAL_LOOP, 40);
    writeLoopCapture(folder, 'sn041.csv', { ...NOMINAL_LOOP, R: 3 }, 41);
    writeLoopCapture(folder, 'sn042.csv', { ...NOMINAL_LOOP, C: 2.4e-9 }, 42);
    writeLoopDesign(folder);
    const io: CliIo = { out: () => {}, err: () => {}, cwd: folder, interactive: false };
    const log = ['--log', 'bench.jsonl'];
    expect(await runCli(['log', 'add', 'sn040.csv', ...log, '--unit', 'SN040', '--design', 'gate-loop.json', '--operator', 'M. Okafor'], io)).toBe(0);
    expect(await runCli(['log', 'add', 'sn041.csv', ...log, '--unit', 'SN041', '--design', 'gate-loop.json', '--note', 'R12 fitted from the wrong reel?'], io)).toBe(3);
    expect(await runCli(['log', 'add', 'sn042.csv', ...log, '--unit', 'SN042', '--topology', 'series', '--known', 'C=2.4n,5%'], io)).toBe(0);
    expect(await runCli(['report', ...log, '--out', 'report.html'], io)).toBe(0);

    browser = await chromium.launch({
      executablePath: CHROMIUM,
      headless: true,
      args: ['--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
    });
    page = await browser.newPage({ viewport: { width: 1100, height: 1400 } });
    // Nothing may be fetched: the report is self-contained.
    await page.route(/^(?!file:)/, (route) => route.abort());
    await page.goto(pathToFileURL(join(folder, 'report.html')).href);
  });

  afterAll(async () => {
    await browser?.close();
    if (folder) rmSync(folder, { recursive: true, force: true });
  });

  it('shows the yield table with one row per unit and the yield', async () => {
    const rows = await page.locator('table.yield-table tbody tr').allInnerTexts();
    expect(rows).toHaveLength(3);
    expect(rows[0]).toMatch(/SN040[\s\S]*pass/);
    expect(rows[1]).toMatch(/SN041[\s\S]*fail/);
    expect(rows[2]).toMatch(/SN042[\s\S]*not checked/);
    expect(await page.locator('table.yield-table tfoot').innerText()).toMatch(/1 pass · 1 fail · 1 not checked\s+50\.0 %/);
  });

  it('draws every plot with a real size, and its pixels show data, fit and prediction', async () => {
    mkdirSync(outputFolder, { recursive: true });
    const shot = await page.screenshot({ fullPage: true });
    writeFileSync(join(outputFolder, 'reportScreenshot.png'), shot);

    const plots = page.locator('svg.overlay-plot');
    expect(await plots.count()).toBe(3);
    for (let i = 0; i < 3; i++) {
      const box = (await plots.nth(i).boundingBox())!;
      expect(box.width).toBeGreaterThan(400);
      expect(box.height).toBeGreaterThan(150);
    }
    // SN041 was checked against the design: it has the fit and the (different) prediction.
    const png = decodePng(await plots.nth(1).screenshot());
    writeFileSync(join(outputFolder, 'reportScreenshot-plot.png'), await plots.nth(1).screenshot());
    const total = png.width * png.height;
    let background = 0;
    for (let i = 0; i < total; i++) if (png.pixels[4 * i] > 245 && png.pixels[4 * i + 1] > 245 && png.pixels[4 * i + 2] > 245) background++;
    expect(total - background).toBeGreaterThan(total * 0.02);
    expect(countColour(png, [0x00, 0x72, 0xb2])).toBeGreaterThan(300); // fit, Okabe-Ito blue
    expect(countColour(png, [0xd5, 0x5e, 0x00])).toBeGreaterThan(150); // prediction, Okabe-Ito vermillion
    expect(countColour(png, [0x8a, 0x8a, 0x8a], 30)).toBeGreaterThan(50); // measured, neutral grey
    // SN042 has no design: no prediction drawn.
    expect(await plots.nth(2).locator('.prediction').count()).toBe(0);
  });

  it('prints: the print layout keeps the plots and the verdicts', async () => {
    await page.emulateMedia({ media: 'print' });
    const pdf = await page.pdf({ format: 'A4' });
    expect(pdf.length).toBeGreaterThan(20_000);
    expect(await page.locator('svg.overlay-plot').first().isVisible()).toBe(true);
    await page.emulateMedia({ media: 'screen' });
  });

  it('uses only what is inline: no scripts and no resource requests', async () => {
    expect(await page.locator('script').count()).toBe(0);
    const external = await page.evaluate(() => performance.getEntriesByType('resource').map((e) => e.name));
    expect(external).toEqual([]);
    expect(readFileSync(join(folder, 'report.html'), 'utf8')).toContain('<style>');
  });
});
