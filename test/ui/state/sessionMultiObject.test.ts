/**
 * Multi-object files in the page's session: a first look that answers with
 * spectrum ids turns the file into one row per spectrum, in the file's place;
 * each is fitted as its own job on the file's bytes (stored once); a bad row
 * fails alone; rows, results and decisions survive a reload (IndexedDB); the
 * same file dropped again adds nothing; the file goes when its last row goes.
 * The fitter is a stand-in that splits files whose text starts with 'plate'
 * (no engine: the split itself is tested in test/core/pipeline.test.ts).
 */
import 'fake-indexeddb/auto';
import { describe, it, expect } from 'vitest';
import { Session, type Fitter } from '../../../src/ui/state/session';
import { SessionDb } from '../../../src/ui/persist/sessionDb';
import type { PoolOutcome, FitJob } from '../../../src/worker/pool';
import { isSpectrumKey, spectrumEntries, spectrumKey } from '../../../src/ui/state/spectrumRows';
import { makeResult, makeFailed, makeDecision, textBytes } from '../fixtures';

let dbCount = 0;
const freshName = () => `session-multi-${++dbCount}`;

/** 'plate N' files hold N spectra; row 2 of every plate is bad. */
class PlateFitter implements Fitter {
  jobs: { file: string; firstLook: boolean; bytes: string }[] = [];
  async fit(job: FitJob): Promise<PoolOutcome> {
    const text = new TextDecoder().decode(await job.loadBytes());
    this.jobs.push({ file: job.file, firstLook: job.firstLook === true, bytes: text });
    const m = /^plate (\d+)/.exec(text);
    if (m && job.firstLook) return { kind: 'split', ids: Array.from({ length: Number(m[1]) }, (_, i) => `${job.file}#${i + 1}`) };
    if (job.file.endsWith('#2')) return { kind: 'result', result: makeFailed(job.file, `${job.file}: no usable pixel`) };
    return { kind: 'result', result: makeResult(job.file) };
  }
}

async function until(cond: () => boolean): Promise<void> {
  for (let i = 0; i < 400 && !cond(); i++) await new Promise((r) => setTimeout(r, 5));
  expect(cond()).toBe(true);
}

const settled = (s: Session) => () => !s.getSnapshot().progress.active && s.getSnapshot().rows.every((r) => r.summary);

