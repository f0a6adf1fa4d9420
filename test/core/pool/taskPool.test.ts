/**
 * The shared pool core with fake endpoints and a hand-driven timer: no
 * workers, no threads, no wall clock. The expected orders and counts follow
 * from the pool's own contract (first in, first out; one task per endpoint;
 * a failed endpoint is never reused), so the check values are by construction.
 */
import { describe, expect, it } from 'vitest';
import { TaskPool, type PoolEndpoint, type StartTimer, type TaskOutcome } from '../../../src/core/pool/taskPool';

/** An endpoint whose tasks finish only when the test says so. */
class FakeEndpoint implements PoolEndpoint<string, string> {
  terminated = 0;
  calls: { input: string; resolve: (o: string) => void; reject: (e: Error) => void }[] = [];
  constructor(readonly id: number) {}
  run(input: string): Promise<string> {
    return new Promise((resolve, reject) => this.calls.push({ input, resolve, reject }));
  }
  terminate(): void {
    this.terminated++;
  }
}

/** Timers that fire only when the test advances the fake clock. */
function manualTimers() {
  let now = 0;
  const live = new Set<{ at: number; fire: () => void }>();
  const startTimer: StartTimer = (ms, fire) => {
    const t = { at: now + ms, fire };
    live.add(t);
    return () => live.delete(t);
  };
  return {
    startTimer,
    get pending() {
      return live.size;
    },
    advance(ms: number) {
      now += ms;
      for (const t of [...live]) {
        if (t.at <= now) {
          live.delete(t);
          t.fire();
        }
      }
    },
  };
}

function setup(size: number, opts: { prestart?: boolean; timeLimitMs?: number } = {}) {
  const made: FakeEndpoint[] = [];
  const timers = manualTimers();
  const pool = new TaskPool<string, string>({
    size,
    timeLimitMs: opts.timeLimitMs ?? 1000,
    prestart: opts.prestart,
    startTimer: timers.startTimer,
    createEndpoint: () => {
      const e = new FakeEndpoint(made.length);
      made.push(e);
      return e;
    },
  });
  return { pool, made, timers };
}

/** Let queued promise callbacks run. */
async function flush(): Promise<void> {
  for (let i = 0; i < 10; i++) await Promise.resolve();
}

/** Every input an endpoint was handed, in order. */
const inputs = (e: FakeEndpoint) => e.calls.map((c) => c.input);

