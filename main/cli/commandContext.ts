// What every command is given: where it writes, and how it reports its exit code.

import type { Command } from 'commander';
import type { CliIo } from './io';

/** What a command's action reports back: its exit code (0 unless it says otherwise). */
export interface CommandContext {
  io: CliIo;
  setExitCode(code: number): void;
}

export type RegisterCommand = (program: Command, ctx: CommandContext) => void;
