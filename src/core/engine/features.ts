/**
 * Independent features at a solution, from template-line significance: for
 * each line of the family inside the data, the amplitude of its profile
 * (Gaussian of the family's width at the shifted centre) fitted with a local
 * straight-line continuum by weighted least squares; S/N = amplitude / its
 * 1-sigma error (sign: emission up, absorption down). Cheap and linear, so it
 * can run on every spectrum; lines closer than DISTINCT_FEATURE_KMS count once.
 */
import { KMS_PER_PIXEL, C_KMS } from './logGrid';
import { featureHalfWidthPix, type TemplateFamily } from './templates';
import type { ScanData } from './scan';

/** S/N at which a template line counts as detected. */
export const FEATURE_SNR = 3;
/** Lines closer than this (km/s) are one feature (e.g. H-alpha and [N II] 6585). */
export const DISTINCT_FEATURE_KMS = 1500;
/** Fraction of a line's window that must hold good pixels. */
const MIN_GOOD_FRACTION = 0.6;

const FWHM_PER_SIGMA = 2 * Math.sqrt(2 * Math.LN2);

export interface FeatureSignificance {
  id: string;
  observedA: number;
  snr: number;
}

/** S/N of every family line inside the data at redshift z (NaN-free; lines outside are skipped). */
export function lineSignificances(data: ScanData, dlog10: number, family: TemplateFamily, z: number): FeatureSignificance[] {
  const out: FeatureSignificance[] = [];
  const n = data.flux.length;
  const kmsPerPix = (KMS_PER_PIXEL * dlog10) / 1e-4;
  for (const line of family.features) {
    const obsA = line.restA * (1 + z);
    const u = Math.log10(obsA) / dlog10 - data.k0;
    const sigPix = line.fwhmKms / kmsPerPix / FWHM_PER_SIGMA;
    const hw = Math.ceil((featureHalfWidthPix(line.fwhmKms) * 1e-4) / dlog10);
    const i0 = Math.floor(u - hw);
    const i1 = Math.ceil(u + hw);
    if (i0 < 0 || i1 >= n) continue;
    // weighted normal equations for [1, x, g(x)]
    const M = new Float64Array(9);
    const b = new Float64Array(3);
    let good = 0;
    for (let i = i0; i <= i1; i++) {
      const w = data.ivar[i];
      if (!(w > 0)) continue;
      good++;
      const x = (i - u) / hw;
      const g = Math.exp(-0.5 * ((i - u) / sigPix) ** 2);
      const v = [1, x, g];
      for (let a = 0; a < 3; a++) {
        b[a] += w * v[a] * data.flux[i];
        for (let c = 0; c < 3; c++) M[a * 3 + c] += w * v[a] * v[c];
      }
    }
    if (good < MIN_GOOD_FRACTION * (i1 - i0 + 1)) continue;
    const inv = invert3(M);
    if (!inv) continue;
    const amp = inv[6] * b[0] + inv[7] * b[1] + inv[8] * b[2];
    const err = Math.sqrt(inv[8]);
    if (!(err > 0)) continue;
    const snr = (line.kind === 'emission' ? amp : -amp) / err;
    out.push({ id: line.id, observedA: obsA, snr });
  }
  return out;
}

/** Number of independent detected features (S/N >= FEATURE_SNR, merged within DISTINCT_FEATURE_KMS). */
export function countFeatures(sig: FeatureSignificance[]): { n: number; snrs: number[] } {
  const det = sig.filter((s) => s.snr >= FEATURE_SNR).sort((a, b) => b.snr - a.snr);
  const kept: FeatureSignificance[] = [];
  for (const d of det) {
    if (kept.every((k) => Math.abs(C_KMS * Math.log(d.observedA / k.observedA)) > DISTINCT_FEATURE_KMS)) kept.push(d);
  }
  return { n: kept.length, snrs: kept.map((k) => k.snr) };
}

function invert3(m: Float64Array): Float64Array | null {
  const [a, b, c, d, e, f, g, h, i] = m;
  const A = e * i - f * h;
  const B = -(d * i - f * g);
  const C = d * h - e * g;
  const det = a * A + b * B + c * C;
  if (!(Math.abs(det) > 1e-300)) return null;
  const r = 1 / det;
  return Float64Array.from([
    A * r, -(b * i - c * h) * r, (b * f - c * e) * r,
    B * r, (a * i - c * g) * r, -(a * f - c * d) * r,
    C * r, -(a * h - b * g) * r, (a * e - b * d) * r,
  ]);
}
