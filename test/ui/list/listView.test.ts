import { describe, it, expect } from 'vitest';
import { viewRows, nextUnreviewed, cycle, findByName, FILTERS, GRADE_ORDER } from '../../../src/ui/list/listView';
import type { Row } from '../../../src/ui/state/session';
import { summarise } from '../../../src/ui/persist/resultSummary';
import { makeResult, makeFailed, makeDecision } from '../fixtures';
import type { Grade } from '../../../src/core/types';

function row(i: number, over: Partial<Row> & { score?: number; z?: number; grade?: Grade; snr?: number } = {}): Row {
  const s = summarise(makeResult(`f${i}`));
  const { score, z, grade, snr, ...rest } = over;
  return {
    key: `k${i}`,
    file: `f${i}.fits`,
    order: i,
    hasBytes: true,
    status: 'ok',
    summary: { ...s, score: score ?? 0.5, z: z ?? 1, confidence: grade ?? s.confidence, medianSnr: snr ?? s.medianSnr },
    ...rest,
  };
}

const rows: Row[] = [
  row(0, { score: 0.9, z: 2.0 }),
  row(1, { score: 0.1, z: 0.5, decision: makeDecision('f1.fits', { z: 0.7 }) }),
  row(2, { status: 'failed', summary: summarise(makeFailed('f2', 'f2: empty file')) }),
  row(3, { score: 0.4, z: 3.1 }),
];

describe('viewRows', () => {
  it('filters: not yet reviewed, reviewed, only failures', () => {
    expect(viewRows(rows, 'unreviewed', 'batch').map((r) => r.key)).toEqual(['k0', 'k2', 'k3']);
    expect(viewRows(rows, 'reviewed', 'batch').map((r) => r.key)).toEqual(['k1']);
    expect(viewRows(rows, 'failures', 'batch').map((r) => r.key)).toEqual(['k2']);
  });

  it('low confidence first puts failures last', () => {
    expect(viewRows(rows, 'all', 'lowConfidence').map((r) => r.key)).toEqual(['k1', 'k3', 'k0', 'k2']);
  });

  it('sorts by the shown redshift (the reviewer\'s when decided)', () => {
    expect(viewRows(rows, 'all', 'redshift').map((r) => r.key)).toEqual(['k1', 'k0', 'k3', 'k2']);
  });
});

describe('machine grade order, S/N, flags, names', () => {
  // Scores and grades deliberately disagree in order: a grade outranks a higher score of a lower grade.
  const graded: Row[] = [
    row(0, { grade: 'high', score: 0.2, snr: 12 }),
    row(1, { grade: 'medium', score: 0.9, snr: 2.5 }),
    row(2, { grade: 'none', score: 0.95, snr: 30 }),
    row(3, { grade: 'low', score: 0.1, snr: 4 }),
    row(4, { status: 'failed', summary: summarise(makeFailed('f4', 'f4: empty file')) }),
    row(5, { grade: 'medium', score: 0.3, decision: makeDecision('f5.fits', { flags: ['sky-residuals'] }) }),
  ];

  it('"low machine grade first" follows the grade order, then the score, failures last', () => {
    const order = viewRows(graded, 'all', 'lowConfidence');
    const grades = order.filter((r) => r.status === 'ok').map((r) => GRADE_ORDER.indexOf(r.summary!.confidence));
    expect(grades).toEqual([...grades].sort((a, b) => a - b));
    expect(order.map((r) => r.key)).toEqual(['k2', 'k3', 'k5', 'k1', 'k0', 'k4']);
  });

  it('sorts by median S/N, unknown last', () => {
    const order = viewRows(graded, 'all', 'snr').map((r) => r.summary?.medianSnr);
    const known = order.filter((v): v is number => typeof v === 'number' && Number.isFinite(v));
    expect(known).toEqual([...known].sort((a, b) => a - b));
    expect(viewRows(graded, 'all', 'snr').at(-1)!.key).toBe('k4');
  });

  it('the flagged filter keeps rows with a review flag', () => {
    expect(viewRows(graded, 'flagged', 'batch').map((r) => r.key)).toEqual(['k5']);
  });

  it('findByName matches id or file, case-insensitive, and moves on to the next match', () => {
    const named: Row[] = [row(0), row(1), row(2)].map((r, i) => ({ ...r, file: `night/spec-36${i}5.fits`, summary: { ...r.summary!, objectId: i === 1 ? 'QSO J1234+5678' : undefined } }));
    expect(findByName(named, 'j1234')?.key).toBe('k1');
    expect(findByName(named, 'SPEC-36')?.key).toBe('k0');
    expect(findByName(named, 'spec-36', 'k0')?.key).toBe('k1');
    expect(findByName(named, 'spec-36', 'k2')?.key).toBe('k0');
    expect(findByName(named, 'nothing')).toBeNull();
  });
});

describe('nextUnreviewed', () => {
  it('skips reviewed rows and failures, and wraps around', () => {
    expect(nextUnreviewed(rows, 'k0')?.key).toBe('k3');
    expect(nextUnreviewed(rows, 'k0', true)?.key).toBe('k2');
    expect(nextUnreviewed(rows, 'k3')?.key).toBe('k0');
    expect(nextUnreviewed([rows[1]], 'k1')).toBeNull();
  });
});

it('cycle walks a list and wraps', () => {
  expect(cycle(FILTERS, 'all')).toBe('unreviewed');
  expect(cycle(FILTERS, FILTERS[FILTERS.length - 1].id)).toBe('all');
});
