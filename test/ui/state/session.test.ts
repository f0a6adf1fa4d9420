import 'fake-indexeddb/auto';
import { describe, it, expect } from 'vitest';
import { Session, type Fitter } from '../../../src/ui/state/session';
import { SessionDb } from '../../../src/ui/persist/sessionDb';
import type { PoolOutcome, FitJob } from '../../../src/worker/pool';
import { makeResult, makeFailed, makeDecision, textBytes } from '../fixtures';

let dbCount = 0;
const freshName = () => `session-test-${++dbCount}`;

/** Fits instantly: a file whose text starts with 'bad' fails. */
class InstantFitter implements Fitter {
  seen: string[] = [];
  async fit(job: FitJob): Promise<PoolOutcome> {
    const bytes = await job.loadBytes();
    this.seen.push(job.file);
    const text = new TextDecoder().decode(bytes);
    return { kind: 'result', result: text.startsWith('bad') ? makeFailed(job.file, `${job.file}: no flux column`) : makeResult(job.file) };
  }
}

/** Never finishes until cancelled. */
class StuckFitter implements Fitter {
  fit(_job: FitJob, signal?: AbortSignal): Promise<PoolOutcome> {
    return new Promise((resolve) => signal?.addEventListener('abort', () => resolve({ kind: 'cancelled' })));
  }
}

async function until(cond: () => boolean): Promise<void> {
  for (let i = 0; i < 200 && !cond(); i++) await new Promise((r) => setTimeout(r, 5));
  expect(cond()).toBe(true);
}

describe('Session', () => {
  it('adds files, fits them and counts done and failed', async () => {
    const db = await SessionDb.open(freshName());
    const s = new Session(db, new InstantFitter());
    await s.restore();
    await s.addFiles([
      { path: 'a.txt', bytes: textBytes('good a') },
      { path: 'b.txt', bytes: textBytes('bad b') },
    ]);
    await until(() => !s.getSnapshot().progress.active && s.getSnapshot().rows.every((r) => r.summary));
    const snap = s.getSnapshot();
    expect(snap.rows.map((r) => [r.file, r.status])).toEqual([
      ['a.txt', 'ok'],
      ['b.txt', 'failed'],
    ]);
    expect(snap.progress).toMatchObject({ total: 2, done: 1, failed: 1, waiting: 0 });
    expect(snap.rows[1].summary?.error).toBe('b.txt: no flux column');
    db.close();
  });

  it('the same file dropped twice is one row', async () => {
    const db = await SessionDb.open(freshName());
    const fitter = new InstantFitter();
    const s = new Session(db, fitter);
    await s.restore();
    const [k1] = await s.addFiles([{ path: 'a.txt', bytes: textBytes('good') }]);
    const [k2] = await s.addFiles([{ path: 'a.txt', bytes: textBytes('good') }]);
    expect(k1).toBe(k2);
    expect(s.getSnapshot().rows).toHaveLength(1);
    db.close();
  });

  it('decisions are stored at once and a new session on the same database restores rows, results and decisions', async () => {
    const name = freshName();
    const db = await SessionDb.open(name);
    const s = new Session(db, new InstantFitter());
    await s.restore();
    const [key] = await s.addFiles([{ path: 'q.txt', bytes: textBytes('good') }]);
    await until(() => s.getSnapshot().rows[0]?.status === 'ok');
    await s.setReviewer('  R. Viewer ');
    await s.decide(key, makeDecision('q.txt', { note: 'broad C IV' }));
    db.close();

    const db2 = await SessionDb.open(name);
    const s2 = new Session(db2, new InstantFitter());
    await s2.restore();
    const snap = s2.getSnapshot();
    expect(snap.reviewer).toBe('R. Viewer');
    expect(snap.rows).toHaveLength(1);
    expect(snap.rows[0].status).toBe('ok');
    expect(snap.rows[0].decision?.note).toBe('broad C IV');
    expect((await s2.getResult(key))?.z).toBe(1.2);
    db2.close();
  });

  it('cancel leaves files unfitted and resume fits them', async () => {
    const db = await SessionDb.open(freshName());
    const s = new Session(db, new StuckFitter());
    await s.restore();
    await s.addFiles([{ path: 'x.txt', bytes: textBytes('good') }]);
    s.cancel();
    await until(() => s.getSnapshot().rows[0].status === 'cancelled');
    expect(s.getSnapshot().progress.active).toBe(false);
    (s as unknown as { fitter: Fitter }).fitter = new InstantFitter();
    await s.resume();
    await until(() => s.getSnapshot().rows[0].status === 'ok');
    db.close();
  });

  it('a refused write raises the banner message offering an export', async () => {
    const db = await SessionDb.open(freshName());
    const s = new Session(db, new InstantFitter());
    await s.restore();
    const [key] = await s.addFiles([{ path: 'q.txt', bytes: textBytes('good') }]);
    const quota = new Error('The quota has been exceeded.');
    quota.name = 'QuotaExceededError';
    (db as unknown as { db: { put: () => Promise<never> } }).db.put = () => Promise.reject(quota);
    await expect(s.decide(key, makeDecision('q.txt'))).rejects.toThrow(/quota/);
    expect(s.getSnapshot().persistError).toMatch(/quota is full.*Export the session now/);
    // The decision is still held in memory, so an export carries it.
    expect(s.getSnapshot().rows[0].decision?.state).toBe('accepted');
    db.close();
  });

  it('export then import into an empty session gives back rows and decisions', async () => {
    const db = await SessionDb.open(freshName());
    const s = new Session(db, new InstantFitter());
    await s.restore();
    const [key] = await s.addFiles([{ path: 'q.txt', bytes: textBytes('good') }]);
    await until(() => s.getSnapshot().rows[0]?.status === 'ok');
    await s.decide(key, makeDecision('q.txt'));
    const text = await s.exportSession(true);

    const db2 = await SessionDb.open(freshName());
    const s2 = new Session(db2, new InstantFitter());
    await s2.restore();
    const planned = s2.planSessionImport(text);
    expect(planned.ok).toBe(true);
    if (!planned.ok) return;
    expect(planned.plan.newEntries).toHaveLength(1);
    await s2.applyImport(planned.plan);
    const row = s2.getSnapshot().rows[0];
    expect(row.decision?.state).toBe('accepted');
    expect(row.hasBytes).toBe(true);
    expect(new TextDecoder().decode(await s2.getBytes(key))).toBe('good');
    // Typed arrays in the result survive the round trip.
    expect((await s2.getResult(key))?.curves[0].z).toBeInstanceOf(Float64Array);
    db.close();
    db2.close();
  });
});
