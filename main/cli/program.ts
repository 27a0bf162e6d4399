// The command-line program: every command registered on one commander instance, one error path.

import { Command, CommanderError } from 'commander';
import { EXIT, exitCodeFor, messageFor } from './errors';
import { terminalSafe, type CliIo } from './io';
import { VERSION } from '../version';
import type { CommandContext, RegisterCommand } from './commandContext';

/**
 * Each command's module by the name it registers, in the order help lists them. A module is imported only when
 * its command runs (or help lists them all): `fit` then compiles and evaluates none of the server, the reports,
 * the log or the batch.
 */
export const COMMANDS: ReadonlyArray<readonly [name: string, load: () => Promise<RegisterCommand>]> = [
  ['fit', async () => (await import('./commands/fit')).registerFitCommand],
  ['check', async () => (await import('./commands/check')).registerCheckCommand],
  ['parasitics', async () => (await import('./commands/parasitics')).registerParasiticsCommand],
  ['compare', async () => (await import('./commands/compare')).registerCompareCommand],
  ['serve', async () => (await import('./commands/serve')).registerServeCommand],
  ['start', async () => (await import('./commands/start')).registerStartCommand],
  ['log', async () => (await import('./commands/log')).registerLogCommand],
  ['report', async () => (await import('./commands/report')).registerReportCommand],
  ['batch', async () => (await import('./commands/batch')).registerBatchCommand],
];

/**
 * The commands `argv` can reach. Commander dispatches on the first argument when it names a command, and nothing
 * of the others shows then; a first argument asking for the version is answered before anything else is read.
 * Any other line (help, an unknown command, none) may list every command.
 */
export function commandsFor(argv: readonly string[]): typeof COMMANDS {
  const first = argv[0];
  if (first === '-V' || first === '--version') return [];
  const named = COMMANDS.filter(([name]) => name === first);
  return named.length ? named : COMMANDS;
}

/** Run the command line on `argv` (without node and script) and return the exit code. */
export async function runCli(argv: string[], rawIo: CliIo): Promise<number> {
  const io = terminalSafe(rawIo);
  let exitCode: number = EXIT.ok;
  const ctx: CommandContext = { io, setExitCode: (code) => (exitCode = code) };
  const program = new Command('ringbench')
    .description('Fit second-order ringdowns and step responses from oscilloscope captures.')
    .version(VERSION, '-V, --version')
    .showHelpAfterError(false)
    .showSuggestionAfterError(false)
    .exitOverride()
    .configureOutput({ writeOut: io.out, writeErr: io.err });
  const registers = await Promise.all(commandsFor(argv).map(([, load]) => load()));
  for (const register of registers) register(program, ctx);
  for (const command of program.commands) {
    command.exitOverride().showSuggestionAfterError(false).configureOutput({ writeOut: io.out, writeErr: io.err });
  }
  try {
    await program.parseAsync(argv, { from: 'user' });
    return exitCode;
  } catch (error) {
    if (error instanceof CommanderError) {
      // commander has already printed its one line; help and version are not failures.
      return error.exitCode === 0 ? EXIT.ok : EXIT.badInput;
    }
    io.err(`ringbench: ${messageFor(error)}\n`);
    return exitCodeFor(error);
  }
}
