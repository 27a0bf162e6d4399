// End to end in Chromium: what carries from one capture to the next (nothing measured, no known part), the channel
// kept over a reload, a dropped design, uncertainty labels, the cautions grouped by quantity, legible dark-theme
// exports with their caption, copying the results and the plot, and the print layout.

import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { buildBench, CHROMIUM, dropFile, fitCount, hasChromium, launchChromium, outputDir, repoRoot, serveBench, waitForFit, waitForRefit, type ServedBench } from './benchHarness';

if (!hasChromium) console.warn(`test/e2e/windowState.test.ts: skipped, no browser at ${CHROMIUM} (apt-get install chromium)`);

const samplesDir = resolve(repoRoot, 'sample-captures');

/** WCAG 2 contrast ratio of two sRGB colours given as [r, g, b] in 0..255. */
function contrast(a: number[], b: number[]): number {
  const luminance = (c: number[]) => {
    const [r, g, bl] = c.map((v) => {
      const s = v / 255;
      return s <= 0.03928 ? s / 12.92 : ((s + 0.055) / 1.055) ** 2.4;
    });
    return 0.2126 * r + 0.7152 * g + 0.0722 * bl;
  };
  const [hi, lo] = [luminance(a), luminance(b)].sort((x, y) => y - x);
  return (hi + 0.05) / (lo + 0.05);
}

/**
 * The background an SVG is seen on (its first full-size opaque rectangle, else the white of a viewer or a page) and
 * the fill of every piece of text in it, read by the browser's own style resolution.
 */
async function svgColours(browser: Browser, svg: string): Promise<{ background: number[]; texts: { text: string; fill: number[] }[] }> {
  const page = await browser.newPage();
  try {
    return await page.evaluate((markup) => {
      const rgb = (css: string) => (css.match(/[\d.]+/g) ?? ['255', '255', '255']).slice(0, 3).map(Number);
      const holder = document.createElement('div');
      holder.innerHTML = markup;
      document.body.append(holder);
      const root = holder.querySelector('svg') as SVGSVGElement;
      const first = root.firstElementChild;
      const width = Number(root.getAttribute('width'));
      let background = [255, 255, 255];
      if (first?.tagName === 'rect' && Number(first.getAttribute('width')) >= width) {
        const style = getComputedStyle(first);
        if (style.fill !== 'none' && Number(style.fillOpacity) > 0 && !/rgba\(.*,\s*0\)/.test(style.fill)) background = rgb(style.fill);
      }
      const texts = Array.from(root.querySelectorAll('text'))
        .filter((t) => (t.textContent ?? '').trim() !== '' && getComputedStyle(t).display !== 'none' && Number(getComputedStyle(t).fillOpacity) > 0)
        .map((t) => ({ text: t.textContent ?? '', fill: rgb(getComputedStyle(t).fill) }));
      return { background, texts };
    }, svg);
  } finally {
    await page.close();
  }
}

/**
 * A PNG's corner pixel (its background: alpha too), its size, and the strongest contrast against it, as seen on white,
 * of any pixel (best) and of any pixel in the top `band` rows (bandBest).
 */
