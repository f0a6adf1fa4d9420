import type { Spectrum } from '../../src/core/types';

/**
 * The Spectrum contract of src/core/types.ts, checked from the outside: the
 * problems found (empty when the spectrum keeps every promise).
 */
export function checkSpectrumInvariants(s: Spectrum): string[] {
  const problems: string[] = [];
  const n = s.wavelengthA.length;
  if (n < 2) problems.push(`length ${n} < 2`);
  if (s.flux.length !== n) problems.push(`flux length ${s.flux.length} != ${n}`);
  if (s.mask.length !== n) problems.push(`mask length ${s.mask.length} != ${n}`);
  if (s.ivar && s.ivar.length !== n) problems.push(`ivar length ${s.ivar.length} != ${n}`);
  for (let i = 0; i < n; i++) {
    if (!Number.isFinite(s.wavelengthA[i])) {
      problems.push(`wavelength ${i} not finite`);
      break;
    }
    if (i > 0 && !(s.wavelengthA[i] > s.wavelengthA[i - 1])) {
      problems.push(`wavelength not strictly increasing at ${i}`);
      break;
    }
  }
  if (!s.flux.some((v) => Number.isFinite(v))) problems.push('no finite flux');
  if (s.ivar && s.ivar.some((v) => !(v >= 0) || !Number.isFinite(v))) problems.push('ivar negative or not finite');
  let usable = 0;
  for (let i = 0; i < n; i++) if (s.mask[i] === 0 && Number.isFinite(s.flux[i]) && (!s.ivar || s.ivar[i] > 0)) usable++;
  if (usable === 0) problems.push('no usable pixel (finite flux, unmasked, positive ivar)');
  return problems;
}
