import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { locateFeature, suggestLines } from '../../../src/core/engine/identify';
import { readSpectrum } from '../../../src/core/io/readSpectrum';
import { LINES, lineById } from '../../../src/core/lines/catalogue';
import { C_KMS, parseSimpleCsv, synthSpectrum, type SynthLine } from './lines/testKit';

const Z = 0.3;
const continuum = (lam: number): number => 20 * (lam / 6000) ** -1;
/** Invented fluxes (flux unit * A) of a star-forming galaxy; FWHM 250 km/s. */
const galaxy: SynthLine[] = Object.entries({ OII: 40, Hbeta: 20, OIII_4960: 15, OIII_5008: 45, Halpha: 70, NII_6585: 20 })
  .map(([id, flux]) => ({ centreA: (1 + Z) * lineById(id)!.restA, flux, fwhmKms: 250 }));
const galaxySpec = synthSpectrum({ lambdaMinA: 3800, lambdaMaxA: 9200, continuum, lines: galaxy, noise: 0.3, seed: 5 });

describe('locateFeature(spectrum, clickA, halfWindowA?)', () => {
  it('finds and fits the [O III] 5008 line from a click a few Angstrom away', () => {
    const truth = (1 + Z) * 5008.24;
    const f = locateFeature(galaxySpec, truth + 4)!;
    expect(f).not.toBeNull();
    expect(f.kind).toBe('emission');
    expect(Math.abs(f.centreA - truth)).toBeLessThan(3 * f.centreErrA);
    expect(f.snr).toBeGreaterThan(10);
    // Injected FWHM 250 km/s at 6510.7 A = 5.43 A (definition of the synthetic line).
    expect(f.fwhmA / ((250 / C_KMS) * truth)).toBeGreaterThan(0.8);
    expect(f.fwhmA / ((250 / C_KMS) * truth)).toBeLessThan(1.2);
  });

  it('returns null on empty continuum and outside the spectrum', () => {
    for (const click of [5400, 7200, 7800, 9000]) expect(locateFeature(galaxySpec, click), `${click}`).toBeNull();
    expect(locateFeature(galaxySpec, 3000)).toBeNull();
    expect(locateFeature(galaxySpec, 12000)).toBeNull();
    const flat = synthSpectrum({ lambdaMinA: 4000, lambdaMaxA: 8000, continuum: () => 5, lines: [], noise: 0.2, seed: 77 });
    for (let click = 4200; click < 7900; click += 250) expect(locateFeature(flat, click), `${click}`).toBeNull();
  });

  it('reports a trough as absorption, also without an uncertainty array', () => {
    const lam = 1.1 * lineById('NaD')!.restA;
    const s = synthSpectrum({
      lambdaMinA: 4000, lambdaMaxA: 8000, continuum: () => 50, lines: [{ centreA: lam, flux: -150, fwhmKms: 500 }],
      noise: 0.3, seed: 9, noIvar: true,
    });
    const f = locateFeature(s, lam - 3)!;
    expect(f.kind).toBe('absorption');
    expect(Math.abs(f.centreA - lam)).toBeLessThan(3 * f.centreErrA + 0.05);
  });
});

