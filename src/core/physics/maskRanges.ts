/**
 * A copy of a spectrum with observed wavelength ranges masked, so the engine
 * fits it without them: the reviewer's way to keep broad absorption troughs
 * from dragging the redshift. The engine already treats a masked pixel as
 * having no weight, so nothing inside it changes.
 */
import type { Spectrum } from '../types';

/** The spectrum with mask = 1 inside every [fromA, toA] (observed vacuum Angstrom); arrays other than the mask are shared. */
export function maskRanges(s: Spectrum, rangesA: readonly (readonly [number, number])[]): Spectrum {
  const mask = s.mask.slice();
  for (const [a, b] of rangesA) {
    const lo = Math.min(a, b);
    const hi = Math.max(a, b);
    for (let i = 0; i < mask.length; i++) if (s.wavelengthA[i] >= lo && s.wavelengthA[i] <= hi) mask[i] = 1;
  }
  return { ...s, mask };
}
