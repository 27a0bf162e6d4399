// The HTML report's Content-Security-Policy in Chromium: a report logged through the command line from a unit
// id with a right-to-left override keeps its styles and plots, shows the override escaped, and markup that
// got past the escaping would run no script and load nothing.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import type { Browser, Page } from 'playwright-core';
import { runCli } from '../../main/cli/program';
import { NOMINAL_LOOP, writeLoopCapture } from '../fixtures/benchLog/captures';
import { hasChromium, launchChromium, outputDir } from './benchHarness';

/** Right-to-left override: 'SN‮240' would show as 'SN042' reversed around it. */
const RLO = '\u202e';

describe.skipIf(!hasChromium)('HTML report under its Content-Security-Policy', () => {
  let folder: string;
  let browser: Browser;
  let page: Page;
  const printed: string[] = [];
  const violations: string[] = [];
  /** What reached a local server the planted markup points at. */
  const hits: string[] = [];
  let server: Server;

  async function open(file: string): Promise<void> {
    await page.goto(pathToFileURL(join(folder, file)).href);
    await page.waitForLoadState('load');
  }

  beforeAll(async () => {
    folder = mkdtempSync(join(tmpdir(), 'ringbench-e2e-policy-'));
    writeLoopCapture(folder, 'sn240.csv', NOMINAL_LOOP, 240);
    const io = { out: (t: string) => printed.push(t), err: (t: string) => printed.push(t), cwd: folder, interactive: false };
    const log = ['--log', 'bench.jsonl'];
    // NUL and the override are refused at log add, naming the option; one that reaches a log all the same (a
    // hand-edited line) is shown escaped wherever it is printed.
    expect(await runCli(['log', 'add', 'sn240.csv', ...log, '--unit', 'SN\u0000240', '--topology', 'series', '--known', 'C=2.2n'], io)).toBe(2);
    expect(printed.join('')).toMatch(/^ringbench: --unit /);
    expect(await runCli(['log', 'add', 'sn240.csv', ...log, '--unit', `SN${RLO}240`, '--topology', 'series', '--known', 'C=2.2n'], io)).toBe(2);
    expect(await runCli(['log', 'add', 'sn240.csv', ...log, '--unit', 'SN240', '--topology', 'series', '--known', 'C=2.2n'], io)).toBe(0);
    const logFile = join(folder, 'bench.jsonl');
    writeFileSync(logFile, readFileSync(logFile, 'utf8').replace('"unit":"SN240"', '"unit":"SN\\u202e240"'));
    expect(await runCli(['report', ...log, '--out', 'report.html'], io)).toBe(0);
    server = createServer((request, response) => {
      hits.push(request.url ?? '');
      response.end('');
    });
    await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', () => resolve()));
    const here = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
    // The same report with markup that got past the escaping (as a hand-edited file might carry).
    const html = readFileSync(join(folder, 'report.html'), 'utf8');
    const planted = html.replace(
      '</main>',
      `<script>document.title = "script ran"</script><script src="${here}/s.js"></script><img src="${here}/x.png" onerror="document.title = 'handler ran'">` +
        `<iframe src="${here}/frame"></iframe><link rel="stylesheet" href="${here}/style.css"></main>`,
    );
    writeFileSync(join(folder, 'planted.html'), planted);

    browser = await launchChromium();
    page = await browser.newPage({ viewport: { width: 1100, height: 1400 } });
    page.on('console', (message) => {
      if (/Content Security Policy/i.test(message.text())) violations.push(message.text());
    });
  }, 120_000);

  afterAll(async () => {
    await browser?.close();
    await new Promise<void>((resolve) => server?.close(() => resolve()));
    rmSync(folder, { recursive: true, force: true });
  });

  it('keeps its styles and plots, with no violation reported', async () => {
    await open('report.html');
    expect(violations).toEqual([]);
    const h1 = await page.locator('h1').evaluate((el) => getComputedStyle(el).fontSize);
    expect(h1).toBe('26px');
    const plot = page.locator('svg').first();
    const box = await plot.boundingBox();
    expect(box?.width ?? 0).toBeGreaterThan(200);
    mkdirSync(outputDir, { recursive: true });
    await page.screenshot({ path: join(outputDir, 'reportPolicy.png'), fullPage: false });
  });

  it('shows the override in the unit id escaped, not applied', async () => {
    const text = await page.locator('body').innerText();
    expect(text).toContain('SN\\u202e240');
    expect(text).not.toContain(RLO);
  });

  it('runs no planted script or handler and loads nothing planted', async () => {
    violations.length = 0;
    await open('planted.html');
    expect(await page.title()).not.toMatch(/ran/);
    expect(violations.length).toBeGreaterThanOrEqual(2);
    expect(hits).toEqual([]);
  });
});
