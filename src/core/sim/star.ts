/**
 * Stellar models near z = 0: a hot A type with strong Balmer absorption, a
 * solar-like G type with metal lines, a cool M type with molecular bands.
 * Continua are Planck curves (a blackbody is a fair first shape for a star).
 */
import { addGaussian, addLorentzian, observedSigmaA } from './profiles';
import { planckShape } from './galaxy';
import { airToVacuum } from './airVacuum';
import { restGrid, type ClassModel, type ModelContext, type TruthLine } from './model';

export type StarType = 'A' | 'G' | 'M';

/** Balmer series, vacuum A: H-alpha..H-epsilon from docs/reference.md sec. 1; higher n from the Rydberg formula. */
function balmerA(nUpper: number): number {
  const known: Record<number, number> = { 3: 6564.61, 4: 4862.68, 5: 4341.68, 6: 4102.89, 7: 3971.2 };
  if (known[nUpper]) return known[nUpper];
  // 1/lambda = R_H (1/4 - 1/n^2), R_H = 1.09677583e-3 per A (hydrogen Rydberg constant, from memory).
  return 1 / (1.09677583e-3 * (0.25 - 1 / (nUpper * nUpper)));
}

/** Balmer limit, vacuum Angstrom (n -> infinity of the formula above). */
const BALMER_LIMIT_A = 1 / (1.09677583e-3 * 0.25);

interface Feature {
  id: string;
  restA: number;
  ew: number;
  /** 'g': Gaussian of intrinsic FWHM fwhm (km/s); 'l': Lorentzian of HWHM gammaA. */
  shape: 'g' | 'l';
  fwhm?: number;
  gammaA?: number;
}

