import { describe, expect, it } from 'vitest';
import { Worker } from 'node:worker_threads';
import { JobFailure, ThreadPool } from '../../src/cli/threadPool';

// A plain-JS worker: echoes n*2, hangs on 'hang', dies on 'crash', throws on 'throw',
// answers 0 and then dies while idle on 'answer-then-exit'.
const code = `
const { parentPort } = require('node:worker_threads');
parentPort.on('message', (m) => {
  if (m === 'hang') { for (;;) {} }
  if (m === 'crash') { process.exit(3); }
  if (m === 'throw') { throw new Error('bad job'); }
  if (m === 'answer-then-exit') { parentPort.postMessage(0); setTimeout(() => process.exit(4), 20); return; }
  parentPort.postMessage(m * 2);
});`;

const spawn = () => new Worker(code, { eval: true });

describe('ThreadPool', () => {
  it('runs every job and keeps results with their inputs', async () => {
    const pool = new ThreadPool<number, number>({ size: 2, timeLimitMs: 10_000, spawn });
    const out = await Promise.all([1, 2, 3, 4, 5].map((n) => pool.run(n)));
    await pool.close();
    expect(out).toEqual([2, 4, 6, 8, 10]);
  });

  it('fails a job past its time limit, replaces the worker and finishes the batch', async () => {
    const pool = new ThreadPool<number | string, number>({ size: 1, timeLimitMs: 300, spawn });
    const results = await Promise.allSettled([pool.run(1), pool.run('hang'), pool.run(2)]);
    await pool.close();
    expect(results[0]).toEqual({ status: 'fulfilled', value: 2 });
    expect(results[1].status).toBe('rejected');
    expect(((results[1] as PromiseRejectedResult).reason as JobFailure).kind).toBe('timeout');
    expect(results[2]).toEqual({ status: 'fulfilled', value: 4 });
  });

  it('reports a crashed worker as a failed job and carries on', async () => {
    const pool = new ThreadPool<number | string, number>({ size: 1, timeLimitMs: 10_000, spawn });
    const results = await Promise.allSettled([pool.run('crash'), pool.run(5)]);
    await pool.close();
    expect(((results[0] as PromiseRejectedResult).reason as JobFailure).kind).toBe('crash');
    expect(results[1]).toEqual({ status: 'fulfilled', value: 10 });
  });

  it('reports an uncaught error in a worker as a crash with its message', async () => {
    const pool = new ThreadPool<number | string, number>({ size: 1, timeLimitMs: 10_000, spawn });
    const results = await Promise.allSettled([pool.run('throw'), pool.run(6)]);
    await pool.close();
    const failure = (results[0] as PromiseRejectedResult).reason as JobFailure;
    expect(failure.kind).toBe('crash');
    expect(failure.message).toMatch(/worker crashed: bad job/);
    expect(results[1]).toEqual({ status: 'fulfilled', value: 12 });
  });

  it('gives the next job a fresh worker when one died while idle, instead of failing it', async () => {
    const pool = new ThreadPool<number | string, number>({ size: 1, timeLimitMs: 10_000, spawn });
    expect(await pool.run('answer-then-exit')).toBe(0);
    // Give the worker time to exit (it does so 20 ms after answering).
    await new Promise((r) => setTimeout(r, 300));
    expect(await pool.run(7)).toBe(14);
    await pool.close();
  });

  it('refuses jobs once closed', async () => {
    const pool = new ThreadPool<number, number>({ size: 1, timeLimitMs: 10_000, spawn });
    await pool.close();
    await expect(pool.run(1)).rejects.toThrow(/pool is closed/);
  });
});
