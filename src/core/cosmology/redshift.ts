/** Throw a RangeError unless z is a finite redshift >= 0 (cosmological distances need z >= 0). */
export function checkRedshift(z: number): void {
  if (!Number.isFinite(z) || z < 0) {
    throw new RangeError(`redshift must be a finite number >= 0 for cosmological quantities, got ${z}`);
  }
}
