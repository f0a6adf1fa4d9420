/**
 * Over 400 lines on purpose: one recipe per family (quasar, galaxy, star) and
 * the few helpers they share, so every choice made about a published spectrum
 * is read in one place.
 *
 * How each template family is built from the published spectra in
 * src/core/templates/published/ (citations in its README.md and INDEX.csv).
 * Pure functions of the tables, so a test can rebuild a family with one
 * source spectrum held out and fit spectra made from that spectrum.
 */
import type { SpectrumClass } from '../../types';
import { C_KMS, KMS_PER_PIXEL, DLOG10, pixelOfWavelength } from '../../engine/logGrid';
import { LYMAN_LIMIT_A, restWavelengthA } from '../../lines/catalogue';
import { eigenspectra } from './eigenspectra';
import type { TemplateTable } from './readTemplateCsv';
import { broadenLog, interpolateGaps, toLogGrid } from './toLogGrid';

export interface BasisVectorData {
  id: string;
  values: Float64Array;
  /** Amplitude kept >= 0 in fits (emission lines); eigenspectra are signed. */
  nonNegative: boolean;
  /** An eigenspectrum (its family's shape freedom is counted as eigenDims, classify.ts). */
  eigen?: boolean;
}

export interface FamilyBasis {
  id: string;
  class: SpectrumClass;
  zMin: number;
  zMax: number;
  /** Absolute log-grid pixel of values[0] of every vector. */
  kStart: number;
  vectors: BasisVectorData[];
  /** The fast scan's vectors as combinations of the full ones: weights by vector id. */
  scan: { id: string; weights: Record<string, number> }[];
  /** Provenance for the README and exports. */
  sources: string[];
  /** Fraction of the library's sum of squares the eigenspectra hold (1 when not eigenspectra). */
  heldFraction: number;
  /** Each eigenspectrum's fraction of that sum of squares (empty when not eigenspectra). */
  eigenFractions?: number[];
  /**
   * The library's effective shape dimension: eigenspectra needed to hold
   * EIGEN_DIMS_FRACTION of its sum of squares. The higher ones stay in the
   * model (fine detail for z) but are not charged as free parameters.
   */
  eigenDims?: number;
  /** The continuum polynomial acts only at rest wavelengths >= this, Angstrom (absent: everywhere). */
  polynomialFromA?: number;
}

/** The log-grid pixel nearest a wavelength, Angstrom. */
const kOf = (lambdaA: number) => Math.round(pixelOfWavelength(lambdaA));

/** See FamilyBasis.eigenDims: 99 % (the first eigenspectra of a library are its real dimensions, e.g. temperature and gravity for stars). */
export const EIGEN_DIMS_FRACTION = 0.99;
function eigenDimsOf(fractions: number[]): number {
  let c = 0;
  for (let k = 0; k < fractions.length; k++) {
    c += fractions[k];
    if (c >= EIGEN_DIMS_FRACTION) return k + 1;
  }
  return fractions.length;
}

/** Stars: radial velocities within +-1000 km/s (docs/reference.md sec. 6 gives |v| < ~300-500 km/s; a margin added). */
export const STAR_VMAX_KMS = 1000;
/**
 * Galaxies start just beyond the stellar range: at |cz| < 1000 km/s an
 * absorption spectrum cannot be told from a star by z, and fibre surveys of
 * compact candidates rarely target such nearby galaxies (common practice,
 * stated as a prior).
 */
export const GALAXY_Z_MIN = STAR_VMAX_KMS / C_KMS;

// ------------------------------------------------------------------ stars

/** Stellar eigenspectra kept: Pickles spectra are R ~ 500, coarser than survey data, so keep many (14 hold > 99.9 % of the library's sum of squares). */
export const STAR_EIGEN = 14;
/**
 * Of those, the fast scan uses the first few (it only has to find the velocity
 * within +-1000 km/s); every candidate is then scored with all. Fewer cost
 * stars: with 3, 93.0 % of simulated stars came out right against 96.0 % with
 * 4 (npm run evaluate, 2026-12-03; 2 gave 92.5 %).
 */
export const STAR_SCAN_EIGEN = 4;