describe('TaskPool', () => {
  it('hands out tasks first in, first out, at most `size` at a time, reusing free endpoints', async () => {
    const { pool, made } = setup(2);
    const order: string[] = [];
    const handles = ['a', 'b', 'c', 'd', 'e'].map((x) => {
      const h = pool.submit(() => x);
      void h.outcome.then((o) => o.kind === 'done' && order.push(o.output));
      return h;
    });
    await flush();
    expect(made).toHaveLength(2);
    expect(pool.running).toBe(2);
    expect(pool.waiting).toBe(3);
    expect([inputs(made[0]), inputs(made[1])]).toEqual([['a'], ['b']]);
    // The second endpoint finishes first and takes the next waiting task.
    made[1].calls[0].resolve('B');
    await flush();
    expect(inputs(made[1])).toEqual(['b', 'c']);
    made[0].calls[0].resolve('A');
    await flush();
    expect(inputs(made[0])).toEqual(['a', 'd']);
    made[1].calls[1].resolve('C');
    await flush();
    expect(inputs(made[1])).toEqual(['b', 'c', 'e']);
    made[0].calls[1].resolve('D');
    made[1].calls[2].resolve('E');
    expect(await Promise.all(handles.map((h) => h.outcome))).toEqual(['A', 'B', 'C', 'D', 'E'].map((output) => ({ kind: 'done', output })));
    expect(order).toEqual(['B', 'A', 'C', 'D', 'E']); // completion order, not submission order
    expect(made).toHaveLength(2);
    expect(pool.running).toBe(0);
  });

  it('loads an input only when a slot is free', async () => {
    const { pool, made } = setup(1);
    const loaded: string[] = [];
    const load = (x: string) => () => (loaded.push(x), x);
    pool.submit(load('a'));
    pool.submit(load('b'));
    await flush();
    expect(loaded).toEqual(['a']);
    made[0].calls[0].resolve('A');
    await flush();
    expect(loaded).toEqual(['a', 'b']);
  });

  it('a task past its time limit fails alone: its endpoint is terminated and replaced, the others finish', async () => {
    const { pool, made, timers } = setup(2, { timeLimitMs: 5000 });
    const slow = pool.submit(() => 'slow');
    const other = pool.submit(() => 'other');
    const next = pool.submit(() => 'next');
    await flush();
    timers.advance(4999);
    await flush();
    made[1].calls[0].resolve('OTHER');
    await flush();
    // 'next' took the free endpoint; the slow one is still within its limit.
    expect(inputs(made[1])).toEqual(['other', 'next']);
    timers.advance(1);
    expect(await slow.outcome).toEqual({ kind: 'timeout', limitMs: 5000 });
    expect(made[0].terminated).toBe(1);
    expect(made[1].terminated).toBe(0);
    // A late answer from the retired endpoint changes nothing.
    made[0].calls[0].resolve('too late');
    made[1].calls[1].resolve('NEXT');
    expect(await other.outcome).toEqual({ kind: 'done', output: 'OTHER' });
    expect(await next.outcome).toEqual({ kind: 'done', output: 'NEXT' });
    // The next task gets a fresh endpoint in the slot that timed out.
    const after = [pool.submit(() => 'x'), pool.submit(() => 'y')];
    await flush();
    expect(made).toHaveLength(3);
    expect(inputs(made[2])).toEqual(['x']);
    expect(inputs(made[0])).toEqual(['slow']);
    made[2].calls[0].resolve('X');
    made[1].calls[2].resolve('Y');
    expect((await Promise.all(after.map((h) => h.outcome))).map((o) => o.kind)).toEqual(['done', 'done']);
  });

  it('a task that ends in time stops its timer', async () => {
    const { pool, made, timers } = setup(1, { timeLimitMs: 5000 });
    const h = pool.submit(() => 'a');
    await flush();
    expect(timers.pending).toBe(1);
    made[0].calls[0].resolve('A');
    expect(await h.outcome).toEqual({ kind: 'done', output: 'A' });
    expect(timers.pending).toBe(0);
    timers.advance(10_000);
    expect(made[0].terminated).toBe(0);
  });

  it('a crashing endpoint fails only its task and is replaced', async () => {
    const { pool, made } = setup(1);
    const a = pool.submit(() => 'a');
    const b = pool.submit(() => 'b');
    await flush();
    made[0].calls[0].reject(new Error('out of memory'));
    expect(await a.outcome).toEqual({ kind: 'crash', message: 'out of memory' });
    await flush();
    expect(made[0].terminated).toBe(1);
    expect(made).toHaveLength(2);
    expect(inputs(made[1])).toEqual(['b']);
    made[1].calls[0].resolve('B');
    expect(await b.outcome).toEqual({ kind: 'done', output: 'B' });
  });

  it('an endpoint whose run throws at once counts as crashed', async () => {
    const made: PoolEndpoint<string, string>[] = [];
    const pool = new TaskPool<string, string>({
      size: 1,
      timeLimitMs: 1000,
      startTimer: manualTimers().startTimer,
      createEndpoint: () => {
        const e = {
          run: (): Promise<string> => {
            throw new Error('cannot post');
          },
          terminate: () => undefined,
        };
        made.push(e);
        return e;
      },
    });
    expect(await pool.submit(() => 'a').outcome).toEqual({ kind: 'crash', message: 'cannot post' });
    expect(await pool.submit(() => 'b').outcome).toEqual({ kind: 'crash', message: 'cannot post' });
    expect(made).toHaveLength(2);
  });

  it('an input that cannot be produced fails its task without touching an endpoint', async () => {
    const { pool, made } = setup(1);
    const rejected = pool.submit(() => Promise.reject(new Error('no such key')));
    const thrown = pool.submit(() => {
      throw new Error('bad input');
    });
    expect(await rejected.outcome).toEqual({ kind: 'input-failed', message: 'no such key' });
    expect(await thrown.outcome).toEqual({ kind: 'input-failed', message: 'bad input' });
    expect(made).toHaveLength(0);
  });

  it('cancel drops a waiting task, and stops a running one, retiring its endpoint', async () => {
    const { pool, made, timers } = setup(1);
    const a = pool.submit(() => 'a');
    const b = pool.submit(() => 'b');
    const c = pool.submit(() => 'c');
    await flush();
    b.cancel();
    expect(pool.waiting).toBe(1);
    expect(await b.outcome).toEqual({ kind: 'cancelled' });
    a.cancel();
    expect(await a.outcome).toEqual({ kind: 'cancelled' });
    expect(made[0].terminated).toBe(1);
    expect(timers.pending).toBe(0);
    await flush();
    // 'c' runs on a fresh endpoint; 'b' never ran.
    expect(made).toHaveLength(2);
    expect(inputs(made[1])).toEqual(['c']);
    made[1].calls[0].resolve('C');
    expect(await c.outcome).toEqual({ kind: 'done', output: 'C' });
    // Cancelling a finished task changes nothing.
    c.cancel();
    expect(made[1].terminated).toBe(0);
  });

  it('cancelling every task of a batch at once starts none of the waiting ones', async () => {
    const { pool, made } = setup(1);
    const all = ['a', 'b', 'c'].map((x) => pool.submit(() => x));
    await flush();
    for (const h of all) h.cancel();
    await flush();
    expect((await Promise.all(all.map((h) => h.outcome))).map((o) => o.kind)).toEqual(['cancelled', 'cancelled', 'cancelled']);
    expect(made).toHaveLength(1);
    expect(inputs(made[0])).toEqual(['a']);
  });

  it('a task cancelled while its input loads never reaches an endpoint', async () => {
    const { pool, made } = setup(1);
    let release!: (x: string) => void;
    const h = pool.submit(() => new Promise<string>((r) => (release = r)));
    await flush();
    h.cancel();
    release('a');
    await flush();
    expect(await h.outcome).toEqual({ kind: 'cancelled' });
    expect(made).toHaveLength(0);
  });

  it('prestart makes every endpoint up front and replaces a retired one at once', async () => {
    const { pool, made, timers } = setup(2, { prestart: true });
    expect(made).toHaveLength(2);
    const a = pool.submit(() => 'a');
    await flush();
    expect(inputs(made[0])).toEqual(['a']);
    timers.advance(1000);
    expect((await a.outcome).kind).toBe('timeout');
    expect(made).toHaveLength(3);
    expect(made[0].terminated).toBe(1);
  });

  it('dispose cancels waiting and running tasks, terminates every endpoint and refuses new tasks', async () => {
    const { pool, made } = setup(1);
    const a = pool.submit(() => 'a');
    const b = pool.submit(() => 'b');
    await flush();
    await pool.dispose();
    const outcomes: TaskOutcome<string>[] = await Promise.all([a.outcome, b.outcome, pool.submit(() => 'c').outcome]);
    expect(outcomes).toEqual([{ kind: 'cancelled' }, { kind: 'cancelled' }, { kind: 'cancelled' }]);
    expect(made).toHaveLength(1);
    expect(made[0].terminated).toBe(1);
  });

  it('refuses a size below one or a time limit that is not positive', () => {
    const base = { timeLimitMs: 1000, startTimer: manualTimers().startTimer, createEndpoint: () => new FakeEndpoint(0) };
    expect(() => new TaskPool({ ...base, size: 0 })).toThrow(/invalid pool size: 0/);
    expect(() => new TaskPool({ ...base, size: 1.5 })).toThrow(/invalid pool size/);
    expect(() => new TaskPool({ ...base, size: 1, timeLimitMs: 0 })).toThrow(/invalid time limit: 0/);
  });

  it('replaces an endpoint that died while idle before giving it the next task', async () => {
    const { pool, made } = setup(1);
    const a = pool.submit(() => 'a');
    await flush();
    made[0].calls[0].resolve('A');
    await a.outcome;
    (made[0] as FakeEndpoint & { alive?: () => boolean }).alive = () => false;
    const b = pool.submit(() => 'b');
    await flush();
    expect(made[0].terminated).toBe(1);
    expect(made).toHaveLength(2);
    made[1].calls[0].resolve('B');
    expect(await b.outcome).toEqual({ kind: 'done', output: 'B' });
  });
});
