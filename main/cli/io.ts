// Where a command writes: injected so that tests can run commands in-process.

import { escapeControls } from '../../core/report/escape';

export interface CliIo {
  out(text: string): void;
  err(text: string): void;
  /** Working directory that relative paths are taken from. */
  cwd: string;
  /** True when stderr is a terminal (progress lines are shown only then). */
  interactive: boolean;
  /** On a terminal: replace the line stderr is on with `line` (progress redrawn in place). Absent: progress goes line by line to err. */
  redraw?(line: string): void;
}

export function processIo(): CliIo {
  return {
    out: (text) => process.stdout.write(text),
    err: (text) => process.stderr.write(text),
    cwd: process.cwd(),
    interactive: Boolean(process.stderr.isTTY),
    // Carriage return, then erase to the end of the line: the line is drawn over itself.
    redraw: (line) => process.stderr.write(`\r\x1b[K${line}`),
  };
}

/**
 * The same output with every control character but line feed and tab shown escaped: whatever a command
 * prints (a capture's header, a file name, a log record, commander's own messages) cannot drive the terminal.
 */
export function terminalSafe(io: CliIo): CliIo {
  const { redraw } = io;
  return {
    ...io,
    out: (text) => io.out(escapeControls(text, 'keep-layout')),
    err: (text) => io.err(escapeControls(text, 'keep-layout')),
    ...(redraw ? { redraw: (line: string) => redraw(escapeControls(line)) } : {}),
  };
}
