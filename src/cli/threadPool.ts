import { Worker } from 'node:worker_threads';

/**
 * A pool of Node worker_threads with a time limit per job. A job that runs past
 * its limit, or a worker that crashes, fails only that job: the worker is
 * terminated and replaced, and the rest of the batch carries on.
 */
export interface PoolOptions {
  size: number;
  /** Per-job time limit, ms. */
  timeLimitMs: number;
  /** Creates one worker; injected so tests can use any entry point. */
  spawn: () => Worker;
}

export class JobFailure extends Error {
  constructor(readonly kind: 'timeout' | 'crash', message: string) {
    super(message);
    this.name = 'JobFailure';
  }
}

interface Slot {
  worker: Worker;
  busy: boolean;
}

interface Pending<I, O> {
  input: I;
  resolve: (o: O) => void;
  reject: (e: Error) => void;
}

export class ThreadPool<I, O> {
  private readonly slots: Slot[] = [];
  private readonly queue: Pending<I, O>[] = [];
  private closed = false;

  constructor(private readonly options: PoolOptions) {
    for (let i = 0; i < options.size; i++) this.slots.push({ worker: options.spawn(), busy: false });
  }

  run(input: I): Promise<O> {
    if (this.closed) return Promise.reject(new Error('pool is closed'));
    return new Promise<O>((resolve, reject) => {
      this.queue.push({ input, resolve, reject });
      this.pump();
    });
  }

  async close(): Promise<void> {
    this.closed = true;
    await Promise.all(this.slots.map((s) => s.worker.terminate()));
  }

  private pump(): void {
    for (const slot of this.slots) {
      if (slot.busy) continue;
      const job = this.queue.shift();
      if (!job) return;
      this.start(slot, job);
    }
  }

  private start(slot: Slot, job: Pending<I, O>): void {
    slot.busy = true;
    const worker = slot.worker;
    let settled = false;
    const finish = (replace: boolean, done: () => void) => {
      if (settled) return;
      settled = true;
      clearTimeout(timer);
      worker.off('message', onMessage);
      worker.off('error', onError);
      worker.off('exit', onExit);
      if (replace) {
        void worker.terminate();
        slot.worker = this.options.spawn();
      }
      slot.busy = false;
      done();
      if (!this.closed) this.pump();
    };
    const onMessage = (o: O) => finish(false, () => job.resolve(o));
    const onError = (e: Error) => finish(true, () => job.reject(new JobFailure('crash', `worker crashed: ${e.message}`)));
    const onExit = (code: number) => finish(true, () => job.reject(new JobFailure('crash', `worker exited with code ${code}`)));
    const timer = setTimeout(
      () => finish(true, () => job.reject(new JobFailure('timeout', `no result within ${this.options.timeLimitMs / 1000} s`))),
      this.options.timeLimitMs,
    );
    worker.on('message', onMessage);
    worker.on('error', onError);
    worker.on('exit', onExit);
    worker.postMessage(job.input);
  }
}
