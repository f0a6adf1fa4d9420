import { describe, it, expect } from 'vitest';
import { vacuumToAir, airToVacuum } from '../../../src/core/sim/airVacuum';

describe('vacuumToAir / airToVacuum', () => {
  // Pairs: docs/reference.md sec. 2 (Morton 2000 formula, computed).
  it.each([
    [6562.8, 6564.613],
    [5006.84, 5008.237],
    [5889.95, 5891.582],
    [3726.03, 3727.09],
  ])('air %f <-> vacuum %f within 0.002 A', (air, vac) => {
    expect(Math.abs(airToVacuum(air) - vac)).toBeLessThan(0.002);
    expect(Math.abs(vacuumToAir(vac) - air)).toBeLessThan(0.002);
  });

  it('leaves wavelengths below 2000 A alone (vacuum by convention, docs/reference.md sec. 2)', () => {
    expect(vacuumToAir(1549.06)).toBe(1549.06);
    expect(airToVacuum(1215.67)).toBe(1215.67);
  });

  it('round-trips to 1e-6 A', () => {
    for (const v of [3600, 4500.5, 7000, 9200]) expect(Math.abs(airToVacuum(vacuumToAir(v)) - v)).toBeLessThan(1e-6);
  });
});
