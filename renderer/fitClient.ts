// The window's side of the fit worker: one request at a time per kind, progress reported, errors as words.

import { BenchError } from './benchError';
import type { WorkerAsk, WorkerMessage, WorkerReplyValue, WorkerRequest } from './workerProtocol';

type Pending = { resolve(value: WorkerReplyValue): void; reject(error: Error): void; onProgress?: (stage: string) => void };

/** The fit was stopped because the user moved on (another capture) or asked it to stop; not a failure to show. */
export class FitCancelled extends Error {
  constructor() {
    super('cancelled');
    this.name = 'FitCancelled';
  }
}

export class FitClient {
  private worker: Worker;
  private readonly pending = new Map<number, Pending>();
  private nextId = 1;
  /** Why the worker could not run (it failed to load), or null. */
  private broken: string | null = null;
  /**
   * The last capture the worker finished reading and the probe settings of its channels since: sent again to a fresh
   * worker after a stop, so refits still find the capture as it was shown.
   */
  private replay: WorkerRequest[] = [];

  constructor(private readonly url: string) {
    this.worker = this.startWorker();
  }

  /** True while a request is outstanding. */
  get busy(): boolean {
    return this.pending.size > 0;
  }

  /**
   * Stop whatever the worker is doing (a long fit) and start a fresh one. Its cached captures are gone, unless
   * `keepOpenCapture`: then the capture it read last is read again first (its reply is not awaited), so a refit finds it.
   */
  cancelAll(keepOpenCapture = false): void {
    this.worker.terminate();
    for (const entry of this.pending.values()) entry.reject(new FitCancelled());
    this.pending.clear();
    this.broken = null;
    this.worker = this.startWorker();
    if (keepOpenCapture) for (const message of this.replay) this.worker.postMessage({ ...message, id: this.nextId++ });
    else this.replay = [];
  }

  private startWorker(): Worker {
    const worker = new Worker(this.url, { type: 'module', name: 'ringbench-fit' });
    worker.onmessage = (event: MessageEvent<WorkerMessage>) => this.receive(event.data);
    worker.onerror = (event) => {
      event.preventDefault();
      this.broken = `the fit worker stopped (${event.message || 'it could not load'}); reload the window`;
      for (const entry of this.pending.values()) entry.reject(new BenchError(this.broken));
      this.pending.clear();
    };
    return worker;
  }

  /** One request; answers the reply of the same type. */
  async request<A extends WorkerAsk>(request: A, onProgress?: (stage: string) => void): Promise<Extract<WorkerReplyValue, { type: A['type'] }>> {
    const id = this.nextId++;
    if (this.broken) throw new BenchError(this.broken);
    const message = { ...request, id } as WorkerRequest;
    const reply = await new Promise<WorkerReplyValue>((resolve, reject) => {
      this.pending.set(id, { resolve, reject, onProgress });
      this.worker.postMessage(message);
    });
    if (reply.type !== request.type) throw new BenchError('the fit worker gave an unexpected answer');
    if (message.type === 'open' && reply.type === 'open' && reply.info) this.replay = [message];
    if (message.type === 'probe' && this.replay[0]?.type === 'open' && this.replay[0].captureId === message.captureId) this.replay.push(message);
    return reply as Extract<WorkerReplyValue, { type: A['type'] }>;
  }

  private receive(message: WorkerMessage): void {
    const entry = this.pending.get(message.id);
    if (!entry) return;
    if (message.kind === 'progress') {
      entry.onProgress?.(message.stage);
      return;
    }
    this.pending.delete(message.id);
    if (message.kind === 'done') entry.resolve(message.value);
    else entry.reject(new BenchError(message.message));
  }
}
