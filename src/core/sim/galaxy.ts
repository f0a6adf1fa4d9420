/**
 * Galaxy models: star-forming (blue continuum, narrow nebular lines with
 * random ratios) and passive (red continuum, 4000 A break, absorption lines).
 */
import { addGaussian, observedSigmaA, FWHM_PER_SIGMA } from './profiles';
import { restGrid, scatterDex, type ClassModel, type ModelContext, type TruthLine } from './model';

/** Planck shape B_lambda(T) up to a constant; hc/k = 1.438777e8 A K (CODATA, from memory). */
export function planckShape(lambdaA: number, tempK: number): number {
  const x = 1.438777e8 / (lambdaA * tempK);
  return Math.pow(lambdaA / 5000, -5) / Math.expm1(x);
}

/** Multiplier for a 4000 A break: 1/strength blueward of ~3970 A, 1 redward of ~4030 A (rest). */
function breakStep(lr: number, strength: number): number {
  const t = 1 / (1 + Math.exp(-(lr - 4000) / 8));
  return 1 / strength + (1 - 1 / strength) * t;
}

/**
 * D4000 of a rest-frame continuum: mean f_nu in 4050-4250 A over mean f_nu in
 * 3750-3950 A (Bruzual 1983, ApJ 273, 105). f_nu ~ f_lambda lambda^2.
 */
export function d4000Of(fLambda: (lr: number) => number): number {
  let red = 0;
  let blue = 0;
  for (let l = 4050.5; l < 4250; l += 1) red += fLambda(l) * l * l;
  for (let l = 3750.5; l < 3950; l += 1) blue += fLambda(l) * l * l;
  return red / blue;
}

interface Absorber {
  id: string;
  restA: number;
  ew: number;
  /** Intrinsic FWHM, km/s. */
  fwhm: number;
}

/** Put absorption lines into flux (as EW times a unit profile, floor at 2% of the continuum). */
function applyAbsorbers(ctx: ModelContext, flux: Float64Array, list: Absorber[], lines: TruthLine[]) {
  const depth = new Float64Array(flux.length);
  for (const a of list) {
    const obs = a.restA * (1 + ctx.z);
    addGaussian(depth, ctx.edges, obs, observedSigmaA(obs, a.fwhm, ctx.resolutionR), a.ew * (1 + ctx.z));
    lines.push({ id: a.id, kind: 'absorption', restA: a.restA, observedA: obs, offsetKms: 0, fwhmKms: a.fwhm, ewRestA: a.ew });
  }
  for (let i = 0; i < flux.length; i++) flux[i] *= Math.max(0.02, 1 - depth[i]);
}

function addEmission(ctx: ModelContext, flux: Float64Array, lines: TruthLine[], id: string, restA: number, lineFlux: number, fwhm: number, contAtLine: number) {
  const obs = restA * (1 + ctx.z);
  addGaussian(flux, ctx.edges, obs, observedSigmaA(obs, fwhm, ctx.resolutionR), lineFlux);
  lines.push({ id, kind: 'emission', restA, observedA: obs, offsetKms: 0, fwhmKms: fwhm, ewRestA: lineFlux / (1 + ctx.z) / contAtLine });
}

