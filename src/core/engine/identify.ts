/**
 * "Name this line": a reviewer clicks a feature in the plot; locateFeature
 * finds and fits the nearest significant peak or trough, and suggestLines
 * lists the catalogue lines it could be, each with the redshift it implies and
 * how many other lines the line table would detect at that redshift (the one
 * feature rule of features.ts, at SUPPORT_SNR).
 *
 * The support count is a check at a fixed redshift, not a fit: treat a
 * suggestion with little support as a guess, and fit the whole spectrum near
 * the implied redshift.
 */
import type { Spectrum, SpectrumClass } from '../types';
import { LINES, type CatalogueLine } from '../lines/catalogue';
import { classLines } from '../lines/classLines';
import { countFeatures } from './features';
import { measureLines } from './measureLines';
import { FWHM_PER_SIGMA, fitGaussLine, fittedFlux } from './gaussFit';
import { continuumValue, filterAt, fitClippedContinuum } from './lines/matchedFilter';
import { lowerIndex, pixelWidthAt, pixelWindow } from './lines/pixelWindow';

/** Speed of light, km/s (exact, SI definition). */
import { C_KMS } from '../constants';

/** A matched-filter peak must reach this signal-to-noise to count as a feature near a click (chosen so that pure noise almost never qualifies). */
export const LOCATE_SNR = 5;
/** The fitted feature must have |flux| / fluxErr at least this. */
export const LOCATE_FIT_SNR = 3;
/** A line of the line table at a hypothesis' redshift supports it when detected at this signal-to-noise (above the table's 3: each hypothesis is a new look for noise). */
export const SUPPORT_SNR = 4;

export interface LocatedFeature {
  /** Fitted centre, observed vacuum Angstrom. */
  centreA: number;
  centreErrA: number;
  kind: 'emission' | 'absorption';
  /** |flux| / fluxErr of the Gaussian fit. */
  snr: number;
  /** Observed FWHM, Angstrom (instrumental width not removed). */
  fwhmA: number;
}

export interface LineSuggestion {
  lineId: string;
  label: string;
  restA: number;
  /** Redshift implied by this identification: centre / rest - 1. */
  z: number;
  /** How many other catalogue lines land on significant features at this z. */
  supporting: number;
  supportingIds: string[];
}

/** Noise scale from the median absolute normalised residual (MAD / 0.6745, common practice), at least 1. */
function robustScale(r: ArrayLike<number>, w: ArrayLike<number>): number {
  const a: number[] = [];
  for (let k = 0; k < r.length; k++) if (w[k] > 0) a.push(Math.abs(r[k]) * Math.sqrt(w[k]));
  if (a.length < 5) return 1;
  a.sort((x, y) => x - y);
  return Math.max(1, a[Math.floor(a.length / 2)] / 0.6745);
}

/**
 * Find the significant peak or trough nearest to clickA (within halfWindowA,
 * default the larger of 10 pixels and 0.4% of the wavelength, ~1200 km/s) and
 * fit it with a Gaussian plus local continuum. null when the click is outside
 * the spectrum, nothing there reaches LOCATE_SNR, or the fit does not hold.
 */
export function locateFeature(spectrum: Spectrum, clickA: number, halfWindowA?: number): LocatedFeature | null {
  const wl = spectrum.wavelengthA;
  if (!(clickA >= wl[0] && clickA <= wl[wl.length - 1])) return null;
  const pix = pixelWidthAt(spectrum, clickA);
  const kernels = (h: number) => KERNEL_PIXELS.map((n) => n * pix).filter((s, i) => i === 0 || s <= h / 1.5);
  if (halfWindowA !== undefined) return locateWith(spectrum, clickA, halfWindowA, kernels(halfWindowA));
  // Narrow search first (about +-1200 km/s), then wider ones so that a click on a
  // broad quasar line (FWHM several thousand km/s) still finds it.
  const h0 = Math.max(10 * pix, 0.004 * clickA);
  for (const h of [h0, 3 * h0, 7 * h0]) {
    const found = locateWith(spectrum, clickA, h, kernels(h));
    if (found) return found;
  }
  return null;
}

