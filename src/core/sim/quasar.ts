/**
 * Quasar model: broken power-law continuum, broad emission lines with
 * independent strengths and widths, blueshifted high-ionisation lines,
 * optional narrow lines and Fe II-like bumps, then the Lyman-alpha forest.
 */
import { C_KMS } from '../constants';
import { addGaussian, observedSigmaA } from './profiles';
import { forestTransmission } from './forest';
import { restGrid, scatterDex, type ClassModel, type ModelContext, type TruthLine } from './model';

/**
 * Broad lines: vacuum rest wavelength (Angstrom; docs/reference.md sec. 1) and a
 * typical rest equivalent width (Angstrom), close to the composite of Vanden
 * Berk et al. 2001 (AJ 122, 549, Table 2; EW values from memory), each drawn
 * with 0.2-0.3 dex log-normal scatter per object. `shift` says how much of the
 * C IV blueshift the line shares (Richards et al. 2002, AJ 124, 1: high-
 * ionisation lines are blueshifted, Mg II and the Balmer lines sit near
 * systemic).
 */
const BROAD = [
  { id: 'OVI', restA: 1033.82, ew: 9, dex: 0.3, shift: [0.3, 0.8] },
  { id: 'LyA', restA: 1215.67, ew: 80, dex: 0.2, shift: [0, 0.4] },
  { id: 'NV', restA: 1240.14, ew: 15, dex: 0.3, shift: [0.3, 0.8] },
  { id: 'OI_1304', restA: 1304.35, ew: 2, dex: 0.3, shift: [0, 0.2] },
  { id: 'SiIV', restA: 1396.76, ew: 8, dex: 0.25, shift: [0.5, 1] },
  { id: 'CIV', restA: 1549.06, ew: 28, dex: 0.25, shift: [1, 1] },
  { id: 'HeII_1640', restA: 1640.42, ew: 2, dex: 0.3, shift: [0.5, 1] },
  { id: 'CIII', restA: 1908.73, ew: 20, dex: 0.2, shift: [0, 0.3] },
  { id: 'MgII', restA: 2798.75, ew: 32, dex: 0.2, shift: [0, 0] },
  { id: 'Hdel', restA: 4102.89, ew: 5, dex: 0.3, shift: [0, 0] },
  { id: 'Hgam', restA: 4341.68, ew: 13, dex: 0.25, shift: [0, 0] },
  { id: 'Hbeta', restA: 4862.68, ew: 46, dex: 0.2, shift: [0, 0] },
  { id: 'Halpha', restA: 6564.61, ew: 195, dex: 0.2, shift: [0, 0] },
] as const;

/** Break of the composite continuum, rest Angstrom (Vanden Berk et al. 2001). */
const BREAK_REST_A = 5000;

