// The plot as a bench instrument, in Chromium: a drag zooms and never moves the fit window, only the window's edge
// handles do (and refit); a double-click shows the whole current capture; cursors read Δt, 1/Δt and ΔV where they
// stand; the step's overshoot and settling are marked where the fit puts them; the wheel and the keys zoom and pan;
// `?` lists the keys; the axes are titled with their units; the hover readout is the bench's own.

import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import type { Browser, Page } from 'playwright-core';
import { createRandom } from '../../core/random';
import { formatEngineering } from '../../core/units/format';
import { SHORTCUTS } from '../../renderer/shortcuts';
import { buildBench, CHROMIUM, dropFile, fitCount, hasChromium, launchChromium, outputDir, repoRoot, serveBench, waitForFit, waitForRefit, type ServedBench } from './benchHarness';

if (!hasChromium) console.warn(`test/e2e/plotInteraction.test.ts: skipped, no browser at ${CHROMIUM} (apt-get install chromium)`);

const SAMPLE = 'input-filter-step.csv';
/** The generated second capture spans 4 ms, four times the sample's 1 ms. */
const LONG_START = -0.2e-3;
const LONG_STEP = 1e-6;
const LONG_SAMPLES = 4000;

/** A ringing 10 V step with seeded noise over 4 ms (our own scenario: a slow supply's output settling). */
function longStepCapture(): string {
  const random = createRandom(17);
  const lines = ['Time (s),CH1 (V)'];
  for (let i = 0; i < LONG_SAMPLES; i++) {
    const t = LONG_START + i * LONG_STEP;
    const y = t < 0 ? 0 : 10 * (1 - Math.exp(-4e3 * t) * Math.cos(2 * Math.PI * 5e3 * t));
    lines.push(`${t.toExponential(6)},${(y + 0.02 * random.normal()).toFixed(5)}`);
  }
  return `${lines.join('\n')}\n`;
}

/** The command line's JSON for a sample, as a person would get it. */
function cliFit(file: string): Record<string, any> {
  const run = spawnSync(process.execPath, [resolve(repoRoot, 'bin/ringbench.js'), 'fit', file, '--json'], { cwd: repoRoot, encoding: 'utf8' });
  return JSON.parse(run.stdout);
}

interface Axis {
  offset: number;
  length: number;
  range: [number, number];
}
interface Geometry {
  left: number;
  top: number;
  x: Axis;
  y: Axis;
  y2: Axis;
}

/** Where plotly laid out the axes (page pixels of the plot's corner, each axis's offset, length and range). */
async function geometry(page: Page): Promise<Geometry> {
  return page.evaluate(() => {
    const root = document.querySelector('#fit-plot') as HTMLElement & { _fullLayout: Record<string, { _offset: number; _length: number; range: number[] }> };
    const box = root.getBoundingClientRect();
    const axis = (name: string) => ({ offset: root._fullLayout[name]._offset, length: root._fullLayout[name]._length, range: root._fullLayout[name].range.map(Number) as [number, number] });
    return { left: box.left, top: box.top, x: axis('xaxis'), y: axis('yaxis'), y2: axis('yaxis2') };
  });
}

/** A page point at shares of the main panel's width and height. */
function pointAt(g: Geometry, xShare: number, yShare: number): { x: number; y: number } {
  return { x: g.left + g.x.offset + g.x.length * xShare, y: g.top + g.y.offset + g.y.length * yShare };
}

/** The time range the plot was last drawn with (the layout the bench handed to plotly). */
async function timeRange(page: Page): Promise<[number, number]> {
  return page.evaluate(() => ((document.querySelector('#fit-plot') as HTMLElement & { layout: { xaxis: { range: number[] } } }).layout.xaxis.range.map(Number) as [number, number]));
}

async function levelRange(page: Page): Promise<[number, number]> {
  return page.evaluate(() => ((document.querySelector('#fit-plot') as HTMLElement & { _fullLayout: { yaxis: { range: number[] } } })._fullLayout.yaxis.range.map(Number) as [number, number]));
}

/** Wait until the plot has been drawn again after `before` draws. */
async function waitForRedraw(page: Page, before: number): Promise<void> {
  await page.waitForFunction((n) => Number((document.querySelector('#fit-plot') as HTMLElement).dataset.redraws) > n, before);
}

async function redraws(page: Page): Promise<number> {
  return Number(await page.locator('#fit-plot').getAttribute('data-redraws'));
}

async function drag(page: Page, from: { x: number; y: number }, to: { x: number; y: number }): Promise<void> {
  await page.mouse.move(from.x, from.y);
  await page.mouse.down();
  await page.mouse.move(to.x, to.y, { steps: 12 });
  await page.mouse.up();
}