/** Kernel sigmas tried by the feature finder, pixels. */
const KERNEL_PIXELS = [1, 2, 4, 8, 16, 32, 64];

function locateWith(spectrum: Spectrum, clickA: number, h: number, sigmas: number[]): LocatedFeature | null {
  const pix = pixelWidthAt(spectrum, clickA);
  const sMax = sigmas[sigmas.length - 1];
  const win = pixelWindow(spectrum, clickA - h - 6 * sMax, clickA + h + 6 * sMax);
  if (win.nGood < 8) return null;

  const cont = fitClippedContinuum(win.xA, win.y, win.w, () => true, clickA, 1);
  if (!cont) return null;
  const r = win.xA.map((x, k) => win.y[k] - continuumValue(cont, x));
  const scale = robustScale(r, win.w);
  const w = win.w.map((v) => v / (scale * scale));

  // Best |snr| over kernel widths at each trial centre.
  const kFrom = lowerIndex(win.xA, clickA - h);
  const kTo = lowerIndex(win.xA, clickA + h) - 1;
  const best: ({ snr: number; amplitude: number; sigmaA: number; centreA: number } | null)[] = [];
  for (let k = kFrom; k <= kTo; k++) {
    let b: (typeof best)[number] = null;
    if (w[k] > 0) {
      for (const s of sigmas) {
        const hit = filterAt(win.xA, r, w, k, s);
        if (!b || Math.abs(hit.snr) > Math.abs(b.snr)) b = hit;
      }
    }
    best.push(b);
  }
  // Local maxima of |snr| above threshold; the one nearest the click wins.
  let chosen: (typeof best)[number] = null;
  for (let i = 0; i < best.length; i++) {
    const b = best[i];
    if (!b || Math.abs(b.snr) < LOCATE_SNR) continue;
    const left = best[i - 1];
    const right = best[i + 1];
    if ((left && Math.abs(left.snr) > Math.abs(b.snr)) || (right && Math.abs(right.snr) > Math.abs(b.snr))) continue;
    const d = Math.abs(b.centreA - clickA);
    if (!chosen || d < Math.abs(chosen.centreA - clickA) || (d === Math.abs(chosen.centreA - clickA) && Math.abs(b.snr) > Math.abs(chosen.snr))) {
      chosen = b;
    }
  }
  if (!chosen) return null;
  return fitFeature(spectrum, chosen, continuumValue(cont, chosen.centreA), cont.coef[1] ?? 0, pix);
}

function fitFeature(
  spectrum: Spectrum,
  start: { amplitude: number; sigmaA: number; centreA: number },
  c0: number,
  c1: number,
  pix: number,
): LocatedFeature | null {
  const c = start.centreA;
  const half = Math.max(5 * start.sigmaA, 6 * pix);
  const win = pixelWindow(spectrum, c - half, c + half);
  const fit = fitGaussLine(win.xA, win.y, win.w, {
    initial: { amplitude: start.amplitude, centre: c, sigma: start.sigmaA, c0, c1 },
    xRef: c,
    centreBounds: [c - 2 * start.sigmaA - pix, c + 2 * start.sigmaA + pix],
    sigmaBounds: [0.3 * pix, 2.5 * half],
  });
  if (fit.status !== 'converged') return null;
  const { flux, fluxErr } = fittedFlux(fit);
  const snr = Math.abs(flux) / fluxErr;
  if (!(snr >= LOCATE_FIT_SNR) || Math.sign(flux) !== Math.sign(start.amplitude)) return null;
  return {
    centreA: fit.params.centre,
    centreErrA: fit.errors.centre,
    kind: fit.params.amplitude > 0 ? 'emission' : 'absorption',
    snr,
    fwhmA: FWHM_PER_SIGMA * fit.params.sigma,
  };
}

