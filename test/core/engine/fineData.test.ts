import { describe, expect, it } from 'vitest';
import { median } from '../../../src/core/engine/fineData';
import { makeRng } from './synth';

/** The slow obvious median: sort, take the middle (mean of the two middles for even n). */
function sortedMedian(a: number[]): number {
  const s = a.slice().sort((x, y) => x - y);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : 0.5 * (s[m - 1] + s[m]);
}

describe('median (selection) against sorting', () => {
  it('gives exactly the sorted median for odd and even lengths, with ties', () => {
    const rng = makeRng(3);
    for (let t = 0; t < 300; t++) {
      const n = 1 + Math.floor(rng.next() * 60);
      // every third array drawn from few values, to have many ties
      const vals = Array.from({ length: n }, () => (t % 3 === 0 ? Math.floor(rng.next() * 4) : rng.gauss()));
      expect(median(Float64Array.from(vals), n)).toBe(sortedMedian(vals));
    }
    expect(median(new Float64Array(0), 0)).toBeNaN();
  });

  it('uses only the first n values', () => {
    expect(median(Float64Array.from([5, 1, 3, 100, 100]), 3)).toBe(3);
  });
});