export function buildStarFamily(stars: TemplateTable[]): FamilyBasis {
  const kLo = kOf(3000);
  const kHi = kOf(11000);
  const spectra = stars.map((t) => normaliseMean(extendEnds(toLogGrid(t.wavelengthA, t.flux, kLo, kHi))));
  const eig = eigenspectra(spectra, STAR_EIGEN);
  const n = kHi - kLo + 1;
  // Chromospheric Balmer emission of active M dwarfs (flatter decrement than
  // nebular case B; relative strengths typical, from memory): without it an
  // active star's H-alpha is best explained as a galaxy's [O II].
  const active = emissionLines(n, kLo, [['Halpha', 1], ['Hbeta', 0.6], ['Hgam', 0.4], ['Hdel', 0.3]].map(([id, f]) => [restWavelengthA(id as string), f as number]), NEBULAR_FWHM_KMS);
  return {
    id: 'star',
    class: 'star',
    zMin: -STAR_VMAX_KMS / C_KMS,
    zMax: STAR_VMAX_KMS / C_KMS,
    kStart: kLo,
    vectors: [...eig.vectors.map((v, i) => ({ id: `star eigen ${i + 1}`, values: v, nonNegative: false, eigen: true })), { id: 'Balmer emission', values: active, nonNegative: true }],
    scan: eig.vectors.slice(0, STAR_SCAN_EIGEN).map((_, i) => ({ id: `star eigen ${i + 1}`, weights: { [`star eigen ${i + 1}`]: 1 } })),
    sources: stars.map((t) => t.name),
    heldFraction: eig.fractions.reduce((a, b) => a + b, 0),
    eigenFractions: eig.fractions,
    eigenDims: eigenDimsOf(eig.fractions),
  };
}

// ------------------------------------------------------------------ galaxies

/**
 * Kinney-Calzetti templates carry their own velocity zero points: mean offsets
 * of their features from vacuum laboratory wavelengths, Angstrom near 5000 A
 * (published/README.md, "Caveats"). Removed before use.
 */
export const KC_OFFSETS_A: Readonly<Record<string, number>> = {
  kc96_elliptical: 0.6, kc96_bulge: -1.6, kc96_s0: 3.5, kc96_sa: -1.0, kc96_sb: 2.6, kc96_sc: 0.4,
  kc96_starb1: 1.9, kc96_starb2: 0.1, kc96_starb3: -2.9, kc96_starb4: 0.9, kc96_starb5: -0.3, kc96_starb6: 2.0,
};
const KC_OFFSET_REF_A = 5000;

/** Kinney-Calzetti templates with nebular emission: their lines are cut out (the emission vectors below carry lines at exact wavelengths). */
const KC_WITH_EMISSION = new Set(['kc96_sa', 'kc96_sb', 'kc96_sc', 'kc96_starb1', 'kc96_starb2', 'kc96_starb3', 'kc96_starb4', 'kc96_starb5', 'kc96_starb6']);
/** Nebular lines cut from those templates (vacuum A); +-EMISSION_CUT_A around each (KC resolution ~10 A FWHM). */
const NEBULAR_A = [1215.67, 3727.09, 3729.88, 3869.86, 3971.2, 4102.89, 4341.68, 4862.68, 4960.3, 5008.24, 5877.25, 6302.05, 6549.86, 6564.61, 6585.27, 6718.29, 6732.67, 9071.1, 9533.2];
const EMISSION_CUT_A = 15;

/**
 * BC03 model spectra (about 3 A resolution, from memory) are broadened to a
 * Gaussian sigma of 150 km/s in all: a typical galaxy velocity dispersion
 * combined with a fibre spectrograph's resolution (common practice).
 */
const BC03_EXTRA_SIGMA_KMS = Math.sqrt(150 ** 2 - 76 ** 2);

/** Continuum eigenspectra kept for galaxies (5 hold > 99.99 % of the library's sum of squares), and those the scan uses (3 hold 99.95 %). */
export const GALAXY_EIGEN = 5;
export const GALAXY_SCAN_EIGEN = 3;

/** Nebular line FWHM, km/s: ~150 km/s intrinsic with a resolution near 2000 (common practice for fibre spectra). */
const NEBULAR_FWHM_KMS = 250;
/** Wide nebular lines: a resolving power near 500, or outflows (the Kinney-Calzetti lines are ~10 A, 600 km/s, wide). */
const WIDE_NEBULAR_FWHM_KMS = 700;

