// Entry point of the `ringbench` command.

import { runCli } from './program';
import { processIo } from './io';

runCli(process.argv.slice(2), processIo()).then((code) => {
  process.exitCode = code;
});