describe('suggestLines(spectrum, centreA, kind, options?)', () => {
  it('names [O III] 5008 first at z ~ 0.3 with other lines in support', () => {
    const f = locateFeature(galaxySpec, 6512)!;
    const s = suggestLines(galaxySpec, f.centreA, f.kind);
    expect(s[0].lineId).toBe('OIII_5008');
    expect(Math.abs(s[0].z - Z)).toBeLessThan(1e-4); // ~ 23 km/s; the centre error is ~0.1 A
    expect(s[0].supporting).toBeGreaterThanOrEqual(2);
    expect(s[0].supportingIds).toEqual(expect.arrayContaining(['Hbeta', 'OIII_4960']));
    expect(s[0].supportingIds).not.toContain('OIII_5008');
    expect(s[0].supporting).toBeGreaterThan(s[1].supporting);
    // Only emission lines are offered for an emission feature, all within the default z range.
    for (const x of s) {
      expect(lineById(x.lineId)!.kind).toBe('emission');
      expect(x.z).toBeGreaterThanOrEqual(-0.005);
      expect(x.z).toBeLessThanOrEqual(7);
      expect(x.z).toBeCloseTo(f.centreA / x.restA - 1, 12);
      expect(x.supporting).toBe(x.supportingIds.length);
    }
    // Sorted: supporting never increases down the list.
    for (let i = 1; i < s.length; i++) expect(s[i].supporting).toBeLessThanOrEqual(s[i - 1].supporting);
  });

  it('a lone broad Mg II line at z = 1.2 stays ambiguous: several suggestions, Mg II among them', () => {
    const lam = 2.2 * lineById('MgII')!.restA;
    const q = synthSpectrum({
      lambdaMinA: 3800, lambdaMaxA: 9200, continuum: (l) => 10 * (l / 5000) ** -1.5,
      lines: [{ centreA: lam, flux: 3000, fwhmKms: 4000 }], noise: 0.2, seed: 8,
    });
    const f = locateFeature(q, lam + 20, 150)!;
    expect(f.kind).toBe('emission');
    const s = suggestLines(q, f.centreA, 'emission');
    expect(s.length).toBeGreaterThanOrEqual(5);
    const mg = s.find((x) => x.lineId === 'MgII')!;
    expect(mg.z).toBeCloseTo(1.2, 3);
    // No hypothesis is confirmed by other lines (nothing else was injected).
    expect(Math.max(...s.map((x) => x.supporting))).toBe(0);
    // With no support the catalogue strength orders the list: Ly-alpha (strength 1) first.
    expect(s[0].lineId).toBe('LyA');
    // A narrower z range removes the high-z readings.
    const low = suggestLines(q, f.centreA, 'emission', { zMax: 1.5 });
    expect(low.every((x) => x.z <= 1.5)).toBe(true);
    expect(low.some((x) => x.lineId === 'MgII')).toBe(true);
    expect(low.some((x) => x.lineId === 'LyA')).toBe(false);
  });

  it('offers only absorption lines for a trough', () => {
    const lam = 1.1 * lineById('CaK')!.restA;
    const s = synthSpectrum({
      lambdaMinA: 3800, lambdaMaxA: 9200, continuum: () => 50, noise: 0.3, seed: 12,
      lines: ['CaK', 'CaH', 'Gband', 'Mgb', 'NaD'].map((id) => ({ centreA: 1.1 * lineById(id)!.restA, flux: -200, fwhmKms: 500 })),
    });
    const sug = suggestLines(s, lam, 'absorption');
    // Every absorption line whose implied z lies in -0.005..7 (Mg b and Na D would need z < 0).
    const inRange = LINES.filter((l) => l.kind === 'absorption' && lam / l.restA - 1 >= -0.005);
    expect(sug.map((x) => x.lineId).sort()).toEqual(inRange.map((l) => l.id).sort());
    expect(sug[0].lineId).toBe('CaK');
    expect(sug[0].z).toBeCloseTo(0.1, 9);
    expect(sug[0].supportingIds).toEqual(expect.arrayContaining(['CaH', 'Gband', 'Mgb', 'NaD']));
  });

  it('on a real SDSS galaxy (spec-0266-51630-0168), a click on H-alpha gives H-alpha at the survey z', () => {
    // Survey redshift z = 0.067406 (SDSS file header; test/data/lines/README.md).
    const zSurvey = 0.067406;
    const text = readFileSync(new URL('../../data/lines/spec-0266-51630-0168.csv', import.meta.url), 'utf8');
    const spec = parseSimpleCsv(text, 'spec-0266-51630-0168.csv');
    const f = locateFeature(spec, 7004)!;
    expect(f.kind).toBe('emission');
    const s = suggestLines(spec, f.centreA, f.kind);
    expect(s[0].lineId).toBe('Halpha');
    expect(Math.abs(((s[0].z - zSurvey) / (1 + zSurvey)) * C_KMS)).toBeLessThan(100);
    expect(s[0].supporting).toBeGreaterThanOrEqual(3);
  });
});

describe('a broad quasar line (demo spectrum MRX-0243; truth: qso at z = 0.98, sample-spectra/truth.csv)', () => {
  const bytes = new Uint8Array(readFileSync(new URL('../../../sample-spectra/mrx-0243.txt', import.meta.url)));
  const spec = readSpectrum(bytes, 'mrx-0243.txt');
  const zTrue = 0.98;
  const mgObs = (1 + zTrue) * lineById('MgII')!.restA;

  it('is found from a click near its peak, with a broad width', () => {
    const f = locateFeature(spec, mgObs + 5)!;
    expect(f).not.toBeNull();
    expect(f.kind).toBe('emission');
    expect(Math.abs(f.centreA - mgObs)).toBeLessThan(10);
    expect((f.fwhmA / f.centreA) * C_KMS).toBeGreaterThan(1500); // broad: FWHM > 1000-2000 km/s (common practice)
  });

  it('is offered only broad-line identifications, Mg II among them at the true z', () => {
    const f = locateFeature(spec, mgObs + 5)!;
    const s = suggestLines(spec, f.centreA, f.kind);
    expect(s.every((x) => lineById(x.lineId)!.roles.includes('qso-broad'))).toBe(true);
    const mg = s.find((x) => x.lineId === 'MgII')!;
    expect(Math.abs(mg.z - zTrue) / (1 + zTrue)).toBeLessThan(0.003);
  });
});