/** Default plausible redshift range for suggestions (brief: -0.005 to 7). */
export const SUGGEST_Z_MIN = -0.005;
export const SUGGEST_Z_MAX = 7;

/**
 * Catalogue lines of the given kind that the feature at centreA could be,
 * best first: most supporting lines, then the catalogue strength of the line,
 * then the summed signal-to-noise of the support. The support is the line
 * table at the implied redshift (measureLines, with the class that lists the
 * hypothesis line; a broad feature only quasar broad lines): its detected
 * features at S/N >= SUPPORT_SNR, apart from any on the clicked feature itself
 * (within 5 sigma of it, at least 1000 km/s).
 */
/** FWHM above which a clicked feature is taken as a quasar broad line, km/s. */
export const BROAD_FEATURE_KMS = 1500;

/** The class whose line table tests a hypothesis: a broad line's is the quasar's; otherwise the first class that lists the line. */
function classOfHypothesis(line: CatalogueLine, broad: boolean): SpectrumClass {
  if (broad) return 'qso';
  for (const cls of ['galaxy', 'star', 'qso'] as const) if (classLines(cls).some((c) => c.line.id === line.id)) return cls;
  return 'galaxy';
}

export function suggestLines(
  spectrum: Spectrum, centreA: number, kind: 'emission' | 'absorption', options?: { zMin?: number; zMax?: number },
): LineSuggestion[] {
  const zMin = options?.zMin ?? SUGGEST_Z_MIN;
  const zMax = options?.zMax ?? SUGGEST_Z_MAX;
  const pix = pixelWidthAt(spectrum, centreA);

  // Velocity width of the clicked feature (300 km/s when it cannot be fitted);
  // kernels up to 64 pixels so that a broad quasar line gets its own width.
  const found = locateWith(spectrum, centreA, 3 * pix, KERNEL_PIXELS.map((n) => n * pix));
  const fwhmKms = Math.min(10000, Math.max(2.5 * (pix / centreA) * C_KMS, found ? (found.fwhmA / centreA) * C_KMS : 300));

  // Lines on the clicked feature itself do not support it: +-5 sigma (where a
  // Gaussian has fallen to 4e-6 of its peak), at least 1000 km/s.
  const excludeHalfA = (Math.max((5 * fwhmKms) / FWHM_PER_SIGMA, 1000) / C_KMS) * centreA;
  // A feature broader than narrow lines ever are (FWHM > 1500 km/s; common
  // practice puts the broad-line boundary near 1000-2000 km/s) can only be a
  // quasar broad line, and only other broad lines can be expected at its width.
  const broad = fwhmKms > BROAD_FEATURE_KMS;
  const scored: (LineSuggestion & { strength: number; snrSum: number })[] = [];
  for (const hyp of LINES) {
    if (hyp.kind !== kind) continue;
    if (broad && !hyp.roles.includes('qso-broad')) continue;
    const z = centreA / hyp.restA - 1;
    if (!(z >= zMin && z <= zMax)) continue;
    // Support: the features the line table would show at this z (features.ts,
    // the rule the grade uses), apart from the clicked feature itself, at the
    // stricter SUPPORT_SNR since every hypothesis is a new look for noise.
    const features = countFeatures(measureLines(spectrum, z, classOfHypothesis(hyp, broad))).lines
      .filter((l) => l.id !== hyp.id && l.snr >= SUPPORT_SNR && Math.abs(l.observedA - centreA) >= excludeHalfA);
    scored.push({
      lineId: hyp.id, label: hyp.label, restA: hyp.restA, z, supporting: features.length, supportingIds: features.map((l) => l.id),
      strength: hyp.strength, snrSum: features.reduce((t, l) => t + l.snr, 0),
    });
  }
  scored.sort((a, b) => b.supporting - a.supporting || b.strength - a.strength || b.snrSum - a.snrSum);
  return scored.map(({ lineId, label, restA, z, supporting, supportingIds }) => ({ lineId, label, restA, z, supporting, supportingIds }));
}