export function quasarModel(ctx: ModelContext): ClassModel {
  const { rng, z, edges, resolutionR } = ctx;
  const n = ctx.wl.length;
  const rest = restGrid(ctx);

  // Continuum f_nu ~ nu^alpha: f_lambda ~ lambda^-(2 + alpha). alpha_nu = -0.44
  // blueward of ~5000 A and ~ -2.45 redward (Vanden Berk et al. 2001); the
  // object-to-object scatter of 0.3 is from memory (Richards et al. 2006 find
  // a similar spread).
  const alphaBlue = -0.44 + 0.3 * rng.gaussian();
  const alphaRed = -2.45 + 0.3 * rng.gaussian();
  const cont = (lr: number) =>
    lr < BREAK_REST_A ? Math.pow(lr / BREAK_REST_A, -(2 + alphaBlue)) : Math.pow(lr / BREAK_REST_A, -(2 + alphaRed));
  // Normalise so the continuum is 1 at rest 3000 A (arbitrary).
  const norm = 1 / cont(3000);
  const continuum = new Float64Array(n);
  for (let i = 0; i < n; i++) continuum[i] = norm * cont(rest[i]);

  const flux = Float64Array.from(continuum);
  const lines: TruthLine[] = [];

  // Fe II-like pseudo-continuum bumps (UV 2200-3100 A; optical either side of
  // H-beta, cf. Boroson & Green 1992, ApJS 80, 109), as smooth Gaussians in rest A.
  const feUv = rng.uniform(0, 0.25);
  const feOpt = rng.uniform(0, 0.15);
  for (let i = 0; i < n; i++) {
    const lr = rest[i];
    const bump =
      feUv * Math.exp(-0.5 * ((lr - 2600) / 220) ** 2) +
      feOpt * Math.exp(-0.5 * ((lr - 4570) / 70) ** 2) +
      0.7 * feOpt * Math.exp(-0.5 * ((lr - 5270) / 80) ** 2);
    flux[i] += continuum[i] * bump;
  }

  // One broad width per object (2000-9000 km/s FWHM), each line within +-20%.
  const fwhmBase = rng.uniform(2000, 9000);
  // C IV blueshift of 0-2000 km/s relative to systemic (Richards et al. 2002).
  const civShift = -rng.uniform(0, 2000);
  // Global line-strength factor (objects differ as a whole, e.g. the Baldwin effect).
  const global = scatterDex(rng, 1, 0.15);
  for (const b of BROAD) {
    const ew = global * scatterDex(rng, b.ew, b.dex);
    const share = b.shift[0] + (b.shift[1] - b.shift[0]) * rng.next();
    const offsetKms = civShift * share + 80 * rng.gaussian();
    const fwhm = fwhmBase * rng.uniform(0.8, 1.2);
    const obs = b.restA * (1 + z) * (1 + offsetKms / C_KMS);
    addBroadLine(flux, edges, obs, fwhm, resolutionR, ew * (1 + z) * norm * cont(b.restA));
    lines.push({ id: b.id, kind: 'emission', restA: b.restA, observedA: obs, offsetKms, fwhmKms: fwhm, ewRestA: ew });
  }

  // Narrow lines from the host / narrow-line region, sometimes.
  const narrowFwhm = rng.uniform(250, 700);
  if (rng.chance(0.6)) {
    const ew5008 = scatterDex(rng, 15, 0.3);
    // 5008/4960 = 2.98 (Storey & Zeippen 2000, MNRAS 312, 813).
    addNarrow(ctx, flux, lines, 'OIII_5008', 5008.24, ew5008, narrowFwhm, norm * cont(5008.24));
    addNarrow(ctx, flux, lines, 'OIII_4960', 4960.3, ew5008 / 2.98, narrowFwhm, norm * cont(4960.3));
  }
  if (rng.chance(0.3)) addNarrow(ctx, flux, lines, 'OII', 3728.48, scatterDex(rng, 2, 0.3), narrowFwhm, norm * cont(3728.48));
  if (rng.chance(0.3)) addNarrow(ctx, flux, lines, 'NeV', 3426.85, scatterDex(rng, 1, 0.3), narrowFwhm, norm * cont(3426.85));

  const forest = forestTransmission(ctx.wl, z, rng, { resolutionR });
  for (let i = 0; i < n; i++) flux[i] *= forest[i];

  return { flux, continuum, lines, subtype: '', facts: { alphaNu: alphaBlue, fwhmKms: fwhmBase, civShiftKms: civShift }, forest };
}

/**
 * A broad line as a core plus a wing: 70% of the flux in a Gaussian of the
 * given FWHM, 30% in one 2.5 times wider (broad-line profiles are peakier
 * than one Gaussian; shape chosen by eye, not from a fit).
 */
function addBroadLine(out: Float64Array, edges: Float64Array, obsA: number, fwhmKms: number, R: number, fluxTotal: number) {
  addGaussian(out, edges, obsA, observedSigmaA(obsA, fwhmKms, R), 0.7 * fluxTotal);
  addGaussian(out, edges, obsA, observedSigmaA(obsA, 2.5 * fwhmKms, R), 0.3 * fluxTotal);
}

function addNarrow(ctx: ModelContext, flux: Float64Array, lines: TruthLine[], id: string, restA: number, ew: number, fwhm: number, contAtLine: number) {
  const obs = restA * (1 + ctx.z);
  addGaussian(flux, ctx.edges, obs, observedSigmaA(obs, fwhm, ctx.resolutionR), ew * (1 + ctx.z) * contAtLine);
  lines.push({ id, kind: 'emission', restA, observedA: obs, offsetKms: 0, fwhmKms: fwhm, ewRestA: ew });
}
