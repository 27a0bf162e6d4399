// `ringbench serve`: the bench in a local browser, on loopback, until Ctrl+C.

import type { Command } from 'commander';
import { resolve } from 'node:path';
import type { CommandContext } from '../commandContext';
import { UsageError } from '../../../core/inputError';
import { findProjectRoot } from '../../io/projectPaths';
import { serveUntilStopped, startServing } from '../../server/serveBench';
import { hasDisplay } from '../../start';

export interface ServeCommandOptions {
  port?: string;
  open: boolean;
  log: string;
}

export function parsePort(text: string): number {
  const port = Number(text);
  if (!/^\d+$/.test(text.trim()) || port > 65535) throw new UsageError(`--port '${text}': expected a port number from 0 to 65535 (0: any free port)`);
  return port;
}

export function registerServeCommand(program: Command, ctx: CommandContext): void {
  program
    .command('serve')
    .description('serve the bench to a browser on this machine (127.0.0.1 only) and print its address')
    .option('--port <n>', 'port to listen on (default: any free port)')
    .option('--no-open', 'do not open the address in a browser')
    .option('--log <path>', 'bench log file (JSON Lines; its folder must exist)', 'bench-log.jsonl')
    .action(async (options: ServeCommandOptions) => {
      const server = await startServing({
        projectRoot: findProjectRoot(import.meta.url),
        logPath: resolve(ctx.io.cwd, options.log),
        port: options.port === undefined ? 0 : parsePort(options.port),
        open: options.open && hasDisplay(),
      });
      ctx.io.out(`ringbench: serving the bench at ${server.url} (Ctrl+C to stop)\n`);
      await serveUntilStopped(server);
    });
}
