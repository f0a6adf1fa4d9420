/** The Fe II pseudo-continuum at a rest wavelength (0 outside its two bands); see build.ts for where it comes from. */
import { FE_BANDS } from './data';

export { FE_BANDS };

/** Template value at a rest wavelength, Angstrom, by linear interpolation between its 1 A bins; 0 outside the bands. */
export function feTemplateAt(restA: number): number {
  for (const b of FE_BANDS) {
    const x = (restA - b.startA) / b.stepA;
    if (x < 0 || x > b.flux.length - 1) continue;
    const i = Math.min(Math.floor(x), b.flux.length - 2);
    const t = x - i;
    return b.flux[i] + t * (b.flux[i + 1] - b.flux[i]);
  }
  return 0;
}
