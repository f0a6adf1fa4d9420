/** Shared shapes for the class models: what each one hands back to the simulator. */
import type { Rng } from './prng';

/** One line the simulator put into a spectrum (truth for line-measurement checks). */
export interface TruthLine {
  id: string;
  kind: 'emission' | 'absorption';
  /** Vacuum rest wavelength, Angstrom. */
  restA: number;
  /** Vacuum observed centre, Angstrom, including any velocity offset of the line. */
  observedA: number;
  /** Velocity offset of this line from the systemic redshift, km/s (negative = blueshift). */
  offsetKms: number;
  /** Intrinsic FWHM, km/s (before the instrument). */
  fwhmKms: number;
  /** Rest-frame equivalent width, Angstrom, positive for emission and for absorption depth. */
  ewRestA: number;
}

export interface ModelContext {
  /** Observed vacuum wavelength of each pixel centre, Angstrom. */
  wl: Float64Array;
  /** Pixel edges, Angstrom (n + 1). */
  edges: Float64Array;
  z: number;
  resolutionR: number;
  rng: Rng;
}

export interface ClassModel {
  /** Noise-free object flux per pixel (arbitrary scale, continuum ~1). */
  flux: Float64Array;
  /** Line-free, absorption-free continuum on the same scale (sets the S/N). */
  continuum: Float64Array;
  lines: TruthLine[];
  /** Sub-type for stars ('A', 'G', 'M'), empty otherwise. */
  subtype: string;
  /** Extra facts worth keeping (e.g. 'd4000', 'alphaNu'). */
  facts: Record<string, number>;
  /** Ly-alpha forest transmission per pixel (quasars only). */
  forest?: Float64Array;
}

/** Rest-frame wavelength of each observed pixel. */
export function restGrid(ctx: ModelContext): Float64Array {
  const r = new Float64Array(ctx.wl.length);
  for (let i = 0; i < r.length; i++) r[i] = ctx.wl[i] / (1 + ctx.z);
  return r;
}

/** Log-normal scatter: value * 10^(N(0, dex)). */
export function scatterDex(rng: Rng, value: number, dex: number): number {
  return value * Math.pow(10, dex * rng.gaussian());
}
