/**
 * Vacuum -> air wavelength, used only to write sample files that state air
 * wavelengths. IAU standard of Morton (2000, ApJS 130, 403), from Birch &
 * Downs (1994); applied above 2000 A only (docs/reference.md sec. 2).
 * Kept separate from the reader's conversion so that tests compare two codes.
 */
export function vacuumToAir(vacA: number): number {
  if (vacA < 2000) return vacA;
  const s2 = (1e4 / vacA) ** 2;
  const n = 1 + 8.34254e-5 + 2.406147e-2 / (130 - s2) + 1.5998e-4 / (38.9 - s2);
  return vacA / n;
}

/** Air -> vacuum by inverting vacuumToAir with fixed-point steps (agrees to < 1e-6 A). */
export function airToVacuum(airA: number): number {
  if (airA < 2000) return airA;
  let v = airA;
  for (let k = 0; k < 6; k++) v += airA - vacuumToAir(v);
  return v;
}
