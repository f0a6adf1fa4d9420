import { describe, it, expect } from 'vitest';
import { viewRows, nextUnreviewed, cycle, FILTERS } from '../../../src/ui/list/listView';
import type { Row } from '../../../src/ui/state/session';
import { summarise } from '../../../src/ui/persist/resultSummary';
import { makeResult, makeFailed, makeDecision } from '../fixtures';

function row(i: number, over: Partial<Row> & { score?: number; z?: number } = {}): Row {
  const s = summarise(makeResult(`f${i}`));
  const { score, z, ...rest } = over;
  return { key: `k${i}`, file: `f${i}.fits`, order: i, hasBytes: true, status: 'ok', summary: { ...s, score: score ?? 0.5, z: z ?? 1 }, ...rest };
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
  expect(cycle(FILTERS, 'failures')).toBe('all');
});