async function pngContrast(browser: Browser, png: Buffer, band: number): Promise<{ cornerAlpha: number; best: number; bandBest: number; width: number; height: number }> {
  const page = await browser.newPage();
  try {
    const { corner, pixels, bandPixels, width, height } = await page.evaluate(async ([base64, band]) => {
      const image = new Image();
      image.src = `data:image/png;base64,${base64}`;
      await image.decode();
      const canvas = document.createElement('canvas');
      canvas.width = image.width;
      canvas.height = image.height;
      const context = canvas.getContext('2d') as CanvasRenderingContext2D;
      context.drawImage(image, 0, 0);
      const { data } = context.getImageData(0, 0, image.width, image.height);
      // Distinct colours only: the contrast check runs in Node over a few thousand, not millions of pixels.
      const distinct = (from: number, to: number) => {
        const seen = new Set<number>();
        const found: number[][] = [];
        for (let i = from; i < to; i += 4) {
          const onWhite = [0, 1, 2].map((k) => Math.round((data[i + k] * data[i + 3] + 255 * (255 - data[i + 3])) / 255));
          const key = (onWhite[0] << 16) | (onWhite[1] << 8) | onWhite[2];
          if (!seen.has(key)) {
            seen.add(key);
            found.push(onWhite);
          }
        }
        return found;
      };
      return {
        corner: [data[0], data[1], data[2], data[3]],
        pixels: distinct(0, data.length),
        bandPixels: distinct(0, Math.min(band, image.height) * image.width * 4),
        width: image.width,
        height: image.height,
      };
    }, [png.toString('base64'), band] as const);
    const background = corner.slice(0, 3).map((v) => Math.round((v * corner[3] + 255 * (255 - corner[3])) / 255));
    const strongest = (found: number[][]) => Math.max(...found.map((p) => contrast(p, background)));
    return { cornerAlpha: corner[3], best: strongest(pixels), bandBest: strongest(bandPixels), width, height };
  } finally {
    await page.close();
  }
}

async function download(page: Page, selector: string): Promise<{ name: string; bytes: Buffer }> {
  const waiting = page.waitForEvent('download');
  await page.click(selector);
  const saved = await waiting;
  const file = join(outputDir, `window-state-${saved.suggestedFilename()}`);
  await saved.saveAs(file);
  return { name: saved.suggestedFilename(), bytes: readFileSync(file) };
}

async function openSample(page: Page, id: string): Promise<void> {
  const fits = await fitCount(page);
  await page.selectOption('#sample-select', id);
  await waitForRefit(page, fits);
  await waitForFit(page, `${id}.csv`);
}

