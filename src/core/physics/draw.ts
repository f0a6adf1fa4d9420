/** What the plot needs from a measurement: the broad-line fits as flux on the spectrum's grid, and the troughs as observed ranges to shade or mask. */
import { C_KMS } from '../constants';
import { continuumAt } from './continuum';
import type { QuasarMeasurement } from './types';

/**
 * Continuum + line model of every fitted broad line at observed wavelengths
 * (Angstrom), NaN outside the lines' fitted ranges; `broadOnly` leaves out the
 * narrow lines.
 */
export function physicsModelAt(m: QuasarMeasurement, observedA: ArrayLike<number>, broadOnly = false): Float64Array {
  const out = new Float64Array(observedA.length).fill(NaN);
  for (const l of m.lines) {
    if (!l.ok || !l.gaussians || !l.continuum || !l.rangeA) continue;
    for (let i = 0; i < observedA.length; i++) {
      const r = observedA[i] / (1 + m.z);
      if (r < l.rangeA[0] || r > l.rangeA[1]) continue;
      let f = continuumAt(l.continuum, r);
      for (const g of l.gaussians) {
        if (broadOnly && !g.broad) continue;
        const t = (C_KMS * Math.log(r / g.restA) - g.velKms) / g.sigmaKms;
        f += g.amp * Math.exp(-0.5 * t * t);
      }
      out[i] = f;
    }
  }
  return out;
}

/** The troughs as observed-frame ranges, Angstrom (for shading, and for masking on request). */
export function troughMaskRangesA(m: QuasarMeasurement): [number, number][] {
  return m.absorption.troughs.map((t) => [t.restFromA * (1 + m.z), t.restToA * (1 + m.z)]);
}
