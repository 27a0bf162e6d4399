// The command-line program: every command registered on one commander instance, one error path.

import { Command, CommanderError } from 'commander';
import { EXIT, exitCodeFor, messageFor } from './errors';
import { terminalSafe, type CliIo } from './io';
import { registerFitCommand } from './commands/fit';
import { registerServeCommand } from './commands/serve';
import { registerStartCommand } from './commands/start';
import { registerLogCommand } from './commands/log';
import { registerReportCommand } from './commands/report';
import { registerBatchCommand } from './commands/batch';
import { registerCheckCommand } from './commands/check';
import { registerParasiticsCommand } from './commands/parasitics';
import { registerCompareCommand } from './commands/compare';
import { VERSION } from '../version';
import type { CommandContext, RegisterCommand } from './commandContext';

const COMMANDS: RegisterCommand[] = [registerFitCommand, registerCheckCommand, registerParasiticsCommand, registerCompareCommand, registerServeCommand, registerStartCommand, registerLogCommand, registerReportCommand, registerBatchCommand];

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
  for (const register of COMMANDS) register(program, ctx);
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