describe.skipIf(!hasChromium)('the window from one capture to the next, its cautions, exports, copies and print', () => {
  let bench: ServedBench;
  let browser: Browser;
  let context: BrowserContext;
  let page: Page;
  let folder: string;
  const problems: string[] = [];

  beforeAll(async () => {
    buildBench();
    mkdirSync(outputDir, { recursive: true });
    folder = mkdtempSync(join(tmpdir(), 'ringbench-window-state-'));
    bench = await serveBench(join(folder, 'bench-log.jsonl'), folder);
    browser = await launchChromium();
    context = await browser.newContext({ viewport: { width: 1280, height: 720 }, deviceScaleFactor: 1, acceptDownloads: true });
    await context.grantPermissions(['clipboard-read', 'clipboard-write'], { origin: bench.origin });
    page = await context.newPage();
    page.on('pageerror', (error) => problems.push(error.message));
    // An export once parsed the plot's markup into a document, and the page's CSP refused each inline style in it.
    page.on('console', (message) => message.type() === 'error' && problems.push(`console: ${message.text()}`));
    await page.goto(bench.url);
    await waitForFit(page, 'input-filter-step.csv');
    await page.waitForSelector('#verdict-overall');
  });

  afterAll(async () => {
    await browser?.close();
    await bench?.stop();
    if (folder) rmSync(folder, { recursive: true, force: true });
  });

  it('says which uncertainty is which: the measurement in the components, the combined one in the design check', async () => {
    expect(await page.locator('#known-part-state').getAttribute('data-from')).toBe('sample');
    expect(await page.locator('#known-part-state').innerText()).toBe('Known part C = 47u, as the sample list states for input-filter-step.csv.');
    expect(await page.locator('#components-uncertainty').innerText()).toMatch(/^± measurement uncertainty \(1σ\)/);
    expect(await page.locator('#verdict-design-head').innerText()).toBe('Design ± tolerance');
    expect(await page.locator('#verdict-measured-head').innerText()).toBe('Measured ± combined');
    expect(await page.locator('#verdict-uncertainty').innerText()).toMatch(/combines the fit with that part's tolerance/);
  });

  it('copies the results as the command line prints them, as a CSV row, and the plot as an image', async () => {
    await page.click('#copy-text');
    await page.waitForFunction(() => document.querySelector('#copy-note')?.textContent === 'Results copied as text.');
    const text = await page.evaluate(() => navigator.clipboard.readText());
    const cli = spawnSync(process.execPath, [resolve(repoRoot, 'bin/ringbench.js'), 'fit', join(samplesDir, 'input-filter-step.csv'), '--topology', 'series', '--known', 'C=47u'], { cwd: repoRoot, encoding: 'utf8' });
    // The command line names the file by the path it was given; the window by its name. The fit's rows are the same text.
    const rows = (s: string) => s.split('\n').filter((line) => /^ {2}(alpha|omega0|zeta|Q|R|L|C) /.test(line));
    expect(rows(text).length).toBe(7);
    expect(rows(text)).toEqual(rows(cli.stdout));
    expect(text.split('\n')[0]).toBe('input-filter-step.csv (CH1)');

    await page.click('#copy-csv');
    await page.waitForFunction(() => document.querySelector('#copy-note')?.textContent?.startsWith('Results copied as a CSV'));
    const [header, row, end] = (await page.evaluate(() => navigator.clipboard.readText())).split('\r\n');
    expect(end).toBe('');
    const cells = Object.fromEntries(header.split(',').map((name, k) => [name, row.split(',')[k]]));
    expect(cells.file).toBe('input-filter-step.csv');
    expect(Number(cells.omega0_rad_per_s)).toBe(Number(await page.locator('#fit-results tr[data-quantity="omega0"]').getAttribute('data-value')));
    expect(Number(cells.C_f)).toBe(47e-6);

    await page.click('#copy-plot');
    await page.waitForFunction(() => document.querySelector('#copy-note')?.textContent === 'Plot copied as an image.');
    const image = await page.evaluate(async () => {
      const [item] = await navigator.clipboard.read();
      const blob = await item.getType('image/png');
      const bitmap = await createImageBitmap(blob);
      return { types: item.types, width: bitmap.width, height: bitmap.height };
    });
    expect(image.types).toContain('image/png');
    expect(image.width).toBeGreaterThan(400);
    expect(image.height).toBeGreaterThan(200);
  });

  it('prints the results, the plot and the verdict without the controls', async () => {
    // A page of its own: the print layout reflows the plot, and the page the other steps use keeps its screen layout.
    const printed = await context.newPage();
    try {
      await printed.goto(bench.url);
      await waitForFit(printed, 'input-filter-step.csv');
      await printed.waitForSelector('#verdict-overall');
      await printed.emulateMedia({ media: 'print' });
      for (const control of ['#open-capture', '#export-png', '#copy-text', '#apply-window', '#known-value', '#open-design', '#theme-toggle']) {
        expect(await printed.locator(control).isVisible(), control).toBe(false);
      }
      for (const result of ['#fit-results', '#fit-plot', '#verdict-overall', '#components-results', '#cautions-deferral']) {
        expect(await printed.locator(result).isVisible(), result).toBe(true);
      }
      await printed.screenshot({ path: join(outputDir, 'window-state-print.png'), fullPage: true });
    } finally {
      await printed.close();
    }
  });

  it('exports legible PNG and SVG in the dark theme, captioned with the file, channel and fit', async () => {
    await page.click('#theme-toggle');
    await page.waitForFunction(() => document.documentElement.dataset.theme === 'dark');
    try {
      const svg = await download(page, '#export-svg');
      expect(svg.name).toBe('input-filter-step-fit.svg');
      const markup = svg.bytes.toString('utf8');
      expect(markup).toMatch(/^<svg[\s\S]*Measured[\s\S]*<\/svg>$/);
      const { background, texts } = await svgColours(browser, markup);
      expect(texts.map((t) => t.text)).toContain('input-filter-step.csv · CH1 (V)');
      expect(texts.find((t) => t.text.startsWith('converged, underdamped · f0 = '))).toBeDefined();
      for (const t of texts) expect(contrast(t.fill, background), `"${t.text}" against the background`).toBeGreaterThan(3);

      const png = await download(page, '#export-png');
      expect(png.bytes.subarray(0, 8).toString('hex')).toBe('89504e470d0a1a0a');
      // The PNG is the captioned SVG drawn at twice its size: the caption band on top holds legible text (the plot is below it).
      const svgSize = (/<svg[^>]*\swidth="([\d.]+)"[^>]*\sheight="([\d.]+)"/.exec(markup) ?? []).slice(1).map(Number);
      const captionRows = 2 * 40;
      const seen = await pngContrast(browser, png.bytes, captionRows);
      expect(seen.cornerAlpha).toBe(255);
      expect(seen.best).toBeGreaterThan(7);
      expect([seen.width, seen.height]).toEqual(svgSize.map((v) => Math.round(2 * v)));
      expect(seen.bandBest, 'caption text in the PNG').toBeGreaterThan(4.5);
    } finally {
      await page.click('#theme-toggle');
      await page.waitForFunction(() => document.documentElement.dataset.theme === 'light');
    }
  });

  it('opens another capture with no known part, said on the page, and no caution from the last one', async () => {
    await dropFile(page, join(samplesDir, 'gate-drive-turn-on.csv'), 'gate-drive-turn-on.csv');
    await waitForFit(page, 'gate-drive-turn-on.csv');
    expect(await page.locator('#known-part-state').getAttribute('data-from')).toBe('none');
    expect(await page.locator('#known-part-state').innerText()).toBe('No known part for gate-drive-turn-on.csv: enter one to derive R, L and C.');
    expect(await page.locator('#known-value').inputValue()).toBe('');
    expect(await page.locator('#components-results tr').count()).toBe(0);
    // 15 V on 47 µF carried over would say 705 µC stored and fire the charge caution.
    expect(await page.locator('[data-caution="charge-45uc"]').count()).toBe(0);
    expect(await page.locator('#cautions-stored').innerText()).toMatch(/^Stored charge and energy not weighed/);
  });

  it('opens a sample with the known part its entry states, and weighs its stored charge with it', async () => {
    await page.fill('#known-value', '390p');
    await page.press('#known-value', 'Enter');
    await page.locator('#known-value').blur();
    await page.waitForFunction(() => document.querySelector('#known-part-state')?.getAttribute('data-from') === 'typed');
    await openSample(page, 'pulse-jig-discharge');
    expect(await page.locator('#known-part-state').innerText()).toBe('Known part C = 2u, as the sample list states for pulse-jig-discharge.csv.');
    expect(await page.locator('[data-caution="charge-45uc"]').count()).toBe(1);
  });

  it('says when a capture\'s peak could not be weighed for want of a unit, in the window\'s words', async () => {
    // The 400 V sample with its unit taken off: no rule can fire, and the panel must not read as safe.
    const unitless = join(folder, 'pulse-jig-unitless.csv');
    writeFileSync(unitless, readFileSync(join(samplesDir, 'pulse-jig-discharge.csv'), 'utf8').replace('CH1 (V)', 'CH1'));
    await dropFile(page, unitless, 'pulse-jig-unitless.csv');
    await waitForFit(page, 'pulse-jig-unitless.csv');
    expect(await page.locator('#cautions-fired').count()).toBe(0);
    expect(await page.locator('#cautions-unweighed').innerText()).toBe(
      "Not weighed: the channel states no unit, so its peak was weighed neither as a voltage nor as a current; state V or A with the 'Values in' choice.",
    );
    await page.locator('#cautions-unweighed').scrollIntoViewIfNeeded();
    await page.screenshot({ path: join(outputDir, 'cautions-unweighed.png') });
    // Stated as volts in the capture panel, the same file is weighed, and its 400 V fires the voltage cautions.
    await page.selectOption('#value-unit', 'V');
    await page.waitForSelector('#cautions-fired li[data-group="peak voltage"]');
    expect(await page.locator('#cautions-unweighed').count()).toBe(0);
    await page.selectOption('#value-unit', '');
    await page.waitForSelector('#cautions-unweighed');
    await openSample(page, 'pulse-jig-discharge');
    expect(await page.locator('#cautions-unweighed').count()).toBe(0);
  });

  it('groups the cautions by quantity, strongest threshold first, each with its source, in a compact panel', async () => {
    const groups = page.locator('#cautions-fired > li');
    const names = await groups.evaluateAll((items) => items.map((li) => (li as HTMLElement).dataset.group));
    expect(new Set(names).size).toBe(names.length);
    const peak = page.locator('#cautions-fired > li[data-group="peak voltage"]');
    expect(await peak.locator('.caution-quantity').innerText()).toMatch(/^Peak voltage 40\d\.\d V — reaches 4 thresholds$/);
    const thresholds = await peak.locator('[data-threshold]').evaluateAll((items) => items.map((li) => Number((li as HTMLElement).dataset.threshold)));
    expect(thresholds).toEqual([...thresholds].sort((a, b) => b - a));
    for (const source of await peak.locator('.caution-source').allInnerTexts()) expect(source).toMatch(/\((verified|from memory)\)$/);
    expect(await page.locator('#cautions-deferral').isVisible()).toBe(true);
    expect(await page.locator('#cautions-deferral').innerText()).toMatch(/local electrical codes/);
    expect(await page.locator('#cautions-advice-box summary').innerText()).toMatch(/^At the bench: 3 habits/);
    const box = (await page.locator('#cautions-panel').boundingBox())!;
    expect((box.width * box.height) / (1280 * 720)).toBeLessThan(0.25);
    await page.locator('#cautions-panel').screenshot({ path: join(outputDir, 'window-state-cautions-1280.png') });
    await page.click('#cautions-fold');
    const folded = (await page.locator('#cautions-panel').boundingBox())!;
    expect(folded.height).toBeLessThan(box.height * 0.75);
    expect(await peak.locator('.caution-source').first().isVisible()).toBe(true);
    expect(await page.locator('#cautions-deferral').isVisible()).toBe(true);
    await page.locator('#cautions-panel').screenshot({ path: join(outputDir, 'window-state-cautions-folded.png') });
    await page.click('#cautions-fold');
    await page.screenshot({ path: join(outputDir, 'window-state-1280x720.png') });
    await page.setViewportSize({ width: 1600, height: 1000 });
    try {
      await page.waitForTimeout(300);
      await page.screenshot({ path: join(outputDir, 'window-state-1600x1000.png') });
      await page.locator('#components-panel').screenshot({ path: join(outputDir, 'window-state-components-1600.png') });
    } finally {
      await page.setViewportSize({ width: 1280, height: 720 });
    }
  });

  it('loads a design file dropped on the page as a design, and shows a broken one\'s whole message', async () => {
    await dropFile(page, join(samplesDir, 'designs/pulse-jig-discharge.json'), 'pulse-jig-discharge.json');
    await page.waitForFunction(() => /from pulse-jig-discharge\.json$/.test(document.querySelector('#design-message')?.textContent ?? ''));
    expect(await page.locator('#capture-name').innerText()).toBe('pulse-jig-discharge.csv');
    expect(await page.locator('#error-banner').isVisible()).toBe(false);

    const broken = join(folder, 'broken-design.json');
    writeFileSync(broken, '{ "format": "ringbench-design", "version": 1, "name": "half written", ');
    await dropFile(page, broken, 'broken-design.json');
    const error = page.locator('#design-error');
    await error.waitFor();
    expect(await error.innerText()).toMatch(/^design: not valid JSON at line 1, column \d+ \(.+\)$/);
    const fits = await error.evaluate((e) => e.scrollWidth <= e.clientWidth && e.getBoundingClientRect().right <= (e.closest('.card') as HTMLElement).getBoundingClientRect().right);
    expect(fits).toBe(true);
    await page.locator('#design-panel').screenshot({ path: join(outputDir, 'window-state-design-error.png') });
  });

  it('keeps the channel chosen in a file over a reload', async () => {
    await dropFile(page, join(samplesDir, 'gate-drive-turn-on.csv'), 'gate-drive-turn-on.csv');
    await waitForFit(page, 'gate-drive-turn-on.csv');
    const fits = await fitCount(page);
    await page.selectOption('#channel-select', '1');
    await waitForRefit(page, fits);
    await page.reload();
    await waitForFit(page, 'gate-drive-turn-on.csv');
    expect(await page.locator('#channel-select').inputValue()).toBe('1');
    expect(problems).toEqual([]);
  });
});
