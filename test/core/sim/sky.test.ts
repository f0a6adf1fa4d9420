import { describe, it, expect } from 'vitest';
import { SKY_LINES, TELLURIC_BANDS } from '../../../src/core/sim/sky';

describe('sky', () => {
  it('includes the named night-sky lines (vacuum, docs/reference.md sec. 7)', () => {
    for (const v of [5578.89, 5891.58, 6302.04]) expect(SKY_LINES.some((l) => Math.abs(l.vacA - v) < 0.01)).toBe(true);
  });

  it('has an OH-like forest only redward of 6800 A and is sorted', () => {
    const red = SKY_LINES.filter((l) => l.vacA > 6800);
    expect(red.length).toBeGreaterThan(60);
    expect(SKY_LINES.filter((l) => l.vacA > 6400 && l.vacA < 6800).length).toBe(0);
    for (let i = 1; i < SKY_LINES.length; i++) expect(SKY_LINES[i].vacA).toBeGreaterThanOrEqual(SKY_LINES[i - 1].vacA);
  });

  it('telluric bands include the O2 A band at 7592-7702 A (vacuum, docs/reference.md sec. 7)', () => {
    expect(TELLURIC_BANDS.some((b) => b.fromA === 7592 && b.toA === 7702)).toBe(true);
  });
});
