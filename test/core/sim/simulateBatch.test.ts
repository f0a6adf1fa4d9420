import { describe, it, expect } from 'vitest';
import { simulateBatch, simulateBatchItem, batchParams } from '../../../src/core/sim/simulateBatch';

describe('simulateBatch', () => {
  it('object i is the same whatever n is, and the same for the same seed', () => {
    const a = simulateBatch(3, 42);
    const b = simulateBatch(6, 42);
    for (let i = 0; i < 3; i++) {
      expect(b[i].truth.objectId).toBe(a[i].truth.objectId);
      expect(Array.from(b[i].spectrum.flux)).toEqual(Array.from(a[i].spectrum.flux));
    }
    expect(Array.from(simulateBatchItem(4, 42).spectrum.flux)).toEqual(Array.from(b[4].spectrum.flux));
    const c = simulateBatch(1, 43);
    expect(Array.from(c[0].spectrum.flux)).not.toEqual(Array.from(a[0].spectrum.flux));
  });

  it('mixes every class within the stated ranges of z and S/N', () => {
    const classes = new Set<string>();
    for (let i = 0; i < 400; i++) {
      const p = batchParams(i, 7);
      classes.add(p.class);
      expect(p.snr).toBeGreaterThanOrEqual(1.5);
      expect(p.snr).toBeLessThanOrEqual(30);
      if (p.class === 'qso') expect(p.z).toBeLessThanOrEqual(5.5);
      if (p.class === 'galaxy-sf') expect(p.z).toBeLessThanOrEqual(1.2);
      if (p.class === 'galaxy-passive') expect(p.z).toBeLessThanOrEqual(0.9);
      // |v| < 300 km/s -> |z| < 1.0007e-3 (relativistic Doppler, docs/reference.md sec. 3).
      if (p.class === 'star') expect(Math.abs(p.z)).toBeLessThan(1.0007e-3);
    }
    expect([...classes].sort()).toEqual(['galaxy-passive', 'galaxy-sf', 'qso', 'star']);
  });

  it('reaches quasars beyond z = 5', () => {
    const zs = Array.from({ length: 400 }, (_, i) => batchParams(i, 1)).filter((p) => p.class === 'qso').map((p) => p.z);
    expect(Math.max(...zs)).toBeGreaterThan(5);
  });
});
