/**
 * The scheduling core shared by the browser worker pool (src/worker/pool.ts)
 * and the Node thread pool (src/cli/threadPool.ts): a first-in first-out
 * queue, at most `size` tasks at once, a time limit per task, and retirement
 * of any endpoint (a Web Worker, a worker thread, a fake in tests) that timed
 * out, failed or was cancelled mid-task. A retired endpoint is terminated and
 * never used again; a fresh one takes its slot. One bad task therefore fails
 * only itself, and the rest of the batch carries on.
 *
 * Pure: no DOM, no Node types, no clock. The adapters pass in how to make an
 * endpoint and how to start a timer.
 */

/** One worker as the pool sees it: runs one task at a time. */
export interface PoolEndpoint<I, O> {
  /** Run one task. Resolve with its output; reject when the endpoint itself failed (crashed, exited). */
  run(input: I): Promise<O>;
  /** Stop the endpoint for good. It is never used again after this call. */
  terminate(): void | Promise<unknown>;
  /** False once the endpoint died on its own between tasks; it is then replaced before the next task. Optional. */
  alive?(): boolean;
}

/** Starts a one-shot timer of `ms` milliseconds and returns a function that stops it. */
export type StartTimer = (ms: number, onExpire: () => void) => () => void;

export interface TaskPoolOptions<I, O> {
  /** Tasks run at once (number of endpoints), >= 1. */
  size: number;
  /** Per-task time limit, ms, counted from the moment the endpoint is handed the input. */
  timeLimitMs: number;
  createEndpoint: () => PoolEndpoint<I, O>;
  startTimer: StartTimer;
  /**
   * Make every endpoint at construction and a replacement right after one is
   * retired (worth it when starting one is slow). Default false: an endpoint
   * is made when a task first needs its slot.
   */
  prestart?: boolean;
}

/** How a task ended. Never a rejection: every failure is a value. */
export type TaskOutcome<O> =
  | { kind: 'done'; output: O }
  /** No output within the time limit; the endpoint was retired. */
  | { kind: 'timeout'; limitMs: number }
  /** The endpoint failed (its run rejected or threw); the endpoint was retired. */
  | { kind: 'crash'; message: string }
  /** The input could not be produced; no endpoint was involved. */
  | { kind: 'input-failed'; message: string }
  /** Cancelled (or the pool was disposed) before an output arrived. */
  | { kind: 'cancelled' };

export interface TaskHandle<O> {
  /** Settles exactly once; never rejects. */
  readonly outcome: Promise<TaskOutcome<O>>;
  /** Drop the task if it waits; stop it (retiring its endpoint) if it runs; no effect once settled. */
  cancel(): void;
}

interface Task<I, O> {
  load: () => I | Promise<I>;
  settle: (o: TaskOutcome<O>) => void;
  settled: boolean;
  /** The slot running it, once it left the queue. */
  slot: Slot<I, O> | null;
  stopTimer?: () => void;
}

interface Slot<I, O> {
  endpoint: PoolEndpoint<I, O> | null;
  task: Task<I, O> | null;
}

function messageOf(e: unknown): string {
  return e instanceof Error ? e.message : String(e);
}

export class TaskPool<I, O> {
  private readonly slots: Slot<I, O>[];
  private readonly queue: Task<I, O>[] = [];
  private disposed = false;
  private pumpScheduled = false;
  /** Endpoints made so far (the first ones plus replacements); for tests and diagnostics. */
  endpointsCreated = 0;

  constructor(private readonly options: TaskPoolOptions<I, O>) {
    if (!(Number.isInteger(options.size) && options.size >= 1)) throw new Error(`invalid pool size: ${options.size}`);
    if (!(options.timeLimitMs > 0)) throw new Error(`invalid time limit: ${options.timeLimitMs}`);
    this.slots = Array.from({ length: options.size }, () => ({ endpoint: null, task: null }));
    if (options.prestart) for (const slot of this.slots) slot.endpoint = this.create();
  }

  /** Tasks waiting for a slot. */
  get waiting(): number {
    return this.queue.length;
  }

  /** Tasks holding a slot now (producing their input or running). */
  get running(): number {
    return this.slots.filter((s) => s.task !== null).length;
  }