export function buildGalaxyFamily(galaxies: TemplateTable[]): FamilyBasis {
  const kLo = kOf(1250);
  const kHi = kOf(10500);
  const filler = galaxies.find((t) => t.name.includes('4.75gyr')) ?? galaxies.find((t) => t.name.startsWith('bc03'));
  const fillerGrid = filler ? interpolateGaps(toLogGrid(filler.wavelengthA, filler.flux, kLo, kHi)) : null;
  const spectra = galaxies.map((t) => {
    let wl = t.wavelengthA;
    const off = KC_OFFSETS_A[t.name];
    if (off !== undefined) wl = wl.map((w) => w / (1 + off / KC_OFFSET_REF_A));
    let v = toLogGrid(wl, t.flux, kLo, kHi);
    if (KC_WITH_EMISSION.has(t.name)) v = cutLines(v, kLo, NEBULAR_A, EMISSION_CUT_A);
    if (t.name.startsWith('bc03')) v = broadenLog(v, BC03_EXTRA_SIGMA_KMS / KMS_PER_PIXEL);
    v = interpolateGaps(v);
    if (fillerGrid) v = extendWith(v, fillerGrid);
    return normaliseMean(extendEnds(v), kOf(4000) - kLo, kOf(7000) - kLo);
  });
  const eig = eigenspectra(spectra, GALAXY_EIGEN);
  const n = kHi - kLo + 1;
  const line = (ids: [string, number][], fwhmKms = NEBULAR_FWHM_KMS): Float64Array => emissionLines(n, kLo, ids.map(([id, f]) => [restWavelengthA(id), f]), fwhmKms);
  // Line ratios inside a group: [O III] 5008/4960 = 2.98 and [N II] 6585/6550 = 3.05
  // (Storey & Zeippen 2000, MNRAS 312, 813); Balmer decrement of case B,
  // Ha/Hb = 2.86 (Osterbrock & Ferland 2006, from memory); [S II] and [O I]
  // typical of H II regions (from memory).
  // Two non-negative vectors span a cone: any mix of them has a ratio between
  // theirs, so a ratio can vary within its physical range and no further.
  // [O II] 3730/3727 runs from 0.35 (dense gas) to 1.5 (the low-density limit),
  // H-alpha/H-beta from case B (2.86) to a dust-reddened 6 (Osterbrock &
  // Ferland 2006, from memory; H-gamma and H-delta follow the same reddening, roughly).
  const emission: BasisVectorData[] = [
    { id: '[O II] dense', values: line([['OII_3727', 1], ['OII_3730', 0.35]]), nonNegative: true },
    { id: '[O II] low density', values: line([['OII_3727', 1], ['OII_3730', 1.5]]), nonNegative: true },
    { id: 'Balmer case B', values: line([['Halpha', 2.86], ['Hbeta', 1], ['Hgam', 0.47], ['Hdel', 0.26], ['Heps', 0.16]]), nonNegative: true },
    { id: 'Balmer reddened', values: line([['Halpha', 6], ['Hbeta', 1], ['Hgam', 0.38], ['Hdel', 0.18], ['Heps', 0.1]]), nonNegative: true },
    { id: '[O III]', values: line([['OIII_5008', 2.98], ['OIII_4960', 1], ['NeIII', 0.3]]), nonNegative: true },
    { id: '[N II]+[S II]', values: line([['NII_6585', 3.05], ['NII_6550', 1], ['SII_6718', 1.2], ['SII_6733', 0.9], ['OI_6302', 0.2]]), nonNegative: true },
    // The same groups at WIDE_NEBULAR_FWHM_KMS: lines seen at low resolution or
    // broadened by outflows, which the quasar family's broad lines (thousands of
    // km/s) must not be the only vectors to absorb.
    { id: '[O II] wide', values: line([['OII_3727', 1], ['OII_3730', 1]], WIDE_NEBULAR_FWHM_KMS), nonNegative: true },
    { id: 'Balmer wide', values: line([['Halpha', 2.86], ['Hbeta', 1], ['Hgam', 0.47], ['Hdel', 0.26], ['Heps', 0.16]], WIDE_NEBULAR_FWHM_KMS), nonNegative: true },
    { id: '[O III] wide', values: line([['OIII_5008', 2.98], ['OIII_4960', 1], ['NeIII', 0.3]], WIDE_NEBULAR_FWHM_KMS), nonNegative: true },
    { id: '[N II]+[S II] wide', values: line([['NII_6585', 3.05], ['NII_6550', 1], ['SII_6718', 1.2], ['SII_6733', 0.9]], WIDE_NEBULAR_FWHM_KMS), nonNegative: true },
  ];
  const eigenIds = eig.vectors.map((_, i) => `galaxy eigen ${i + 1}`);
  return {
    id: 'galaxy',
    class: 'galaxy',
    zMin: GALAXY_Z_MIN,
    zMax: 1.6,
    kStart: kLo,
    vectors: [...eig.vectors.map((v, i) => ({ id: eigenIds[i], values: v, nonNegative: false, eigen: true })), ...emission],
    scan: [
      ...eigenIds.slice(0, GALAXY_SCAN_EIGEN).map((id) => ({ id, weights: { [id]: 1 } })),
      // One nebular vector at typical strengths, [O II] at a ratio of 1.4 (3730/3727 ~ 1.4 at low density, from memory).
      { id: 'nebular', weights: { '[O II] low density': 1, 'Balmer case B': 1, '[O III]': 0.5, '[N II]+[S II]': 0.5 } },
    ],
    sources: galaxies.map((t) => t.name),
    heldFraction: eig.fractions.reduce((a, b) => a + b, 0),
    eigenFractions: eig.fractions,
    eigenDims: eigenDimsOf(eig.fractions),
  };
}

