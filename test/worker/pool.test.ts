import { describe, it, expect, vi, afterEach } from 'vitest';
import { FitPool, defaultPoolSize, type PoolWorker, type FitJob } from '../../src/worker/pool';
import type { FitResult } from '../../src/core/types';
import { failedResult } from '../../src/core/failedResult';

/** A fake worker whose fits finish only when the test says so. */
class FakeWorker implements PoolWorker {
  static made: FakeWorker[] = [];
  terminated = false;
  calls: { file: string; resolve: (r: FitResult) => void; reject: (e: Error) => void }[] = [];
  constructor() {
    FakeWorker.made.push(this);
  }
  fitFile(_bytes: Uint8Array, file: string): Promise<FitResult> {
    return new Promise((resolve, reject) => this.calls.push({ file, resolve, reject }));
  }
  terminate(): void {
    this.terminated = true;
  }
}

function okResult(file: string): FitResult {
  return { ...failedResult(file, 'x'), status: 'ok', error: undefined, z: 1.5 };
}

function job(file: string): FitJob {
  return { key: `k-${file}`, file, loadBytes: async () => new Uint8Array([1, 2, 3]) };
}

/** Let queued promise callbacks run. */
async function flush(): Promise<void> {
  for (let i = 0; i < 10; i++) await Promise.resolve();
}

afterEach(() => {
  FakeWorker.made = [];
  vi.useRealTimers();
});

describe('FitPool', () => {
  it('runs at most `size` files at once and starts the next when one finishes', async () => {
    const pool = new FitPool({ size: 2, createWorker: () => new FakeWorker(), timeLimitMs: 1000 });
    const outcomes = ['a', 'b', 'c'].map((f) => pool.fit(job(f)));
    await flush();
    expect(FakeWorker.made).toHaveLength(2);
    expect(pool.running).toBe(2);
    expect(pool.waiting).toBe(1);
    const [w1] = FakeWorker.made;
    w1.calls[0].resolve(okResult('a'));
    await flush();
    // The freed worker takes the third file; no new worker is made.
    expect(FakeWorker.made).toHaveLength(2);
    expect(w1.calls.map((c) => c.file)).toEqual(['a', 'c']);
    expect(await outcomes[0]).toEqual({ kind: 'result', result: okResult('a') });
    pool.dispose();
  });

  it('marks a file timeout after the limit, terminates its worker and replaces it', async () => {
    vi.useFakeTimers();
    const pool = new FitPool({ size: 1, createWorker: () => new FakeWorker(), timeLimitMs: 5000 });
    const slow = pool.fit(job('slow.fits'));
    const next = pool.fit(job('next.fits'));
    await flush();
    expect(FakeWorker.made).toHaveLength(1);
    await vi.advanceTimersByTimeAsync(5001);
    const out = await slow;
    expect(out.kind).toBe('result');
    if (out.kind === 'result') {
      expect(out.result.status).toBe('timeout');
      expect(out.result.error).toMatch(/slow\.fits.*time limit/);
    }
    expect(FakeWorker.made[0].terminated).toBe(true);
    await flush();
    // A fresh worker carries on with the rest of the batch.
    expect(FakeWorker.made).toHaveLength(2);
    expect(FakeWorker.made[1].calls.map((c) => c.file)).toEqual(['next.fits']);
    FakeWorker.made[1].calls[0].resolve(okResult('next.fits'));
    const n = await next;
    expect(n.kind === 'result' && n.result.status).toBe('ok');
    pool.dispose();
  });

  it('a file finishing before the limit is not marked timeout', async () => {
    vi.useFakeTimers();
    const pool = new FitPool({ size: 1, createWorker: () => new FakeWorker(), timeLimitMs: 5000 });
    const p = pool.fit(job('quick.fits'));
    await flush();
    await vi.advanceTimersByTimeAsync(4000);
    FakeWorker.made[0].calls[0].resolve(okResult('quick.fits'));
    const out = await p;
    expect(out.kind === 'result' && out.result.status).toBe('ok');
    await vi.advanceTimersByTimeAsync(5000);
    expect(FakeWorker.made[0].terminated).toBe(false);
    pool.dispose();
  });

  it('cancel drops queued files and stops the running one, replacing its worker', async () => {
    const pool = new FitPool({ size: 1, createWorker: () => new FakeWorker(), timeLimitMs: 1000 });
    const ctl = new AbortController();
    const outs = ['a', 'b', 'c'].map((f) => pool.fit(job(f), ctl.signal));
    await flush();
    expect(pool.waiting).toBe(2);
    ctl.abort();
    expect(await Promise.all(outs)).toEqual([{ kind: 'cancelled' }, { kind: 'cancelled' }, { kind: 'cancelled' }]);
    expect(FakeWorker.made[0].terminated).toBe(true);
    expect(pool.waiting).toBe(0);
    // Later work gets a new worker.
    const later = pool.fit(job('d'));
    await flush();
    expect(FakeWorker.made).toHaveLength(2);
    FakeWorker.made[1].calls[0].resolve(okResult('d'));
    expect((await later).kind).toBe('result');
    pool.dispose();
  });

  it('an already-aborted signal is cancelled without starting a worker', async () => {
    const pool = new FitPool({ size: 1, createWorker: () => new FakeWorker(), timeLimitMs: 1000 });
    const ctl = new AbortController();
    ctl.abort();
    expect(await pool.fit(job('a'), ctl.signal)).toEqual({ kind: 'cancelled' });
    expect(FakeWorker.made).toHaveLength(0);
  });

  it('a crashing worker fails only its file and is replaced', async () => {
    const pool = new FitPool({ size: 1, createWorker: () => new FakeWorker(), timeLimitMs: 1000 });
    const a = pool.fit(job('a.fits'));
    const b = pool.fit(job('b.fits'));
    await flush();
    FakeWorker.made[0].calls[0].reject(new Error('out of memory'));
    const out = await a;
    expect(out.kind === 'result' && out.result.status).toBe('failed');
    expect(out.kind === 'result' && out.result.error).toMatch(/a\.fits: worker failed: out of memory/);
    await flush();
    expect(FakeWorker.made[0].terminated).toBe(true);
    FakeWorker.made[1].calls[0].resolve(okResult('b.fits'));
    expect((await b).kind).toBe('result');
    pool.dispose();
  });

  it('bytes that cannot be loaded fail the file without touching a worker', async () => {
    const pool = new FitPool({ size: 1, createWorker: () => new FakeWorker(), timeLimitMs: 1000 });
    const out = await pool.fit({ key: 'k', file: 'gone.fits', loadBytes: async () => Promise.reject(new Error('no such key')) });
    expect(out.kind === 'result' && out.result.error).toMatch(/gone\.fits: stored bytes could not be read/);
    expect(FakeWorker.made).toHaveLength(0);
  });

  it('dispose cancels queued files and terminates workers', async () => {
    const pool = new FitPool({ size: 1, createWorker: () => new FakeWorker(), timeLimitMs: 1000 });
    void pool.fit(job('a'));
    const b = pool.fit(job('b'));
    await flush();
    pool.dispose();
    expect(await b).toEqual({ kind: 'cancelled' });
    expect(FakeWorker.made[0].terminated).toBe(true);
  });

  it('dispose also ends the running file as cancelled rather than leaving it to its time limit', async () => {
    const pool = new FitPool({ size: 1, createWorker: () => new FakeWorker(), timeLimitMs: 1000 });
    const a = pool.fit(job('a'));
    await flush();
    expect(pool.running).toBe(1);
    pool.dispose();
    expect(await a).toEqual({ kind: 'cancelled' });
    expect(pool.running).toBe(0);
    expect(await pool.fit(job('b'))).toEqual({ kind: 'cancelled' });
    expect(pool.workersCreated).toBe(1);
  });

  it('one abort signal for a batch stops every file, running or waiting, and leaves the pool usable', async () => {
    const pool = new FitPool({ size: 2, createWorker: () => new FakeWorker(), timeLimitMs: 1000 });
    const ctl = new AbortController();
    const outs = ['a', 'b', 'c', 'd'].map((f) => pool.fit(job(f), ctl.signal));
    await flush();
    ctl.abort();
    expect((await Promise.all(outs)).every((o) => o.kind === 'cancelled')).toBe(true);
    await flush();
    // No waiting file slipped onto a worker between the cancels.
    expect(FakeWorker.made.flatMap((w) => w.calls.map((c) => c.file))).toEqual(['a', 'b']);
    expect(FakeWorker.made.every((w) => w.terminated)).toBe(true);
    pool.dispose();
  });

  it('defaultPoolSize uses every core of a small machine and leaves one for the page on a larger one', () => {
    expect(defaultPoolSize(8)).toBe(7);
    expect(defaultPoolSize(32)).toBe(8);
    expect(defaultPoolSize(2)).toBe(2);
    expect(defaultPoolSize(1)).toBe(1);
    expect(defaultPoolSize(undefined)).toBe(2);
  });
});

