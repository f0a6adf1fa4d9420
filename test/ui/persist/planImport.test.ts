import { describe, it, expect } from 'vitest';
import { planImport } from '../../../src/ui/persist/planImport';
import { SESSION_FORMAT, SESSION_VERSION, type SessionFile } from '../../../src/ui/persist/sessionFile';
import { makeDecision } from '../fixtures';
import type { ReviewDecision } from '../../../src/core/types';

function incoming(entries: { key: string; decision: ReviewDecision | null; bytes?: Uint8Array }[]): SessionFile {
  return {
    format: SESSION_FORMAT,
    version: SESSION_VERSION,
    exportedAt: '2026-01-03T00:00:00Z',
    software: 't',
    reviewer: 'Other',
    cosmology: { h0: 70, omegaM: 0.3, omegaK: 0, omegaR: 0 },
    entries: entries.map((e, i) => ({ key: e.key, file: `${e.key}.fits`, order: i, result: null, decision: e.decision, bytes: e.bytes })),
  };
}

const early = '2026-01-01T00:00:00.000Z';
const late = '2026-01-05T00:00:00.000Z';

describe('planImport', () => {
  it('adds unknown files with their decisions', () => {
    const plan = planImport(new Map(), incoming([{ key: 'a', decision: makeDecision('a.fits') }]));
    expect(plan.newEntries.map((e) => e.key)).toEqual(['a']);
    expect(plan.decisions.map((d) => d.key)).toEqual(['a']);
  });

  it('takes a newer incoming decision over an older one here', () => {
    const here = new Map([['a', { hasBytes: true, decision: makeDecision('a.fits', { decidedAt: early }) }]]);
    const plan = planImport(here, incoming([{ key: 'a', decision: makeDecision('a.fits', { decidedAt: late, state: 'rejected', z: null, zErr: null }) }]));
    expect(plan.decisions).toHaveLength(1);
    expect(plan.conflicts).toHaveLength(0);
  });

  it('never overwrites a newer decision here: it becomes a conflict to ask about', () => {
    const mine = makeDecision('a.fits', { decidedAt: late });
    const theirs = makeDecision('a.fits', { decidedAt: early, note: 'older' });
    const plan = planImport(new Map([['a', { hasBytes: true, decision: mine }]]), incoming([{ key: 'a', decision: theirs }]));
    expect(plan.decisions).toHaveLength(0);
    expect(plan.conflicts).toEqual([{ key: 'a', file: 'a.fits', mine, theirs }]);
  });

  it('counts identical decisions as unchanged and attaches missing bytes', () => {
    const d = makeDecision('a.fits');
    const plan = planImport(new Map([['a', { hasBytes: false, decision: d }]]), incoming([{ key: 'a', decision: { ...d }, bytes: new Uint8Array([1]) }]));
    expect(plan.unchanged).toBe(1);
    expect(plan.bytesToAttach.map((e) => e.key)).toEqual(['a']);
  });
});
