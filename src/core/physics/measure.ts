/**
 * Quasar measurements at a redshift: per region the continuum (power law +
 * Fe II), its standard luminosity wavelength and its broad line, then the C IV
 * absorption indices. Errors come from the fits' covariances (first-order
 * propagation; test/core/physics/errors.test.ts checks them against the
 * scatter over noise realisations). On request, `draws` resampled spectra
 * (each pixel moved by a Gaussian deviate of its own sigma, seeded, so a
 * spectrum always gives the same numbers; Shen et al. 2011, sec. 3.2, used
 * the same kind of resampling) give a second estimate and the larger of the
 * two is reported. The batch (worker fit, CLI) uses none: the draws cost ten
 * times the fit; the review box offers them.
 */
import type { Spectrum } from '../types';
import { createRng } from '../sim/prng';
import { fluxScaleOf } from './fluxUnits';
import { restData, type RestData } from './restData';
import { REGIONS, type RegionDef } from './regions';
import { fitContinuum, type ContinuumFit } from './continuum';
import { fitBroadLine, lineData, widthErrors, widthsOf, type BestLineFit } from './broadLine';
import { fitGaussSum } from './gaussianSum';
import { measureBal } from './bal';
import type { AbsorptionResult, BroadLineResult, ContinuumPoint, QuasarMeasurement } from './types';

export interface MeasureOptions {
  /** Resampling draws per region (default 0: errors from the fits alone). */
  draws?: number;
  /** Seed of the draws (default 1). */
  seed?: number;
}

function sd(v: number[]): number {
  if (v.length < 2) return NaN;
  const m = v.reduce((s, x) => s + x, 0) / v.length;
  return Math.sqrt(v.reduce((s, x) => s + (x - m) * (x - m), 0) / (v.length - 1));
}

function perturbed(d: RestData, rng: ReturnType<typeof createRng>): Float64Array {
  const out = new Float64Array(d.flux.length);
  for (let i = 0; i < out.length; i++) out[i] = d.weight[i] > 0 ? d.flux[i] + rng.gaussian() / Math.sqrt(d.weight[i]) : d.flux[i];
  return out;
}

const MIN_LINE_SNR = 3;

function lineResult(r: RegionDef, d: RestData, c: ContinuumFit, nDraws: number, seed: number): { line: BroadLineResult; drawsL: number[] } {
  const drawsL: number[] = [];
  const data = lineData(d, r, c);
  const fail = (reason: string) => ({ line: { id: r.line, ok: false, reason }, drawsL });
  let best: BestLineFit | string = typeof data === 'string' ? data : fitBroadLine(r, data);
  if (typeof best === 'string') {
    // The continuum draws still serve the luminosity error.
    const rng = createRng(seed);
    for (let k = 0; k < nDraws; k++) {
      const c2 = fitContinuum(d, { windowsA: r.windowsA, refA: r.refA, withFe: r.withFe, flux: perturbed(d, rng), alphaNear: c.alpha });
      if (c2.ok) drawsL.push(c2.a);
    }
    return fail(best);
  }
  best = best as BestLineFit;
  const { model, fit } = best;
  const w = widthsOf(model, fit.params);
  const { fwhmErrKms: fwhmErrFit, sigmaErrKms: sigmaErrFit, snr } = widthErrors(model, fit);
  const fw: number[] = [];
  const sg: number[] = [];
  const rng = createRng(seed);
  for (let k = 0; k < nDraws; k++) {
    const flux = perturbed(d, rng);
    const c2 = fitContinuum(d, { windowsA: r.windowsA, refA: r.refA, withFe: r.withFe, flux, alphaNear: c.alpha });
    if (!c2.ok) continue;
    drawsL.push(c2.a);
    const data2 = lineData(d, r, c2, flux);
    if (typeof data2 === 'string') continue;
    const f2 = fitGaussSum(model, fit.params, data2.x, data2.y, data2.w, 30);
    if (!f2.ok) continue;
    const w2 = widthsOf(model, f2.params);
    if (Number.isFinite(w2.fwhmKms)) fw.push(w2.fwhmKms);
    if (Number.isFinite(w2.sigmaKms)) sg.push(w2.sigmaKms);
  }
  const fwhmErrDraws = sd(fw);
  const sigmaErrDraws = sd(sg);
  const line: BroadLineResult = {
    id: r.line,
    ok: snr >= MIN_LINE_SNR && Number.isFinite(w.fwhmKms),
    reason: snr >= MIN_LINE_SNR ? undefined : `broad ${r.line} not detected (integrated S/N ${snr.toFixed(1)} < ${MIN_LINE_SNR})`,
    fwhmKms: w.fwhmKms,
    fwhmErrFitKms: fwhmErrFit,
    fwhmErrDrawsKms: fwhmErrDraws,
    fwhmErrKms: Math.max(fwhmErrFit, Number.isFinite(fwhmErrDraws) ? fwhmErrDraws : 0),
    sigmaKms: w.sigmaKms,
    sigmaErrKms: Math.max(sigmaErrFit, Number.isFinite(sigmaErrDraws) ? sigmaErrDraws : 0),
    peakShiftKms: w.peakKms,
    nBroad: best.nBroad,
    reducedChi2: fit.chi2 / fit.dof,
    snr,
    gaussians: model.components.map((cm) => ({ restA: cm.restA, amp: fit.params[cm.amp] * cm.ampFactor, velKms: fit.params[cm.vel], sigmaKms: fit.params[cm.sig], broad: cm.broad })),
    continuum: { refA: c.refA, a: c.a, alpha: c.alpha, fe: c.fe },
    rangeA: [r.lineRangeA[0], r.lineRangeA[1]],
  };
  return { line, drawsL };
}