// ------------------------------------------------------------------ quasars

/**
 * Broad-line groups of the quasar family, rest windows in Angstrom: each
 * group's emission above the composite's continuum gets its own amplitude,
 * since line strengths vary from quasar to quasar while their positions do not.
 */
const QSO_GROUPS: { id: string; fromA: number; toA: number }[] = [
  { id: 'Ly-alpha + N V', fromA: 1160, toA: 1300 },
  { id: 'Si IV', fromA: 1360, toA: 1440 },
  { id: 'C IV + He II', fromA: 1470, toA: 1700 },
  { id: 'C III]', fromA: 1840, toA: 1975 },
  { id: 'Mg II', fromA: 2680, toA: 2920 },
  { id: 'H-beta + [O III]', fromA: 4700, toA: 5060 },
  { id: 'H-alpha', fromA: 6380, toA: 6760 },
];
/** Lyman-alpha, Angstrom (catalogue): blueward the forest absorbs. */
const LYA_A = restWavelengthA('LyA');
/** Stitch point of the two composites (Vanden Berk below: it reaches 800 A; Selsing above: little host light). */
const STITCH_A = 2600;

/**
 * Either composite may be left out (held-out tests): the other then serves the
 * whole range. `galaxy`: the galaxy family, whose first two eigenspectra
 * (host starlight, faded in over 2500-3500 A where a quasar outshines its
 * host) and narrow nebular groups the quasar family borrows: a low-redshift
 * broad-line AGN is a galaxy spectrum plus broad lines (Vanden Berk et al.
 * 2001 see the host in their composite), and without them such objects are
 * fitted better by the galaxy family. The comparison (classify.ts) charges
 * every borrowed vector in use, so a galaxy without broad lines stays a galaxy.
 */
