import { describe, expect, it } from 'vitest';
import { localMinima } from '../../../src/core/engine/candidates';

describe('localMinima(y, minSep, maxCount, from, to)', () => {
  it('finds interior and end minima, best first, separated by more than minSep', () => {
    const y = Float64Array.from([1, 2, 3, 0.5, 3, 0.6, 4, 5, 0.2]);
    // minima at 0 (end), 3, 5, 8 (end); 5 is within 2 of 3 and worse -> dropped
    expect(localMinima(y, 2, 10)).toEqual([8, 3, 0]);
    expect(localMinima(y, 2, 2)).toEqual([8, 3]);
    // restricted to 2..6: minima 3 and 5 (5 kept with minSep 1)
    expect(localMinima(y, 1, 10, 2, 6)).toEqual([3, 5]);
  });
});