export function starModel(ctx: ModelContext, type: StarType): ClassModel {
  const { rng } = ctx;
  const n = ctx.wl.length;
  const rest = restGrid(ctx);
  const tempK = type === 'A' ? rng.uniform(7500, 10500) : type === 'G' ? rng.uniform(5300, 6300) : rng.uniform(3000, 3800);
  const continuum = new Float64Array(n);
  for (let i = 0; i < n; i++) continuum[i] = planckShape(rest[i], tempK) / planckShape(5500, tempK);
  const flux = Float64Array.from(continuum);
  const feats: Feature[] = [];
  const lines: TruthLine[] = [];
  const facts: Record<string, number> = { tempK };

  if (type === 'A') {
    // Balmer jump: flux drops by 30-55% blueward of the Balmer limit (by eye).
    const jump = rng.uniform(0.3, 0.55);
    facts.balmerJump = jump;
    for (let i = 0; i < n; i++) {
      const t = 1 / (1 + Math.exp((rest[i] - BALMER_LIMIT_A) / 10));
      flux[i] *= 1 - jump * t;
    }
    // Strong, pressure-broadened Balmer lines: EW 6-16 A (by eye, A0-A5 dwarfs).
    const scale = rng.uniform(0.7, 1.3);
    const ew: Record<number, number> = { 3: 9, 4: 13, 5: 13, 6: 12, 7: 10, 8: 8, 9: 6, 10: 5, 11: 4 };
    for (let k = 3; k <= 11; k++) {
      const e = ew[k] * scale;
      feats.push({ id: `H${k}`, restA: balmerA(k), ew: e, shape: 'l', gammaA: 0.5 * e });
    }
    feats.push({ id: 'CaK', restA: 3934.78, ew: rng.uniform(0.2, 0.8), shape: 'g', fwhm: 30 });
  } else if (type === 'G') {
    feats.push(
      { id: 'Gband', restA: 4305.61, ew: rng.uniform(3, 6), shape: 'g', fwhm: 600 },
    );
    // Strong lines with damping wings: Lorentzians whose HWHM grows with EW, so
    // the core depth stays near 1/(0.45 pi) = 0.7 instead of saturating.
    const wing = (id: string, restA: number, ew: number): Feature => ({ id, restA, ew, shape: 'l', gammaA: 0.45 * ew });
    feats.push(
      wing('CaK', 3934.78, rng.uniform(7, 14)),
      wing('CaH', 3969.59, rng.uniform(6, 11)),
      wing('Hdel', 4102.89, rng.uniform(1.5, 3)),
      wing('Hgam', 4341.68, rng.uniform(2, 3)),
      wing('Hbeta', 4862.68, rng.uniform(2, 4)),
      wing('Halpha', 6564.61, rng.uniform(2, 3)),
    );
    const mgb = rng.uniform(3, 5);
    for (const [k, l] of [5168.76, 5174.13, 5185.05].entries()) feats.push({ id: `Mgb_${k + 1}`, restA: l, ew: mgb / 3, shape: 'g', fwhm: 20 });
    const nad = rng.uniform(2, 3.5);
    for (const [k, l] of [5891.58, 5897.56].entries()) feats.push({ id: `NaD_${k + 1}`, restA: l, ew: nad / 2, shape: 'g', fwhm: 20 });
    // A forest of weak unnamed metal lines (random positions, EW 0.1-0.6 A) so
    // the spectrum is not unrealistically clean between the named features.
    for (let k = 0; k < 60; k++) {
      feats.push({ id: 'metal', restA: rng.uniform(3700, 7000), ew: rng.uniform(0.1, 0.6), shape: 'g', fwhm: 20 });
    }
  } else {
    // TiO band heads (air A, from memory) with depressions that recover redward.
    const heads = [4761, 4954, 5167, 5448, 5847, 6159, 6651, 7054, 7589, 8432];
    const cool = (3800 - tempK) / 800; // 0 (warm M) .. 1 (cool M)
    const depthBase = 0.25 + 0.45 * cool;
    facts.tioDepth = depthBase;
    const mult = new Float64Array(n).fill(1);
    for (const hAir of heads) {
      const head = airToVacuum(hAir);
      const d = depthBase * rng.uniform(0.6, 1.2);
      const len = rng.uniform(80, 200);
      for (let i = 0; i < n; i++) {
        const x = rest[i] - head;
        if (x < -15) continue;
        const edge = 1 / (1 + Math.exp(-x / 3)); // sharp head
        mult[i] *= 1 - Math.min(0.9, d) * edge * Math.exp(-Math.max(0, x) / len);
      }
    }
    for (let i = 0; i < n; i++) flux[i] *= mult[i];
    feats.push(
      { id: 'CaI_4227', restA: airToVacuum(4226.73), ew: rng.uniform(2, 6), shape: 'g', fwhm: 30 },
      { id: 'NaI_8183', restA: airToVacuum(8183.26), ew: rng.uniform(1.5, 4), shape: 'g', fwhm: 30 },
      { id: 'NaI_8195', restA: airToVacuum(8194.82), ew: rng.uniform(1.5, 4), shape: 'g', fwhm: 30 },
      { id: 'KI_7665', restA: airToVacuum(7664.9), ew: rng.uniform(1, 2), shape: 'g', fwhm: 30 },
      { id: 'KI_7699', restA: airToVacuum(7698.96), ew: rng.uniform(1, 2), shape: 'g', fwhm: 30 },
      { id: 'CaT_8498', restA: airToVacuum(8498.02), ew: rng.uniform(1, 2), shape: 'g', fwhm: 30 },
      { id: 'CaT_8542', restA: airToVacuum(8542.09), ew: rng.uniform(1.5, 3), shape: 'g', fwhm: 30 },
      { id: 'CaT_8662', restA: airToVacuum(8662.14), ew: rng.uniform(1.2, 2.5), shape: 'g', fwhm: 30 },
    );
    // Some M dwarfs show H-alpha in emission (flare-active 'dMe' stars); about 30% here.
    if (rng.chance(0.3)) {
      const ewEm = rng.uniform(2, 8);
      const obs = 6564.61 * (1 + ctx.z);
      const contAt = planckShape(6564.61, tempK) / planckShape(5500, tempK);
      addGaussian(flux, ctx.edges, obs, observedSigmaA(obs, 60, ctx.resolutionR), ewEm * (1 + ctx.z) * contAt);
      lines.push({ id: 'Halpha', kind: 'emission', restA: 6564.61, observedA: obs, offsetKms: 0, fwhmKms: 60, ewRestA: ewEm });
    }
  }

  const depth = new Float64Array(n);
  for (const f of feats) {
    const obs = f.restA * (1 + ctx.z);
    if (f.shape === 'l') addLorentzian(depth, ctx.edges, obs, (f.gammaA ?? 1) * (1 + ctx.z), f.ew * (1 + ctx.z));
    else addGaussian(depth, ctx.edges, obs, observedSigmaA(obs, f.fwhm ?? 30, ctx.resolutionR), f.ew * (1 + ctx.z));
    if (f.id !== 'metal') {
      lines.push({ id: f.id, kind: 'absorption', restA: f.restA, observedA: obs, offsetKms: 0, fwhmKms: f.shape === 'g' ? f.fwhm ?? 30 : NaN, ewRestA: f.ew });
    }
  }
  for (let i = 0; i < n; i++) flux[i] *= Math.max(0.02, 1 - depth[i]);
  return { flux, continuum, lines, subtype: type, facts };
}