export function buildQsoFamily(vandenBerkIn: TemplateTable | null, selsingIn: TemplateTable | null, galaxy?: FamilyBasis): FamilyBasis {
  const kLo = kOf(800);
  const kHi = kOf(11000);
  const n = kHi - kLo + 1;
  const vandenBerk = vandenBerkIn ?? selsingIn;
  const selsing = selsingIn ?? vandenBerkIn;
  if (!vandenBerk || !selsing) throw new Error('the quasar family needs at least one composite');
  const vdb = extendEnds(interpolateGaps(toLogGrid(vandenBerk.wavelengthA, vandenBerk.flux, kLo, kHi)));
  const sel = extendEnds(interpolateGaps(toLogGrid(selsing.wavelengthA, selsing.flux, kLo, kHi)));
  const kS = kOf(STITCH_A) - kLo;
  // scale Selsing to Vanden Berk over 2500-2700 A (ratio of sums)
  let a = 0;
  let b = 0;
  for (let j = kOf(2500) - kLo; j <= kOf(2700) - kLo; j++) {
    a += vdb[j];
    b += sel[j];
  }
  const mean = new Float64Array(n);
  for (let j = 0; j < n; j++) mean[j] = j < kS ? vdb[j] : (sel[j] * a) / b;
  const composite = normaliseMean(extendEnds(interpolateGaps(mean)));
  const continuum = lowerEnvelope(composite, 150, 50);
  const lines = composite.map((v, j) => v - continuum[j]);
  // Lines can be stronger than the composite's, never absent or inverted: a
  // quasar is defined by its broad lines (docs/reference.md sec. 6), and a
  // signed line amplitude would let the family cancel them and fit any
  // break-like continuum (a galaxy's 4000 A break as the forest edge).
  const groups: BasisVectorData[] = QSO_GROUPS.map((g) => ({ id: g.id, values: windowed(lines, kLo, g.fromA, g.toA), nonNegative: true }));
  const civ = groups[2].values;
  // A velocity shift of the C IV group to first order: v/c * dL/dln(lambda) (high-ionisation lines
  // are blueshifted by 0 to > 2000 km/s, Richards et al. 2002, AJ 124, 1).
  const civShift = new Float64Array(n);
  for (let j = 1; j < n - 1; j++) civShift[j] = (civ[j + 1] - civ[j - 1]) / 2;
  // Forest absorption: the composite blueward of Ly-alpha taken away (amplitude >= 0), so the
  // mean transmission of any redshift is reachable but flux is never added there.
  const forest = composite.map((v, j) => (Math.pow(10, (kLo + j) * DLOG10) < LYA_A ? -v : 0));
  const groupIds = QSO_GROUPS.map((g) => g.id);
  // Light below the Lyman limit when no optically thick system blocks it: the
  // composite's continuum level at 1000-1100 A carried on as f_lambda ~ lambda^-1.56
  // (Vanden Berk et al. 2001; docs/reference.md sec. 6), amplitude >= 0.
  let level = 0;
  let count = 0;
  for (let j = kOf(1000) - kLo; j <= kOf(1100) - kLo; j++) {
    level += continuum[j];
    count++;
  }
  level /= count;
  const leak = composite.map((_, j) => {
    const lam = Math.pow(10, (kLo + j) * DLOG10);
    return lam < LYMAN_LIMIT_A ? level * Math.pow(lam / 1000, -1.56) : 0;
  });
  const borrowed: BasisVectorData[] = [];
  if (galaxy) {
    const onQsoGrid = (v: Float64Array, fade: boolean) => {
      const out = new Float64Array(n);
      for (let j = 0; j < n; j++) {
        const h = v[kLo + j - galaxy.kStart];
        if (h === undefined) continue;
        const lam = Math.pow(10, (kLo + j) * DLOG10);
        out[j] = fade ? h * Math.min(1, Math.max(0, (lam - 2500) / 1000)) : h;
      }
      return out;
    };
    const eig = galaxy.vectors.filter((v) => v.eigen);
    borrowed.push({ id: 'host eigen 1', values: onQsoGrid(eig[0].values, true), nonNegative: true });
    borrowed.push({ id: 'host eigen 2', values: onQsoGrid(eig[1].values, true), nonNegative: false });
    for (const id of ['[O II] low density', 'Balmer case B', '[O III]', '[N II]+[S II]']) {
      const v = galaxy.vectors.find((x) => x.id === id);
      if (v) borrowed.push({ id: `narrow ${id}`, values: onQsoGrid(v.values, false), nonNegative: true });
    }
  }
  return {
    id: 'qso',
    class: 'qso',
    zMin: 0,
    zMax: 6.5,
    kStart: kLo,
    vectors: [
      { id: 'composite', values: composite, nonNegative: true },
      { id: 'forest absorption', values: forest, nonNegative: true },
      ...groups,
      { id: 'C IV shift', values: civShift, nonNegative: false },
      { id: 'Lyman continuum leak', values: leak, nonNegative: true },
      ...borrowed,
    ],
    scan: [
      { id: 'composite', weights: { composite: 1 } },
      { id: 'forest absorption', weights: { 'forest absorption': 1 } },
      { id: 'broad lines', weights: Object.fromEntries(groupIds.map((id) => [id, 1])) },
    ],
    sources: [...new Set([vandenBerk.name, selsing.name])],
    heldFraction: 1,
    // Below the Lyman limit a quasar's own light is absorbed by any optically thick
    // system on the way (the composite keeps what little comes through): no free continuum there.
    polynomialFromA: LYMAN_LIMIT_A,
  };
}

// ------------------------------------------------------------------ helpers

