/**
 * Shared helpers for the line-measurement tests: a seeded random number
 * generator, synthetic spectra on a log-lambda grid, and a tiny CSV parser for
 * the one real spectrum kept in test/data/lines.
 */
import type { Spectrum } from '../../../../src/core/types';
import { mulberry32 } from '../../../../src/core/sim/prng';

/** Speed of light, km/s (exact, SI definition). */
export const C_KMS = 299792.458;

/** A small seeded generator, uniform in [0, 1): the simulator's mulberry32. */
export const seededUniform = mulberry32;

/** Standard normal deviates by the Box-Muller transform (Box & Muller 1958, Ann. Math. Stat. 29, 610). */
export function seededNormal(seed: number): () => number {
  const u = seededUniform(seed);
  return () => {
    const u1 = Math.max(u(), 1e-300);
    return Math.sqrt(-2 * Math.log(u1)) * Math.cos(2 * Math.PI * u());
  };
}

export interface SynthLine {
  /** Observed centre, Angstrom. */
  centreA: number;
  /** Integrated flux, flux unit * Angstrom (negative for absorption). */
  flux: number;
  /** Velocity FWHM, km/s. */
  fwhmKms: number;
}

export interface SynthOptions {
  lambdaMinA: number;
  lambdaMaxA: number;
  /** Grid step in log10(lambda); 1e-4 = 69 km/s per pixel. */
  dlog10?: number;
  /** Continuum (flux unit) as a function of wavelength. */
  continuum: (lambdaA: number) => number;
  lines: SynthLine[];
  /** Gaussian noise sigma per pixel, flux unit. */
  noise: number;
  seed: number;
  /** Leave ivar null (no uncertainty in the file). */
  noIvar?: boolean;
}

/** Gaussian lines sampled at pixel centres on a continuum, plus seeded Gaussian noise. */
export function synthSpectrum(o: SynthOptions): Spectrum {
  const d = o.dlog10 ?? 1e-4;
  const n = Math.floor(Math.log10(o.lambdaMaxA / o.lambdaMinA) / d) + 1;
  const wl = new Float64Array(n);
  const flux = new Float64Array(n);
  const rnd = seededNormal(o.seed);
  for (let i = 0; i < n; i++) {
    const lam = o.lambdaMinA * 10 ** (i * d);
    wl[i] = lam;
    let f = o.continuum(lam);
    for (const l of o.lines) {
      const sigmaA = (l.fwhmKms / C_KMS) * l.centreA / (2 * Math.sqrt(2 * Math.LN2));
      const t = (lam - l.centreA) / sigmaA;
      f += (l.flux / (sigmaA * Math.sqrt(2 * Math.PI))) * Math.exp(-0.5 * t * t);
    }
    flux[i] = f + o.noise * rnd();
  }
  return {
    file: 'synthetic', format: 'test', wavelengthA: wl, flux,
    ivar: o.noIvar ? null : new Float64Array(n).fill(1 / (o.noise * o.noise)),
    mask: new Uint8Array(n), meta: {},
  };
}

/** Parse 'wavelength_vacuum_angstrom,flux,ivar' text; ivar = 0 marks a bad pixel. */
export function parseSimpleCsv(text: string, file: string): Spectrum {
  const rows = text.trim().split(/\r?\n/).slice(1).map((r) => r.split(',').map(Number));
  const wl = Float64Array.from(rows, (r) => r[0]);
  const flux = Float64Array.from(rows, (r) => r[1]);
  const ivar = Float64Array.from(rows, (r) => r[2]);
  const mask = Uint8Array.from(rows, (r) => (r[2] > 0 ? 0 : 1));
  return { file, format: 'csv-test', wavelengthA: wl, flux, ivar, mask, meta: { fluxUnit: '1e-17 erg/s/cm2/A' } };
}

export function mean(a: readonly number[]): number {
  return a.reduce((s, v) => s + v, 0) / a.length;
}
export function std(a: readonly number[]): number {
  const m = mean(a);
  return Math.sqrt(a.reduce((s, v) => s + (v - m) ** 2, 0) / (a.length - 1));
}
