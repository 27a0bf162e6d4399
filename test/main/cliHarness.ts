// Runs the command line in-process for a test and keeps what it printed.

import { runCli } from '../../main/cli/program';

export interface CliRun {
  code: number;
  out: string;
  err: string;
}

/** One run of `ringbench <args>` in the folder `cwd`, as a script would see it (not a terminal unless `interactive`). */
export async function runCliIn(cwd: string, args: string[], interactive = false): Promise<CliRun> {
  let out = '';
  let err = '';
  const code = await runCli(args, { out: (t) => (out += t), err: (t) => (err += t), cwd, interactive });
  return { code, out, err };
}
