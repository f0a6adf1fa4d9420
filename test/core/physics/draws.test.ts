/**
 * Errors by resampling (measureQuasar with `draws`, the review box's
 * "Errors by resampling"): seeded, so one spectrum always gives the same
 * numbers, and honest: the spread of the draws matches the scatter of the
 * width over independent noise realisations (common practice: a Monte Carlo
 * check of an error estimate).
 *
 * Tolerance: a standard deviation from N values has a relative standard error
 * of about 1 / sqrt(2 (N - 1)) (normal sampling theory, common practice):
 * 13 % for the 32 draws, 11 % for the 40 realisations, about 17 % for their
 * ratio; the ratio is asked to lie within 0.6-1.5 (about three of those).
 */
import { describe, expect, it } from 'vitest';
import { measureQuasar } from '../../../src/core/physics/measure';
import { gaussianKms, simQuasar } from './simQuasar';
import type { Spectrum } from '../../../src/core/types';
const DRAWS = 32;
const REALISATIONS = 40;

/** The simulated quasar with one broad H-beta 4862.68 A of FWHM 5000 km/s (8 file units high) at S/N 15. */
const quasar = (seed: number) => simQuasar(seed, 15, { lines: (rest) => 8 * gaussianKms(rest, 4862.68, 5000) });

function sd(v: number[]): number {
  const m = v.reduce((s, x) => s + x, 0) / v.length;
  return Math.sqrt(v.reduce((s, x) => s + (x - m) ** 2, 0) / (v.length - 1));
}

const hbeta = (s: Spectrum, o = {}) => measureQuasar(s, 1, o).lines.find((l) => l.id === 'Hbeta')!;

describe('errors by resampling', () => {
  const s = quasar(101);
  const first = measureQuasar(s, 1, { draws: DRAWS, seed: 5 });

  it('the same spectrum and seed give the same numbers; another seed gives other draws', () => {
    expect(first.draws).toBe(DRAWS);
    expect(measureQuasar(s, 1, { draws: DRAWS, seed: 5 })).toEqual(first);
    const h = first.lines.find((l) => l.id === 'Hbeta')!;
    const other = hbeta(s, { draws: DRAWS, seed: 6 });
    expect(h.fwhmErrDrawsKms).toBeGreaterThan(0);
    expect(other.fwhmErrDrawsKms).not.toBe(h.fwhmErrDrawsKms);
    // The measurement itself does not depend on the draws; only its errors do.
    expect(other.fwhmKms).toBe(h.fwhmKms);
    expect(hbeta(s).fwhmErrDrawsKms).toBeNaN(); // no draws asked: none made
  });

  it('the spread of the draws matches the scatter of the FWHM over independent noise realisations', () => {
    const fwhms = Array.from({ length: REALISATIONS }, (_, k) => hbeta(quasar(1000 + k)).fwhmKms!);
    const scatter = sd(fwhms);
    const fromDraws = first.lines.find((l) => l.id === 'Hbeta')!.fwhmErrDrawsKms!;
    console.log(`H-beta FWHM error: ${fromDraws.toFixed(1)} km/s from ${DRAWS} draws, scatter ${scatter.toFixed(1)} km/s over ${REALISATIONS} realisations`);
    expect(fromDraws / scatter).toBeGreaterThan(0.6);
    expect(fromDraws / scatter).toBeLessThan(1.5);
  });
});