/** Star-forming galaxy. Line wavelengths: vacuum, docs/reference.md sec. 1 (SDSS line table). */
export function starFormingModel(ctx: ModelContext): ClassModel {
  const { rng, z } = ctx;
  const n = ctx.wl.length;
  const rest = restGrid(ctx);
  // Blue continuum: f_lambda ~ lambda^beta with beta -2 .. -0.3 (a young population, by eye),
  // with a weak 4000 A break (D4000 ~ 1.0-1.35; star-forming galaxies sit below ~1.5,
  // Kauffmann et al. 2003, MNRAS 341, 33).
  const beta = rng.uniform(-2, -0.3);
  const brk = rng.uniform(1.0, 1.35);
  const cont = (lr: number) => Math.pow(lr / 5000, beta) * breakStep(lr, brk);
  const continuum = new Float64Array(n);
  for (let i = 0; i < n; i++) continuum[i] = cont(rest[i]);
  const flux = Float64Array.from(continuum);
  const lines: TruthLine[] = [];

  // Stellar Balmer absorption under the emission (EW 1-4 A, broad wings; by eye).
  const balAbs = rng.uniform(1, 4);
  applyAbsorbers(ctx, flux, [
    { id: 'Hdel_abs', restA: 4102.89, ew: balAbs, fwhm: 1500 },
    { id: 'Hgam_abs', restA: 4341.68, ew: balAbs, fwhm: 1500 },
    { id: 'Hbeta_abs', restA: 4862.68, ew: balAbs * 0.9, fwhm: 1500 },
  ], lines);

  // Line strengths: H-alpha rest EW 10-150 A (log-uniform); Balmer decrement
  // H-alpha/H-beta from 2.86 (Case B, Osterbrock & Ferland 2006) to ~5 (dust);
  // H-gamma/H-beta 0.47, H-delta/H-beta 0.26 (Case B, same source, from memory).
  const fwhm = rng.uniform(50, 300);
  const ewHa = rng.logUniform(10, 150);
  const fHa = ewHa * (1 + z) * cont(6564.61);
  const fHb = fHa / rng.uniform(2.86, 5);
  // Position t along the star-forming sequence: high-excitation ([O III] strong,
  // [N II] weak) to metal-rich (the reverse) — Baldwin, Phillips & Terlevich 1981, PASP 93, 5.
  const t = rng.next();
  const o3hb = Math.pow(10, 0.75 - 1.4 * t + 0.15 * rng.gaussian());
  const n2ha = Math.pow(10, -1.5 + 1.1 * t + 0.1 * rng.gaussian());
  const s2ha = rng.uniform(0.1, 0.4);
  const s2ratio = rng.uniform(0.7, 1.4); // [S II] 6733/6718, density-sensitive (Osterbrock & Ferland 2006)
  const o2hb = rng.uniform(0.5, 4);
  const o2ratio = rng.uniform(0.7, 1.45); // [O II] 3729/3727, density-sensitive (same source)
  const ne3o2 = rng.uniform(0.03, 0.3);
  const c = (l: number) => cont(l);
  addEmission(ctx, flux, lines, 'Halpha', 6564.61, fHa, fwhm, c(6564.61));
  addEmission(ctx, flux, lines, 'Hbeta', 4862.68, fHb, fwhm, c(4862.68));
  addEmission(ctx, flux, lines, 'Hgam', 4341.68, 0.47 * fHb, fwhm, c(4341.68));
  addEmission(ctx, flux, lines, 'Hdel', 4102.89, 0.26 * fHb, fwhm, c(4102.89));
  // [O III] 5008/4960 = 2.98, [N II] 6585/6550 = 3.05 (Storey & Zeippen 2000, MNRAS 312, 813; from memory).
  addEmission(ctx, flux, lines, 'OIII_5008', 5008.24, o3hb * fHb, fwhm, c(5008.24));
  addEmission(ctx, flux, lines, 'OIII_4960', 4960.3, (o3hb * fHb) / 2.98, fwhm, c(4960.3));
  addEmission(ctx, flux, lines, 'NII_6585', 6585.27, n2ha * fHa, fwhm, c(6585.27));
  addEmission(ctx, flux, lines, 'NII_6550', 6549.86, (n2ha * fHa) / 3.05, fwhm, c(6549.86));
  const s2 = s2ha * fHa;
  addEmission(ctx, flux, lines, 'SII_6718', 6718.29, s2 / (1 + s2ratio), fwhm, c(6718.29));
  addEmission(ctx, flux, lines, 'SII_6733', 6732.67, (s2 * s2ratio) / (1 + s2ratio), fwhm, c(6732.67));
  const o2 = o2hb * fHb;
  addEmission(ctx, flux, lines, 'OII_3727', 3727.09, o2 / (1 + o2ratio), fwhm, c(3727.09));
  addEmission(ctx, flux, lines, 'OII_3730', 3729.88, (o2 * o2ratio) / (1 + o2ratio), fwhm, c(3729.88));
  addEmission(ctx, flux, lines, 'NeIII', 3869.86, ne3o2 * o2, fwhm, c(3869.86));
  return { flux, continuum, lines, subtype: '', facts: { beta, ewHalphaA: ewHa, fwhmKms: fwhm } };
}

