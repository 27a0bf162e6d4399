// Writes renderer/screenshots/bench.png (the README's picture): the bench on first start, sample fitted.
// Run with `npx tsx test/e2e/screenshot.ts`; needs /usr/bin/chromium.

import { mkdirSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { buildBench, hasChromium, CHROMIUM, launchChromium, repoRoot, serveBench, waitForFit } from './benchHarness';

const SCREENSHOT = resolve(repoRoot, 'renderer/screenshots/bench.png');

async function main(): Promise<void> {
  if (!hasChromium) throw new Error(`no browser at ${CHROMIUM}: apt-get install chromium`);
  buildBench();
  const folder = mkdtempSync(join(tmpdir(), 'ringbench-shot-'));
  const bench = await serveBench(join(folder, 'bench-log.jsonl'), folder);
  const browser = await launchChromium();
  try {
    const page = await browser.newPage({ viewport: { width: 1600, height: 1320 }, deviceScaleFactor: 1 });
    await page.goto(bench.url);
    await waitForFit(page, 'input-filter-step.csv');
    await page.waitForSelector('#verdict-overall');
    await page.waitForTimeout(500);
    mkdirSync(resolve(repoRoot, 'renderer/screenshots'), { recursive: true });
    await page.screenshot({ path: SCREENSHOT });
    process.stdout.write(`wrote ${SCREENSHOT}\n`);
  } finally {
    await browser.close();
    await bench.stop();
    rmSync(folder, { recursive: true, force: true });
  }
}

await main();
