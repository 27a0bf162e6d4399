// Shared by the end-to-end tests and the screenshot script: build, `ringbench serve`, Chromium, pixel checks.

import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { chromium, type Browser, type Page } from 'playwright-core';

export const CHROMIUM = '/usr/bin/chromium';
export const repoRoot = resolve(dirname(fileURLToPath(import.meta.url)), '../..');
export const outputDir = resolve(repoRoot, 'test-output');

/** Build dist/ so the served bench is the code under test. */
export function buildBench(): void {
  const result = spawnSync(process.execPath, ['build/build.mjs'], { cwd: repoRoot, encoding: 'utf8' });
  if (result.status !== 0) throw new Error(`build failed:\n${result.stderr}`);
}

export interface ServedBench {
  url: string;
  origin: string;
  stop(): Promise<void>;
}

/** `ringbench serve --port 0 --no-open` as a user runs it; resolves with the address it prints. */
export function serveBench(logPath: string, cwd = repoRoot): Promise<ServedBench> {
  const child: ChildProcess = spawn(process.execPath, [resolve(repoRoot, 'bin/ringbench.js'), 'serve', '--port', '0', '--no-open', '--log', logPath], {
    cwd,
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let output = '';
  return new Promise((resolvePromise, reject) => {
    const timer = setTimeout(() => reject(new Error(`ringbench serve printed no address:\n${output}`)), 30_000);
    const onData = (chunk: Buffer) => {
      output += chunk.toString('utf8');
      const match = /serving the bench at (http:\/\/127\.0\.0\.1:\d+\/\?token=[A-Za-z0-9_-]+)/.exec(output);
      if (!match) return;
      clearTimeout(timer);
      const url = match[1];
      resolvePromise({
        url,
        origin: new URL(url).origin,
        stop: () =>
          new Promise((done) => {
            if (child.exitCode !== null) return done();
            child.once('exit', () => done());
            child.kill('SIGTERM');
          }),
      });
    };
    child.stdout?.on('data', onData);
    child.stderr?.on('data', (chunk: Buffer) => (output += chunk.toString('utf8')));
    child.once('exit', (code) => reject(new Error(`ringbench serve exited (${code}):\n${output}`)));
  });
}

export function launchChromium(): Promise<Browser> {
  return chromium.launch({
    executablePath: CHROMIUM,
    headless: true,
    args: ['--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
  });
}

export const hasChromium = existsSync(CHROMIUM);

/** A bench served from a temporary folder of its own (its working folder, the bench log in it) and open in Chromium. */
export interface OpenedBench {
  folder: string;
  bench: ServedBench;
  browser: Browser;
  page: Page;
}

/**
 * Build the bench, serve it from a fresh temporary folder named after `name` (where `prepare` may first write the
 * captures a test opens), open it in Chromium at `viewport` and wait for the first sample's fit.
 */
export async function openServedBench(name: string, viewport: { width: number; height: number }, prepare: (folder: string) => void = () => {}): Promise<OpenedBench> {
  buildBench();
  mkdirSync(outputDir, { recursive: true });
  const folder = mkdtempSync(join(tmpdir(), `ringbench-${name}-`));
  prepare(folder);
  const bench = await serveBench(join(folder, 'bench-log.jsonl'), folder);
  const browser = await launchChromium();
  const page = await (await browser.newContext({ viewport, deviceScaleFactor: 1 })).newPage();
  await page.goto(bench.url);
  await waitForFit(page, 'input-filter-step.csv');
  return { folder, bench, browser, page };
}

/** Close what openServedBench opened (any part may be missing when it failed half-way). */
export async function closeServedBench(opened: Partial<OpenedBench> | undefined): Promise<void> {
  await opened?.browser?.close();
  await opened?.bench?.stop();
  if (opened?.folder) rmSync(opened.folder, { recursive: true, force: true });
}

/** Wait until the bench is idle with a fit (or a fit error) shown for `file`. */
export async function waitForFit(page: Page, file: string, timeout = 90_000): Promise<void> {
  await page.waitForFunction(
    (name) => {
      const shown = document.querySelector('#capture-name')?.textContent === name;
      const idle = (document.querySelector('#progress')?.textContent ?? '') === '';
      const done = document.querySelector('#fit-state') !== null || document.querySelector('#fit-status .error-text') !== null;
      return shown && idle && done;
    },
    file,
    { timeout, polling: 200 },
  );
}

/**
 * Fraction of the pixels of a screenshot that differ clearly from its most common colour (the
 * background): a drawn plot has axes, ticks and curves; a blank one has none. Decoded in a blank page.
 */
export async function inkFraction(browser: Browser, png: Buffer): Promise<number> {
  const page = await browser.newPage();
  try {
    return await page.evaluate(async (base64) => {
      const image = new Image();
      image.src = `data:image/png;base64,${base64}`;
      await image.decode();
      const canvas = document.createElement('canvas');
      canvas.width = image.width;
      canvas.height = image.height;
      const context = canvas.getContext('2d') as CanvasRenderingContext2D;
      context.drawImage(image, 0, 0);
      const { data } = context.getImageData(0, 0, image.width, image.height);
      const counts = new Map<number, number>();
      for (let i = 0; i < data.length; i += 4) {
        const key = (data[i] << 16) | (data[i + 1] << 8) | data[i + 2];
        counts.set(key, (counts.get(key) ?? 0) + 1);
      }
      const background = [...counts.entries()].sort((a, b) => b[1] - a[1])[0][0];
      const [br, bg, bb] = [background >> 16, (background >> 8) & 255, background & 255];
      let ink = 0;
      for (let i = 0; i < data.length; i += 4) {
        if (Math.abs(data[i] - br) + Math.abs(data[i + 1] - bg) + Math.abs(data[i + 2] - bb) > 60) ink++;
      }
      return ink / (data.length / 4);
    }, png.toString('base64'));
  } finally {
    await page.close();
  }
}

/** Drop a capture file on the window as a person drags it from a folder (its bytes as written, any encoding). */
export async function dropFile(page: Page, path: string, name: string): Promise<void> {
  const base64 = readFileSync(path).toString('base64');
  await page.evaluate(
    ({ base64, name }) => {
      const bytes = Uint8Array.from(atob(base64), (c) => c.charCodeAt(0));
      const transfer = new DataTransfer();
      transfer.items.add(new File([bytes], name, { type: 'text/csv' }));
      for (const type of ['dragenter', 'dragover', 'drop']) {
        document.body.dispatchEvent(new DragEvent(type, { dataTransfer: transfer, bubbles: true, cancelable: true }));
      }
    },
    { base64, name },
  );
}

/** How many fits the page has shown (the fit panel counts them). */
export async function fitCount(page: Page): Promise<number> {
  return Number(await page.locator('#fit-panel').getAttribute('data-fit-count'));
}

/** Wait until a fit after the `before`-th has been shown and the bench is idle again. */
export async function waitForRefit(page: Page, before: number): Promise<void> {
  await page.waitForFunction(
    (n) => Number(document.querySelector('#fit-panel')?.getAttribute('data-fit-count')) > n && document.querySelector('#progress')?.textContent === '',
    before,
    { timeout: 90_000 },
  );
}