describe('FitPool and multi-object files', () => {
  /** A worker that splits any file on a first look and fits any id. */
  class SplittingWorker implements PoolWorker {
    looks: string[] = [];
    fits: string[] = [];
    async fitFile(_bytes: Uint8Array, file: string): Promise<FitResult> {
      this.fits.push(file);
      return okResult(file);
    }
    async fitOrSplit(_bytes: Uint8Array, file: string) {
      this.looks.push(file);
      return { kind: 'split' as const, ids: [`${file}#1`, `${file}#3`] };
    }
    terminate(): void {}
  }

  it('a first look answers with the spectra ids; a spectrum job is a plain fit of its id', async () => {
    const worker = new SplittingWorker();
    const pool = new FitPool({ size: 1, createWorker: () => worker, timeLimitMs: 1000 });
    expect(await pool.fit({ ...job('plate.fits'), firstLook: true })).toEqual({ kind: 'split', ids: ['plate.fits#1', 'plate.fits#3'] });
    expect(await pool.fit(job('plate.fits#3'))).toEqual({ kind: 'result', result: okResult('plate.fits#3') });
    expect(worker.looks).toEqual(['plate.fits']);
    expect(worker.fits).toEqual(['plate.fits#3']);
  });

  it('a worker that cannot split (no fitOrSplit) fits the file as one spectrum', async () => {
    const pool = new FitPool({ size: 1, createWorker: () => new FakeWorker(), timeLimitMs: 1000 });
    const outcome = pool.fit({ ...job('a.csv'), firstLook: true });
    await flush();
    FakeWorker.made[0].calls[0].resolve(okResult('a.csv'));
    expect(await outcome).toEqual({ kind: 'result', result: okResult('a.csv') });
  });
});
