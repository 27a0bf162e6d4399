// Starts a batch worker: a child process running the built script beside the bundled command line
// (dist/batchWorker.js), or, when running from source (tests, tsx), the TypeScript module through tsx's loader.

import { fork, type ChildProcess } from 'node:child_process';
import { EventEmitter } from 'node:events';
import { existsSync } from 'node:fs';
import { createRequire } from 'node:module';
import { fileURLToPath, pathToFileURL } from 'node:url';
import type { BatchSettings } from './batchFile';
import type { BatchReply, BatchRequest, PoolMessage, WorkerMessage } from './batchProtocol';

/** esbuild bundles this module into dist/cli.cjs (import.meta.url: that file), whose folder also holds the worker's own bundle. */
const FROM_SOURCE = import.meta.url.endsWith('.ts');

/**
 * V8's threads beside each process's JavaScript: optimising compiles in the background, and the garbage
 * collector's parallel and concurrent helpers. When the workers already take every core these threads only take
 * turns with them: over the 120-capture corpus on 2 cores, 2 workers used 10.0 s of CPU with them and 7.9 s
 * without, and finished about 1.25x sooner (bench:corpus). V8 reads them once, at a process's start, which is why
 * the workers are processes and not threads (a worker thread shares its process's flags).
 */
const BACKGROUND_THREADS_OFF = ['--no-concurrent-recompilation', '--single-threaded-gc'];
/**
 * Optimised code that calls map, reduce or every on a small array of numbers was thrown away again and again: inlined,
 * those calls check the array's elements kind, and the same arrays come packed from interpreted code and holey from
 * optimised code. Left as calls, a cold process over the 120-capture corpus threw optimised code away 114 times instead
 * of 216, and `batch` over it took 4.53 s instead of 5.06 s (medians of 5 in turn; the same output, byte for byte).
 */
const ARRAY_CALLS_NOT_INLINED = ['--no-turbo-inline-array-builtins'];
/**
 * A worker compiles on its own thread (see BACKGROUND_THREADS_OFF), so compiling is time taken from the fits: a cold
 * pass over 60 corpus captures spent 1.19 s of its 3.8 s in 385 optimising compiles, 73 of them (221 ms) for loops
 * still running (on-stack replacement), most of those compiled again whole on a later call. Without on-stack
 * replacement, and with smaller functions inlined (up to 50 bytes of bytecode instead of 460), `batch` over the
 * 120-capture corpus took 4.28 s instead of 4.63 s (medians of 8 in turn; the same output, byte for byte). The
 * command line's single fit keeps both: there one pass over 10^6 samples runs once, and must be replaced while it runs.
 * Only when the workers take every core: otherwise the compiles run beside them, as in the command line.
 */
const LEANER_COMPILES = ['--no-use-osr', '--max-inlined-bytecode-size=50'];

/** What the batch pool needs of a worker: a worker thread (the stand-ins of the tests) has the same shape. */
export interface BatchWorker {
  postMessage(request: BatchRequest): void;
  terminate(): void;
  on(event: 'message', listener: (reply: BatchReply) => void): this;
  on(event: 'error', listener: (error: Error) => void): this;
  /** A process ended by a signal gives the signal's name instead of an exit code. */
  on(event: 'exit', listener: (code: number | string) => void): this;
}

/** Start one worker; `allCores`: the batch's workers take every core (V8's background threads are then left off). */
export function startBatchWorker(batch: BatchSettings, allCores: boolean): BatchWorker {
  const script = fileURLToPath(new URL(FROM_SOURCE ? './batchWorker.ts' : './batchWorker.js', import.meta.url));
  if (!existsSync(script)) throw new Error(`the batch worker '${script}' is missing: run \`npm run build\` in the repository`);
  // tsx is a development dependency, present wherever the sources are run directly.
  const loader = FROM_SOURCE ? ['--import', pathToFileURL(createRequire(import.meta.url).resolve('tsx/esm')).href] : [];
  const child = fork(script, [], {
    execArgv: [...(allCores ? [...BACKGROUND_THREADS_OFF, ...LEANER_COMPILES] : []), ...ARRAY_CALLS_NOT_INLINED, ...loader],
    // Structured clone, as between threads: the outcomes hold typed arrays and non-finite numbers.
    serialization: 'advanced',
    // The worker prints nothing of its own; a crash's report still reaches stderr.
    stdio: ['ignore', 'ignore', 'inherit', 'ipc'],
  });
  const worker = new ProcessWorker(child);
  worker.send({ kind: 'settings', batch });
  return worker;
}

/** A child process seen as a BatchWorker. */
class ProcessWorker extends EventEmitter implements BatchWorker {
  constructor(private readonly child: ChildProcess) {
    super();
    child.on('message', (message: WorkerMessage) => {
      if (message.kind === 'fault') this.emit('error', new Error(message.text));
      else this.emit('message', message.reply);
    });
    child.on('error', (error) => {
      this.emit('error', error);
      this.child.kill();
    });
    child.on('exit', (code, signal) => this.emit('exit', code ?? signal ?? 'unknown'));
  }

  send(message: PoolMessage): void {
    // A message that cannot be delivered ends the worker: the pool fails the capture it held and starts another.
    this.child.send(message, (error) => {
      if (!error) return;
      this.emit('error', error);
      this.child.kill();
    });
  }

  postMessage(request: BatchRequest): void {
    this.send({ kind: 'capture', request });
  }

  terminate(): void {
    this.child.kill();
  }
}
