/**
 * The Fe II pseudo-continuum shapes near Mg II and H-beta, cut from the SDSS
 * median quasar composite (Vanden Berk et al. 2001, AJ 122, 549, Table 1;
 * src/core/templates/published/qso/). Why this source: it is already in the
 * repository with its citation, it is a real quasar population's spectrum,
 * and it is on the vacuum rest frame; no separate Fe II template with a clear
 * licence is available here.
 *
 * Recipe (this project's, stated so it can be judged):
 * 1. subtract the composite's power law through its two continuum windows
 *    1350-1365 A and 4200-4230 A (Vanden Berk et al. 2001 fitted their
 *    power-law continuum there; from memory);
 * 2. over each band (UV 2200-3090 A, optical 4435-5535 A: the fitting ranges
 *    of Shen et al. 2011, ApJS 194, 45, sec. 3.2, from memory) bridge the
 *    broad lines (Mg II; H-beta, He II 4686, [O III]) by a straight line
 *    between the medians of 10 A on either side;
 * 3. subtract the chord between the band's two end medians (a smooth offset
 *    the local power law absorbs anyway) and clip below zero.
 *
 * Caution: what remains is the composite's pseudo-continuum, mostly Fe II
 * multiplets but also Balmer continuum and weak lines, at the composite's own
 * line width; it is not a pure Fe II template and its width is fixed.
 */
import type { TemplateTable } from '../../templates/build/readTemplateCsv';
import { median } from '../../numeric';

export interface FeBand {
  id: 'uv' | 'optical';
  /** First rest wavelength, Angstrom; the template is sampled every stepA from it. */
  startA: number;
  stepA: number;
  /** Pseudo-continuum flux, in units of the composite's power law at 3000 A (uv) or 5100 A (optical). */
  flux: number[];
}

const PL_WINDOWS_A: readonly [number, number][] = [
  [1350, 1365],
  [4200, 4230],
];

export const FE_BANDS_A = {
  uv: { fromA: 2200, toA: 3090, bridges: [[2700, 2900]] as [number, number][], normA: 3000 },
  optical: {
    fromA: 4435,
    toA: 5535,
    bridges: [
      [4666, 4706],
      [4760, 4975],
      [4990, 5025],
    ] as [number, number][],
    normA: 5100,
  },
} as const;

function windowMedian(t: TemplateTable, fromA: number, toA: number): number {
  const v: number[] = [];
  for (let i = 0; i < t.wavelengthA.length; i++) if (t.wavelengthA[i] >= fromA && t.wavelengthA[i] <= toA) v.push(t.flux[i]);
  if (v.length === 0) throw new Error(`${t.name}: no rows in ${fromA}-${toA} A`);
  return median(v);
}

/** The composite's power law f = a (lambda / 1357.5)^alpha through the two windows' medians. */
export function compositePowerLaw(t: TemplateTable): { a: number; alpha: number; at: (lambdaA: number) => number } {
  const [w1, w2] = PL_WINDOWS_A;
  const x1 = (w1[0] + w1[1]) / 2;
  const x2 = (w2[0] + w2[1]) / 2;
  const f1 = windowMedian(t, w1[0], w1[1]);
  const f2 = windowMedian(t, w2[0], w2[1]);
  const alpha = Math.log(f2 / f1) / Math.log(x2 / x1);
  return { a: f1, alpha, at: (l) => f1 * (l / x1) ** alpha };
}

/** One band of the pseudo-continuum on a 1 A grid (the composite's own bins). */
export function buildFeBand(t: TemplateTable, id: 'uv' | 'optical'): FeBand {
  const band = FE_BANDS_A[id];
  const pl = compositePowerLaw(t);
  const xs: number[] = [];
  const rs: number[] = [];
  for (let i = 0; i < t.wavelengthA.length; i++) {
    const x = t.wavelengthA[i];
    if (x >= band.fromA && x <= band.toA) {
      xs.push(x);
      rs.push(t.flux[i] - pl.at(x));
    }
  }
  const side = (from: number, to: number): number => {
    const v = rs.filter((_, k) => xs[k] >= from && xs[k] <= to);
    return median(v);
  };
  for (const [lo, hi] of band.bridges) {
    const yl = side(lo - 10, lo);
    const yh = side(hi, hi + 10);
    for (let k = 0; k < xs.length; k++) if (xs[k] > lo && xs[k] < hi) rs[k] = yl + ((xs[k] - lo) / (hi - lo)) * (yh - yl);
  }
  const y0 = side(band.fromA, band.fromA + 10);
  const y1 = side(band.toA - 10, band.toA);
  const norm = pl.at(band.normA);
  const flux = rs.map((r, k) => {
    const chord = y0 + ((xs[k] - band.fromA) / (band.toA - band.fromA)) * (y1 - y0);
    return Math.max(0, r - chord) / norm;
  });
  return { id, startA: xs[0], stepA: xs[1] - xs[0], flux };
}
