import { describe, expect, it } from 'vitest';
import { C_KMS, DLOG10, KMS_PER_PIXEL, dzPerPixel, shiftOfZ, velocitySeparationKms, zOfShift, pixelsOfVelocity } from '../../../src/core/engine/logGrid';

describe('logGrid', () => {
  it('KMS_PER_PIXEL is c ln(10) dlog = 69.0298 km/s for dlog = 1e-4', () => {
    // docs/reference.md sec. 3 [C]: 69.0298 km/s
    expect(DLOG10).toBe(1e-4);
    expect(KMS_PER_PIXEL).toBeCloseTo(69.0298, 4);
  });

  it('zOfShift(n) = 10^(n dlog) - 1 and shiftOfZ inverts it', () => {
    // docs/reference.md sec. 3: 1 + z = 10^(n * dlog)
    expect(zOfShift(1000)).toBeCloseTo(Math.pow(10, 0.1) - 1, 14);
    expect(zOfShift(0)).toBe(0);
    for (const z of [0.001, 0.5, 3.2, 6.5]) expect(zOfShift(shiftOfZ(z))).toBeCloseTo(z, 12);
  });

  it('dzPerPixel matches a finite difference of zOfShift', () => {
    // derivative of 10^(n d): ln(10) d 10^(n d) (calculus)
    const n = 4321.5;
    const fd = (zOfShift(n + 1e-3) - zOfShift(n - 1e-3)) / 2e-3;
    expect(dzPerPixel(zOfShift(n))).toBeCloseTo(fd, 9);
  });

  it('velocity helpers agree with one pixel = 69.03 km/s', () => {
    // one pixel: c ln(1+z) with ln(1+z) = ln(10) dlog (docs/reference.md sec. 3)
    expect(velocitySeparationKms(0, zOfShift(1))).toBeCloseTo(69.0298, 3);
    // pixelsOfVelocity(v) = ln(1 + v/c) / (ln(10) dlog): the v whose 1 + v/c = 10^(10 dlog) spans exactly 10 pixels
    expect(pixelsOfVelocity(C_KMS * (Math.pow(10, 10 * DLOG10) - 1))).toBeCloseTo(10, 9);
    expect(pixelsOfVelocity(KMS_PER_PIXEL * 10)).toBeCloseTo(10, 1);
  });
});