function absorption(d: RestData, nDraws: number, seed: number): AbsorptionResult {
  const b = measureBal(d);
  if (!b.ok) return { ok: false, reason: b.reason, troughs: [] };
  const bis: number[] = [];
  const ais: number[] = [];
  const rng = createRng(seed);
  for (let k = 0; k < nDraws; k++) {
    const b2 = measureBal(d, { flux: perturbed(d, rng), alphaNear: b.continuum.alpha });
    if (b2.ok) {
      bis.push(b2.biKms);
      ais.push(b2.aiKms);
    }
  }
  const c = b.continuum;
  const larger = (fit: number, draws: number) => Math.max(fit, Number.isFinite(draws) ? draws : 0);
  return { ok: true, biKms: b.biKms, biErrKms: larger(b.biErrKms, sd(bis)), aiKms: b.aiKms, aiErrKms: larger(b.aiErrKms, sd(ais)), troughs: b.troughs, continuum: { refA: c.refA, a: c.a, alpha: c.alpha, fe: 0 } };
}

/** Everything the spectrum allows at z; never throws for a poor spectrum (each part says why it is missing). */
export function measureQuasar(s: Spectrum, z: number, o: MeasureOptions = {}): QuasarMeasurement {
  const nDraws = o.draws ?? 0;
  const seed = o.seed ?? 1;
  const d = restData(s, z);
  const scale = fluxScaleOf(s.meta.fluxUnit);
  const continua: ContinuumPoint[] = [];
  const lines: BroadLineResult[] = [];
  REGIONS.forEach((r, k) => {
    const c = fitContinuum(d, { windowsA: r.windowsA, refA: r.refA, withFe: r.withFe });
    if (!c.ok) {
      lines.push({ id: r.line, ok: false, reason: `no continuum: ${c.reason}` });
      if (r.luminosityA) continua.push({ restA: r.luminosityA, ok: false, reason: c.reason });
      return;
    }
    const { line, drawsL } = lineResult(r, d, c, nDraws, seed + 7919 * (k + 1));
    lines.push(line);
    if (r.luminosityA) continua.push({ restA: r.luminosityA, ok: true, flux: c.a, fluxErr: Math.max(c.aErr, Number.isFinite(sd(drawsL)) ? sd(drawsL) : 0) });
  });
  return {
    z,
    fluxScale: scale.ok ? { ok: true, ergPerSCm2A: scale.ergPerSCm2A, unit: s.meta.fluxUnit ?? '' } : scale,
    continua,
    lines,
    absorption: absorption(d, nDraws, seed + 104729),
    draws: nDraws,
    noiseEstimated: d.noiseEstimated,
  };
}