describe('Session with multi-object files', () => {
  it('a multi-object file becomes one row per spectrum, in its place; each is one job on the stored file; a bad row fails alone', async () => {
    const db = await SessionDb.open(freshName());
    const fitter = new PlateFitter();
    const s = new Session(db, fitter);
    await s.restore();
    const [, plateKey] = await s.addFiles([
      { path: 'a.txt', bytes: textBytes('one') },
      { path: 'night/plate.fits', bytes: textBytes('plate 3') },
      { path: 'z.txt', bytes: textBytes('two') },
    ]);
    await until(settled(s));
    const rows = s.getSnapshot().rows;
    expect(rows.map((r) => [r.file, r.status])).toEqual([
      ['a.txt', 'ok'],
      ['night/plate.fits#1', 'ok'],
      ['night/plate.fits#2', 'failed'],
      ['night/plate.fits#3', 'ok'],
      ['z.txt', 'ok'],
    ]);
    expect(rows[2].summary?.error).toBe('night/plate.fits#2: no usable pixel');
    expect(rows[1].key).toBe(`${plateKey}#1`);
    // One first look at the file, then one job per spectrum, each given the whole file.
    const plateJobs = fitter.jobs.filter((j) => j.file.startsWith('night/'));
    expect(plateJobs.map((j) => [j.file, j.firstLook])).toEqual([
      ['night/plate.fits', true],
      ['night/plate.fits#1', false],
      ['night/plate.fits#2', false],
      ['night/plate.fits#3', false],
    ]);
    expect(plateJobs.every((j) => j.bytes === 'plate 3')).toBe(true);
    expect(s.getSnapshot().progress).toMatchObject({ total: 5, done: 4, failed: 1, waiting: 0 });
    expect(new TextDecoder().decode(await s.getBytes(rows[3].key))).toBe('plate 3');
    db.close();
  });

  it('rows, results and decisions of a split file survive a reload, and are not fitted again', async () => {
    const name = freshName();
    let db = await SessionDb.open(name);
    let s = new Session(db, new PlateFitter());
    await s.restore();
    await s.addFiles([{ path: 'plate.fits', bytes: textBytes('plate 2') }]);
    await until(settled(s));
    const key1 = s.getSnapshot().rows[0].key;
    await s.decide(key1, makeDecision('plate.fits#1', { z: 2.25 }));
    db.close();

    db = await SessionDb.open(name);
    const again = new PlateFitter();
    s = new Session(db, again);
    await s.restore();
    const rows = s.getSnapshot().rows;
    expect(rows.map((r) => [r.file, r.status, r.decision?.z ?? null])).toEqual([
      ['plate.fits#1', 'ok', 2.25],
      ['plate.fits#2', 'failed', null],
    ]);
    expect(again.jobs).toEqual([]);
    expect(new TextDecoder().decode(await s.getBytes(rows[1].key))).toBe('plate 2');
    // Refitting one spectrum after the reload fits that spectrum, not the file.
    await s.fitKeys([rows[0].key]);
    expect(again.jobs.map((j) => [j.file, j.firstLook])).toEqual([['plate.fits#1', false]]);
    // The same file dropped again is reported, not added.
    const report = await s.addFilesReport([{ path: 'plate.fits', bytes: textBytes('plate 2') }]);
    expect(report.duplicates).toEqual(['plate.fits']);
    expect(s.getSnapshot().rows).toHaveLength(2);
    db.close();
  });

  it('a session file saved with its spectra brings the rows back elsewhere, each refitted as its own spectrum', async () => {
    const db = await SessionDb.open(freshName());
    const s = new Session(db, new PlateFitter());
    await s.restore();
    await s.addFiles([{ path: 'plate.fits', bytes: textBytes('plate 2') }]);
    await until(settled(s));
    await s.decide(s.getSnapshot().rows[1].key, makeDecision('plate.fits#2', { state: 'rejected', z: null, zErr: null }));
    const text = await s.exportSession(true);

    const db2 = await SessionDb.open(freshName());
    const fitter = new PlateFitter();
    const s2 = new Session(db2, fitter);
    await s2.restore();
    const planned = s2.planSessionImport(text);
    if (!planned.ok) throw new Error(planned.problems.join('; '));
    await s2.applyImport(planned.plan);
    const rows = s2.getSnapshot().rows;
    expect(rows.map((r) => [r.file, r.status, r.decision?.state ?? null])).toEqual([
      ['plate.fits#1', 'ok', null],
      ['plate.fits#2', 'failed', 'rejected'],
    ]);
    await s2.fitKeys([rows[0].key]);
    expect(fitter.jobs).toEqual([{ file: 'plate.fits#1', firstLook: false, bytes: 'plate 2' }]);
    db.close();
    db2.close();
  });

  it('a split file is forgotten with its last spectrum', async () => {
    const name = freshName();
    const db = await SessionDb.open(name);
    const s = new Session(db, new PlateFitter());
    await s.restore();
    const [plateKey] = await s.addFiles([{ path: 'plate.fits', bytes: textBytes('plate 2') }]);
    await until(settled(s));
    const keys = s.getSnapshot().rows.map((r) => r.key);
    await s.removeFiles([keys[0]]);
    expect(await db.getBytes(plateKey)).toBeDefined();
    await s.removeFiles([keys[1]]);
    expect(await db.getBytes(plateKey)).toBeUndefined();
    expect((await db.loadSession()).entries).toEqual([]);
    db.close();
  });
});

describe('spectrumRows', () => {
  it('keys a spectrum by its file key and #n, and orders the spectra where the file was', () => {
    const file = { key: 'p.fits|10|0123abcd', file: 'p.fits', order: 4, sizeBytes: 10, addedAt: 't', hasBytes: true };
    const entries = spectrumEntries(file, ['p.fits#1', 'p.fits#7'], 'now');
    expect(entries.map((e) => [e.key, e.file, e.bytesKey])).toEqual([
      ['p.fits|10|0123abcd#1', 'p.fits#1', file.key],
      ['p.fits|10|0123abcd#7', 'p.fits#7', file.key],
    ]);
    expect(entries.every((e) => e.order > 4 && e.order < 5)).toBe(true);
    expect(entries[0].order).toBeLessThan(entries[1].order);
    expect(isSpectrumKey(entries[1].key)).toBe(true);
    expect(isSpectrumKey(file.key)).toBe(false);
    expect(isSpectrumKey('night#3|10|0123abcd')).toBe(false);
    expect(() => spectrumKey(file.key, 'p.fits', 'q.fits#1')).toThrow(/not of file p\.fits/);
  });
});
