// `ringbench start` (npm start): the desktop window, or the browser bench with one line saying why.

import type { Command } from 'commander';
import { resolve } from 'node:path';
import type { CommandContext } from '../commandContext';
import { findProjectRoot } from '../../io/projectPaths';
import { serveUntilStopped, startServing } from '../../server/serveBench';
import { fetchElectronRuntime, hasDisplay, planLaunch, runWindow } from '../../start';
import { parsePort } from './serve';

/** How long the electron package may try to fetch its runtime, ms. */
const FETCH_TIMEOUT_MS = 30_000;

export function registerStartCommand(program: Command, ctx: CommandContext): void {
  program
    .command('start')
    .description('open the desktop window; without an Electron runtime or a display, serve the bench to a browser')
    .option('--port <n>', 'port for the browser bench (default: any free port)')
    .option('--no-open', 'do not open the browser bench in a browser')
    .option('--log <path>', 'bench log file of the browser bench (JSON Lines; its folder must exist)', 'bench-log.jsonl')
    .action(async (options: { port?: string; open: boolean; log: string }) => {
      const projectRoot = findProjectRoot(import.meta.url);
      const display = hasDisplay();
      const plan = planLaunch(projectRoot, display, () => fetchElectronRuntime(projectRoot, FETCH_TIMEOUT_MS));
      if (plan.kind === 'window') {
        ctx.setExitCode(await runWindow(plan.binary, projectRoot));
        return;
      }
      const server = await startServing({
        projectRoot,
        logPath: resolve(ctx.io.cwd, options.log),
        port: options.port === undefined ? 0 : parsePort(options.port),
        open: options.open && display,
      });
      ctx.io.out(`ringbench: ${plan.reason}; serving the bench at ${server.url}\n`);
      await serveUntilStopped(server);
    });
}