/** Nothing running, and the fit count still `fits` after the page had time to start a refit (a debounced one took 350 ms). */
async function expectNoRefit(page: Page, fits: number): Promise<void> {
  await page.waitForTimeout(1200);
  expect(await page.locator('#progress').textContent()).toBe('');
  expect(await fitCount(page)).toBe(fits);
}

describe.skipIf(!hasChromium)('the plot as a bench instrument', () => {
  let bench: ServedBench;
  let browser: Browser;
  let page: Page;
  let folder: string;
  const problems: string[] = [];

  beforeAll(async () => {
    buildBench();
    mkdirSync(outputDir, { recursive: true });
    folder = mkdtempSync(join(tmpdir(), 'ringbench-plot-'));
    bench = await serveBench(join(folder, 'bench-log.jsonl'), folder);
    browser = await launchChromium();
    page = await browser.newPage({ viewport: { width: 1600, height: 1000 }, deviceScaleFactor: 1 });
    page.on('console', (message) => {
      if (message.type() === 'error') problems.push(`console: ${message.text()}`);
    });
    page.on('pageerror', (error) => problems.push(`page error: ${error.message}`));
    await page.goto(bench.url);
    await waitForFit(page, SAMPLE);
  });

  afterAll(async () => {
    await browser?.close();
    await bench?.stop();
    if (folder) rmSync(folder, { recursive: true, force: true });
  });

  it('zooms on a drag inside the automatic window, and neither moves the window nor refits', async () => {
    const fits = await fitCount(page);
    const windowStart = await page.locator('#window-start').inputValue();
    const before = await timeRange(page);
    const g = await geometry(page);
    const count = await redraws(page);
    await drag(page, pointAt(g, 0.3, 0.5), pointAt(g, 0.6, 0.52));
    await waitForRedraw(page, count);
    const after = await timeRange(page);
    const width = before[1] - before[0];
    const pixel = width / g.x.length;
    expect(Math.abs(after[0] - (before[0] + 0.3 * width))).toBeLessThan(1.5 * pixel);
    expect(Math.abs(after[1] - (before[0] + 0.6 * width))).toBeLessThan(1.5 * pixel);
    await expectNoRefit(page, fits);
    expect(await page.locator('#window-start').inputValue()).toBe(windowStart);
  });

  it('moves the fit window only by its edge handle, and refits then', async () => {
    await page.keyboard.press('0');
    const fits = await fitCount(page);
    const start = page.locator('[data-handle="window-start"]');
    await expect.poll(() => start.isVisible()).toBe(true);
    // A click on the handle without a drag is no change.
    await start.click();
    await expectNoRefit(page, fits);
    const box = (await start.boundingBox())!;
    const g = await geometry(page);
    const target = box.x + box.width / 2 + 0.1 * g.x.length;
    await drag(page, { x: box.x + box.width / 2, y: box.y + box.height / 2 }, { x: target, y: box.y + box.height / 2 });
    await waitForRefit(page, fits);
    const expected = g.x.range[0] + ((target - g.left - g.x.offset) / g.x.length) * (g.x.range[1] - g.x.range[0]);
    const shown = await page.evaluate(() => (document.querySelector('#fit-plot') as HTMLElement & { layout: { shapes: { x0: number }[] } }).layout.shapes[1].x0);
    expect(Math.abs(shown - expected)).toBeLessThan((g.x.range[1] - g.x.range[0]) / g.x.length);
    expect(await page.locator('#window-start').inputValue()).not.toBe('');
    expect(Number(await start.getAttribute('data-value'))).toBeCloseTo(shown, 12);
  });

  it('shows the whole current capture on a double-click, after a second and longer capture was opened', async () => {
    const path = join(folder, 'slow-supply-settling.csv');
    writeFileSync(path, longStepCapture());
    await dropFile(page, path, 'slow-supply-settling.csv');
    await waitForFit(page, 'slow-supply-settling.csv');
    // A window late in the record, and a zoom before it (as plotly's own zoom sets it): the double-click lands outside the window.
    const fits = await fitCount(page);
    await page.fill('#window-start', '2m');
    await page.fill('#window-end', '3.5m');
    await page.click('#apply-window');
    await waitForRefit(page, fits);
    const count = await redraws(page);
    await page.evaluate(() => (window as unknown as { Plotly: { relayout(el: Element, u: object): Promise<void> } }).Plotly.relayout(document.querySelector('#fit-plot')!, { 'xaxis.range': [1e-3, 1.5e-3] }));
    await waitForRedraw(page, count);
    expect(await timeRange(page)).toEqual([1e-3, 1.5e-3]);
    const box = (await page.locator('#fit-plot').boundingBox())!;
    await page.mouse.dblclick(box.x + box.width / 2, box.y + box.height * 0.45);
    // In nanoseconds: the range drawn is the whole capture's, from its first sample to its last.
    const shownNs = async () => (await timeRange(page)).map((t) => Math.round(t * 1e9));
    await expect.poll(shownNs, { timeout: 10_000 }).toEqual([Math.round(LONG_START * 1e9), Math.round((LONG_START + (LONG_SAMPLES - 1) * LONG_STEP) * 1e9)]);
  });

  it('titles the axes with their units, following the time scale shown', async () => {
    const titles = async () => page.locator('#fit-plot .g-xtitle, #fit-plot .g-ytitle, #fit-plot .g-y2title').evaluateAll((gs) => gs.map((g) => g.textContent));
    expect(await titles()).toEqual(['Time (ms)', 'Voltage (V)', expect.stringMatching(/^Residual \((m|µ)?V\)$/)]);
    const g = await geometry(page);
    const count = await redraws(page);
    await drag(page, pointAt(g, 0.05, 0.5), pointAt(g, 0.08, 0.5));
    await waitForRedraw(page, count);
    expect((await titles())[0]).toBe('Time (µs)');
    await page.keyboard.press('0');
  });

  it('zooms time on the wheel about the pointer, and the level with Shift', async () => {
    await page.selectOption('#sample-select', SAMPLE.replace('.csv', ''));
    await waitForFit(page, SAMPLE);
    let g = await geometry(page);
    const before = await timeRange(page);
    const at = pointAt(g, 0.25, 0.5);
    const timeAt = before[0] + 0.25 * (before[1] - before[0]);
    let count = await redraws(page);
    await page.mouse.move(at.x, at.y);
    await page.mouse.wheel(0, -300);
    await waitForRedraw(page, count);
    await page.waitForTimeout(300);
    const after = await timeRange(page);
    expect(after[1] - after[0]).toBeLessThan(0.7 * (before[1] - before[0]));
    // The time under the pointer stays under it.
    expect(Math.abs(after[0] + 0.25 * (after[1] - after[0]) - timeAt)).toBeLessThan(1e-3 * (before[1] - before[0]));
    const levelsBefore = await levelRange(page);
    g = await geometry(page);
    count = await redraws(page);
    await page.keyboard.down('Shift');
    await page.mouse.wheel(0, -200);
    await page.keyboard.up('Shift');
    await waitForRedraw(page, count);
    await page.waitForTimeout(300);
    const levelsAfter = await levelRange(page);
    expect(levelsAfter[1] - levelsAfter[0]).toBeLessThan(0.8 * (levelsBefore[1] - levelsBefore[0]));
    expect(await timeRange(page)).toEqual(after);
  });

  it('pans and zooms on the keys, vertically too, and 0 shows the whole capture', async () => {
    await page.keyboard.press('0');
    await page.waitForFunction(() => true);
    const whole = await timeRange(page);
    const width = whole[1] - whole[0];
    const step = async (key: string) => {
      const count = await redraws(page);
      await page.keyboard.press(key);
      await waitForRedraw(page, count);
    };
    await step('+');
    const zoomed = await timeRange(page);
    expect(zoomed[1] - zoomed[0]).toBeCloseTo(width / 1.5, 12);
    await step('ArrowRight');
    const panned = await timeRange(page);
    expect(panned[0] - zoomed[0]).toBeCloseTo((zoomed[1] - zoomed[0]) * 0.1, 12);
    const levels = await levelRange(page);
    await step('Shift+ArrowUp');
    const tall = await levelRange(page);
    expect(tall[1] - tall[0]).toBeCloseTo((levels[1] - levels[0]) / 1.5, 9);
    await step('0');
    expect(await timeRange(page)).toEqual(whole);
  });

  it('lists every key and gesture on ?', async () => {
    await page.keyboard.press('?');
    const list = page.locator('#shortcut-list');
    await expect.poll(() => list.isVisible()).toBe(true);
    expect(await list.locator('tbody tr').count()).toBe(SHORTCUTS.length);
    expect(await list.innerText()).toMatch(/show or hide the measurement cursors/);
    await list.screenshot({ path: join(outputDir, 'plot-shortcut-list.png') });
    await page.keyboard.press('Escape');
    await expect.poll(() => list.isVisible()).toBe(false);
  });

  it('reads Δt, 1/Δt and ΔV where the cursors stand', async () => {
    const fits = await fitCount(page);
    await page.click('#plot-cursors');
    const t1 = page.locator('[data-handle="t1"]');
    const t2 = page.locator('[data-handle="t2"]');
    await expect.poll(() => t2.isVisible()).toBe(true);
    const box = (await t2.boundingBox())!;
    await drag(page, { x: box.x + box.width / 2, y: box.y + box.height / 2 }, { x: box.x + box.width / 2 - 123, y: box.y + box.height / 2 });
    const g = await geometry(page);
    const value = async (handle: string) => Number(await page.locator(`[data-handle="${handle}"]`).getAttribute('data-value'));
    const [a, b, v1, v2] = [await value('t1'), await value('t2'), await value('v1'), await value('v2')];
    // Each cursor stands where its value lies on the axis.
    for (const [handle, time] of [[t1, a], [t2, b]] as const) {
      const hb = (await handle.boundingBox())!;
      const expected = g.left + g.x.offset + ((time - g.x.range[0]) / (g.x.range[1] - g.x.range[0])) * g.x.length;
      expect(Math.abs(hb.x + hb.width / 2 - expected)).toBeLessThan(1);
    }
    expect(await page.locator('#cursor-dt').innerText()).toBe(formatEngineering(b - a, 's', 4));
    expect(await page.locator('#cursor-rate').innerText()).toBe(formatEngineering(1 / Math.abs(b - a), 'Hz', 4));
    expect(await page.locator('#cursor-dv').innerText()).toBe(formatEngineering(v2 - v1, 'V', 4));
    expect(await page.locator('#cursor-t2').innerText()).toBe(formatEngineering(b, 's', 4));
    // Moving a cursor is no change of the fit window: nothing refits.
    await expectNoRefit(page, fits);
  });

  it('marks the overshoot at its peak and the settling time where the fit puts them', async () => {
    const cli = cliFit(join(repoRoot, 'sample-captures', SAMPLE));
    const { eventTime, levels, model } = cli.transitions;
    const marks = await page.evaluate(() => {
      const layout = (document.querySelector('#fit-plot') as HTMLElement & { layout: { annotations: { name?: string; x: number; y: number; text: string }[] } }).layout;
      return layout.annotations.filter((a) => a.name === 'overshoot' || a.name === 'settled');
    });
    const overshoot = marks.find((m) => m.name === 'overshoot')!;
    const settled = marks.find((m) => m.name === 'settled')!;
    const relative = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);
    expect(relative(overshoot.x, eventTime + model.peakTime.value)).toBeLessThan(1e-6);
    expect(relative(overshoot.y, levels.final + (model.overshoot.value / 100) * (levels.final - levels.initial))).toBeLessThan(1e-6);
    expect(overshoot.text).toContain(`overshoot ${model.overshoot.value.toFixed(1)} %`);
    expect(overshoot.text).toContain(`peak time ${formatEngineering(model.peakTime.value, 's', 3)}`);
    expect(relative(settled.x, eventTime + model.settlingTime2.value)).toBeLessThan(1e-6);
    expect(await page.locator('#fit-plot g.annotation', { hasText: 'overshoot' }).count()).toBe(1);
  });

  it('shows its own hover readout, in both themes', async () => {
    const g = await geometry(page);
    const at = pointAt(g, 0.45, 0.5);
    await page.mouse.move(at.x, at.y);
    await page.mouse.move(at.x + 4, at.y + 2);
    const tip = page.locator('#plot-tip');
    await expect.poll(() => tip.isVisible()).toBe(true);
    expect(await tip.innerText()).toMatch(/^t = -?[\d.]+ [µmn]?s\nMeasured\s+-?[\d.]+ m?V/);
    expect(await page.locator('#fit-plot .hoverlayer .hovertext').count()).toBe(0);
    const colours = async () =>
      tip.evaluate((el) => {
        const style = getComputedStyle(el);
        const root = getComputedStyle(document.documentElement);
        return { background: style.backgroundColor, color: style.color, surface: root.getPropertyValue('--surface').trim(), ink: root.getPropertyValue('--ink').trim() };
      });
    const light = await colours();
    await page.click('#theme-toggle');
    await page.mouse.move(at.x, at.y);
    await page.mouse.move(at.x + 4, at.y + 2);
    await expect.poll(() => tip.isVisible()).toBe(true);
    const dark = await colours();
    expect(dark.background).not.toBe(light.background);
    expect(dark.color).not.toBe(light.color);
    await page.locator('#fit-plot').locator('..').screenshot({ path: join(outputDir, 'plot-tip-dark.png') });
    await page.click('#theme-toggle');
  });

  it('is drawn with cursors and markers at 1600x1000 and 1280x720', async () => {
    for (const [width, height] of [
      [1600, 1000],
      [1280, 720],
    ]) {
      await page.setViewportSize({ width, height });
      await page.keyboard.press('0');
      await page.waitForTimeout(600);
      await expect.poll(() => page.locator('[data-handle="v2"]').isVisible()).toBe(true);
      await page.screenshot({ path: join(outputDir, `plot-instrument-${width}x${height}.png`) });
    }
  });

  it('logged no console error on the way', () => {
    expect(problems).toEqual([]);
  });
});
