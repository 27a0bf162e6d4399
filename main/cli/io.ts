// Where a command writes: injected so that tests can run commands in-process.

export interface CliIo {
  out(text: string): void;
  err(text: string): void;
  /** Working directory that relative paths are taken from. */
  cwd: string;
  /** True when stderr is a terminal (progress lines are shown only then). */
  interactive: boolean;
}

export function processIo(): CliIo {
  return {
    out: (text) => process.stdout.write(text),
    err: (text) => process.stderr.write(text),
    cwd: process.cwd(),
    interactive: Boolean(process.stderr.isTTY),
  };
}
