import { describe, expect, it } from 'vitest';
import { deltaChi2At } from '../../../src/core/engine/curveAt';

const curve = (family: string, z: number[], d: number[]) => ({ family, z: Float64Array.from(z), deltaChi2: Float64Array.from(d) });

describe('deltaChi2At(curves, z)', () => {
  it('interpolates linearly between curve points (exact for a straight line)', () => {
    expect(deltaChi2At([curve('a', [0, 1, 2], [10, 20, 40])], 1.5)).toBeCloseTo(30, 12);
    expect(deltaChi2At([curve('a', [0, 1, 2], [10, 20, 40])], 0)).toBe(10);
  });
  it('takes the lowest family where ranges overlap and ignores families that do not reach z', () => {
    const cs = [curve('qso', [0, 6], [100, 100]), curve('gal', [0, 1], [5, 5])];
    expect(deltaChi2At(cs, 0.5)).toBe(5);
    expect(deltaChi2At(cs, 3)).toBe(100);
  });
  it('is NaN outside every range', () => {
    expect(deltaChi2At([curve('a', [0, 1], [1, 1])], 2)).toBeNaN();
    expect(deltaChi2At([], 0.3)).toBeNaN();
  });
});