/** Fill NaN ends with the nearest finite value (tables that stop short of the grid). */
function extendEnds(v: Float64Array): Float64Array {
  const out = Float64Array.from(v);
  let a = 0;
  while (a < out.length && !Number.isFinite(out[a])) a++;
  let b = out.length - 1;
  while (b >= 0 && !Number.isFinite(out[b])) b--;
  if (a > b) throw new Error('template has no finite value on the grid');
  for (let j = 0; j < a; j++) out[j] = out[a];
  for (let j = b + 1; j < out.length; j++) out[j] = out[b];
  return out;
}

/** Where v is NaN beyond its last finite pixel, continue with `shape` scaled to v's mean over the last 200 finite pixels. */
function extendWith(v: Float64Array, shape: Float64Array): Float64Array {
  let b = v.length - 1;
  while (b >= 0 && !Number.isFinite(v[b])) b--;
  if (b === v.length - 1 || b < 200) return v;
  let sv = 0;
  let ss = 0;
  for (let j = b - 199; j <= b; j++) {
    sv += v[j];
    ss += shape[j];
  }
  const out = Float64Array.from(v);
  for (let j = b + 1; j < v.length; j++) out[j] = (shape[j] * sv) / ss;
  return out;
}

/** Divide by the mean over [from, to] (default: all). */
function normaliseMean(v: Float64Array, from = 0, to = v.length - 1): Float64Array {
  let s = 0;
  for (let j = from; j <= to; j++) s += v[j];
  const m = s / (to - from + 1);
  return v.map((x) => x / m);
}

/** Set NaN within +-halfA of each line (then interpolated over by the caller). */
function cutLines(v: Float64Array, kLo: number, linesA: number[], halfA: number): Float64Array {
  const out = Float64Array.from(v);
  for (const c of linesA) {
    const a = kOf(c - halfA) - kLo;
    const b = kOf(c + halfA) - kLo;
    for (let j = Math.max(0, a); j <= Math.min(out.length - 1, b); j++) out[j] = NaN;
  }
  return out;
}

/** Smooth lower envelope: running 25th percentile over +-half pixels, then a running mean over +-smooth. */
function lowerEnvelope(v: Float64Array, half: number, smooth: number): Float64Array {
  const n = v.length;
  const pct = new Float64Array(n);
  const buf: number[] = [];
  for (let j = 0; j < n; j++) {
    buf.length = 0;
    for (let i = Math.max(0, j - half); i <= Math.min(n - 1, j + half); i++) buf.push(v[i]);
    buf.sort((x, y) => x - y);
    pct[j] = buf[Math.floor(0.25 * (buf.length - 1))];
  }
  const out = new Float64Array(n);
  for (let j = 0; j < n; j++) {
    let s = 0;
    let c = 0;
    for (let i = Math.max(0, j - smooth); i <= Math.min(n - 1, j + smooth); i++) {
      s += pct[i];
      c++;
    }
    out[j] = s / c;
  }
  return out;
}

/** v inside [fromA, toA], with 10-pixel cosine tapers at both ends so the window adds no edge of its own. */
function windowed(v: Float64Array, kLo: number, fromA: number, toA: number): Float64Array {
  const a = kOf(fromA) - kLo;
  const b = kOf(toA) - kLo;
  const taper = 10;
  const out = new Float64Array(v.length);
  for (let j = Math.max(0, a); j <= Math.min(v.length - 1, b); j++) {
    const d = Math.min(j - a, b - j);
    const w = d >= taper ? 1 : 0.5 - 0.5 * Math.cos((Math.PI * d) / taper);
    out[j] = v[j] * w;
  }
  return out;
}

/** Gaussian emission lines of one FWHM (km/s), unit peak for the strongest, on the grid. */
function emissionLines(n: number, kLo: number, lines: [number, number][], fwhmKms: number): Float64Array {
  const out = new Float64Array(n);
  const sigmaPix = fwhmKms / (2 * Math.sqrt(2 * Math.LN2)) / KMS_PER_PIXEL;
  for (const [restA, flux] of lines) {
    const kc = Math.log10(restA) / DLOG10 - kLo;
    for (let j = Math.max(0, Math.floor(kc - 6 * sigmaPix)); j <= Math.min(n - 1, Math.ceil(kc + 6 * sigmaPix)); j++) {
      out[j] += flux * Math.exp(-0.5 * ((j - kc) / sigmaPix) ** 2);
    }
  }
  let m = 0;
  for (const x of out) m = Math.max(m, x);
  return out.map((x) => x / m);
}