  /**
   * Queue a task. `load` is called only when a slot is free, so a long queue
   * holds no inputs; a load that throws or rejects ends the task as
   * 'input-failed' without touching an endpoint.
   */
  submit(load: () => I | Promise<I>): TaskHandle<O> {
    let settle!: (o: TaskOutcome<O>) => void;
    const outcome = new Promise<TaskOutcome<O>>((resolve) => (settle = resolve));
    const task: Task<I, O> = { load, settle, settled: false, slot: null };
    if (this.disposed) {
      this.finish(task, { kind: 'cancelled' }, false);
    } else {
      this.queue.push(task);
      this.pump();
    }
    return { outcome, cancel: () => this.cancel(task) };
  }

  /** Terminate every endpoint; waiting and running tasks end as cancelled. Resolves when every endpoint has stopped. */
  dispose(): Promise<void> {
    this.disposed = true;
    for (const task of this.queue.splice(0)) this.finish(task, { kind: 'cancelled' }, false);
    const stopping: Promise<unknown>[] = [];
    for (const slot of this.slots) {
      if (slot.task) this.finish(slot.task, { kind: 'cancelled' }, false);
      if (slot.endpoint) stopping.push(this.stop(slot.endpoint));
      slot.endpoint = null;
    }
    return Promise.all(stopping).then(() => undefined);
  }

  private cancel(task: Task<I, O>): void {
    if (task.settled) return;
    const i = this.queue.indexOf(task);
    if (i >= 0) this.queue.splice(i, 1);
    // A task still producing its input has no endpoint to retire; a running one has.
    this.finish(task, { kind: 'cancelled' }, task.stopTimer !== undefined);
  }

  private create(): PoolEndpoint<I, O> {
    this.endpointsCreated++;
    return this.options.createEndpoint();
  }

  /** Terminate an endpoint, swallowing any error: it may already be gone. */
  private stop(endpoint: PoolEndpoint<I, O>): Promise<unknown> {
    try {
      return Promise.resolve(endpoint.terminate()).catch(() => undefined);
    } catch {
      return Promise.resolve();
    }
  }

  /**
   * Start queued tasks on free slots. Called after submit, and one microtask
   * after a task ends, so that every cancel triggered by one event (e.g. one
   * AbortSignal shared by a batch) is seen before the next task starts.
   */
  private pump(): void {
    for (const slot of this.slots) {
      if (this.disposed || this.queue.length === 0) return;
      if (slot.task) continue;
      this.start(slot, this.queue.shift()!);
    }
  }

  private schedulePump(): void {
    if (this.pumpScheduled || this.disposed) return;
    this.pumpScheduled = true;
    void Promise.resolve().then(() => {
      this.pumpScheduled = false;
      this.pump();
    });
  }

  private start(slot: Slot<I, O>, task: Task<I, O>): void {
    slot.task = task;
    task.slot = slot;
    let input: Promise<I>;
    try {
      input = Promise.resolve(task.load());
    } catch (e) {
      input = Promise.reject(e);
    }
    input.then(
      (value) => this.launch(slot, task, value),
      (e) => this.finish(task, { kind: 'input-failed', message: messageOf(e) }, false),
    );
  }

  private launch(slot: Slot<I, O>, task: Task<I, O>, input: I): void {
    if (task.settled) return; // cancelled while its input was produced
    if (slot.endpoint?.alive?.() === false) {
      void this.stop(slot.endpoint);
      slot.endpoint = null;
    }
    if (!slot.endpoint) slot.endpoint = this.create();
    const endpoint = slot.endpoint;
    const limitMs = this.options.timeLimitMs;
    task.stopTimer = this.options.startTimer(limitMs, () => this.finish(task, { kind: 'timeout', limitMs }, true));
    let running: Promise<O>;
    try {
      running = endpoint.run(input);
    } catch (e) {
      running = Promise.reject(e);
    }
    running.then(
      (output) => this.finish(task, { kind: 'done', output }, false),
      (e) => this.finish(task, { kind: 'crash', message: messageOf(e) }, true),
    );
  }

  /** End a task once: stop its timer, retire its endpoint when asked, free its slot. */
  private finish(task: Task<I, O>, outcome: TaskOutcome<O>, retire: boolean): void {
    if (task.settled) return;
    task.settled = true;
    task.stopTimer?.();
    const slot = task.slot;
    if (slot) {
      if (retire && slot.endpoint) {
        void this.stop(slot.endpoint);
        slot.endpoint = this.options.prestart && !this.disposed ? this.create() : null;
      }
      slot.task = null;
      task.slot = null;
    }
    task.settle(outcome);
    if (slot) this.schedulePump();
  }
}
