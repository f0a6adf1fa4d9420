import { describe, expect, it } from 'vitest';
import { assignReviewers } from '../../../src/core/team/assign';

const ids = Array.from({ length: 47 }, (_, i) => `spec-${i}.fits|${1000 + i}|abc${i}`);
const people = ['Ana', 'Bo', 'Cy', 'Di', 'Ed'];

describe('assignReviewers(ids, reviewers, k, seed)', () => {
  it('is reproducible: the same seed gives the same assignment, another seed another one', () => {
    const a = assignReviewers(ids, people, 2, 42);
    const b = assignReviewers(ids, people, 2, 42);
    expect([...a.bySpectrum]).toEqual([...b.bySpectrum]);
    const c = assignReviewers(ids, people, 2, 43);
    expect([...c.bySpectrum]).not.toEqual([...a.bySpectrum]);
  });

  it.each([
    [2, 2],
    [5, 2],
    [5, 3],
    [3, 3],
    [4, 1],
  ])('with %i reviewers and k = %i: k different reviewers per spectrum, loads within one', (nPeople, k) => {
    const names = people.slice(0, nPeople);
    const a = assignReviewers(ids, names, k, 7);
    for (const id of ids) {
      const who = a.bySpectrum.get(id)!;
      expect(who).toHaveLength(k);
      expect(new Set(who).size).toBe(k);
    }
    const loads = names.map((n) => a.byReviewer.get(n)!.length);
    expect(loads.reduce((s, x) => s + x, 0)).toBe(ids.length * k);
    expect(Math.max(...loads) - Math.min(...loads)).toBeLessThanOrEqual(1);
    // byReviewer keeps the batch order.
    for (const n of names) {
      const list = a.byReviewer.get(n)!;
      expect(list).toEqual(ids.filter((id) => list.includes(id)));
    }
  });

  it('refuses k above the number of reviewers, a repeated name and a repeated id', () => {
    expect(() => assignReviewers(ids, ['Ana'], 2, 1)).toThrow(/at least 2 reviewers/);
    expect(() => assignReviewers(ids, ['Ana', ' Ana'], 1, 1)).toThrow(/named twice/);
    expect(() => assignReviewers(['x', 'x'], people, 2, 1)).toThrow(/appears twice/);
    expect(() => assignReviewers(ids, people, 0, 1)).toThrow(/whole number/);
  });
});