/** Passive galaxy: old-population continuum, 4000 A break D4000 1.4-2.2, absorption lines. */
export function passiveModel(ctx: ModelContext): ClassModel {
  const { rng } = ctx;
  const n = ctx.wl.length;
  const rest = restGrid(ctx);
  // Continuum shaped like a cool Planck curve (4600-5800 K), a stand-in for an old
  // population; then a break scaled so that D4000 of the continuum equals the
  // target (1.4-2.2, the range of passive galaxies in Kauffmann et al. 2003).
  const tempK = rng.uniform(4600, 5800);
  const target = rng.uniform(1.4, 2.2);
  const base = (lr: number) => planckShape(lr, tempK) / planckShape(5000, tempK);
  let strength = target;
  for (let it = 0; it < 4; it++) {
    const d = d4000Of((l) => base(l) * breakStep(l, strength));
    strength *= target / d;
  }
  const cont = (lr: number) => base(lr) * breakStep(lr, strength);
  const continuum = new Float64Array(n);
  for (let i = 0; i < n; i++) continuum[i] = cont(rest[i]);
  const flux = Float64Array.from(continuum);
  const lines: TruthLine[] = [];

  // Velocity dispersion 120-320 km/s (typical of massive early types; from memory).
  const sigmaV = rng.uniform(120, 320);
  const fw = sigmaV * FWHM_PER_SIGMA;
  // Rest EWs (Angstrom) typical of early-type spectra, by eye from memory.
  const postStarburst = rng.chance(0.1);
  const list: Absorber[] = [
    { id: 'CaK', restA: 3934.78, ew: rng.uniform(4, 9), fwhm: fw },
    { id: 'CaH', restA: 3969.59, ew: rng.uniform(3.5, 8), fwhm: fw },
    { id: 'Hdel', restA: 4102.89, ew: postStarburst ? rng.uniform(4, 7) : rng.uniform(0.5, 3), fwhm: fw },
    { id: 'Gband', restA: 4305.61, ew: rng.uniform(3, 6), fwhm: Math.max(fw, 600) },
    { id: 'Hgam', restA: 4341.68, ew: rng.uniform(0.5, 2.5), fwhm: fw },
    { id: 'Hbeta', restA: 4862.68, ew: rng.uniform(1, 2.5), fwhm: fw },
    // Mg b triplet, vacuum (docs/reference.md sec. 1, NIST air converted).
    ...splitMulti('Mgb', [5168.76, 5174.13, 5185.05], rng.uniform(3, 6), fw),
    // Na D2/D1, vacuum (docs/reference.md sec. 1).
    ...splitMulti('NaD', [5891.58, 5897.56], rng.uniform(2, 5), fw),
  ];
  applyAbsorbers(ctx, flux, list, lines);
  // Weak [O II] emission in some passive galaxies (common practice to allow for it).
  if (rng.chance(0.25)) {
    const ew = rng.uniform(1, 5);
    addEmission(ctx, flux, lines, 'OII', 3728.48, ew * (1 + ctx.z) * cont(3728.48), 300, cont(3728.48));
  }
  return { flux, continuum, lines, subtype: '', facts: { d4000: target, sigmaKms: sigmaV } };
}

function splitMulti(id: string, restAs: number[], ewTotal: number, fwhm: number): Absorber[] {
  return restAs.map((restA, k) => ({ id: `${id}_${k + 1}`, restA, ew: ewTotal / restAs.length, fwhm }));
}
