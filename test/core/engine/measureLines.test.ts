import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { countDetectedFeatures, linesForClass, measureLines } from '../../../src/core/engine/measureLines';
import { lineById } from '../../../src/core/lines/catalogue';
import type { LineMeasurement, Spectrum } from '../../../src/core/types';
import { C_KMS, mean, parseSimpleCsv, std, synthSpectrum, type SynthLine } from './lines/testKit';

const Z = 0.3;
const FWHM_KMS = 250;
/** Integrated fluxes (flux unit * Angstrom) of the synthetic star-forming galaxy; invented values. */
const GALAXY_FLUX: Record<string, number> = {
  OII: 400, Hbeta: 200, OIII_4960: 150, OIII_5008: 450, Halpha: 700, NII_6585: 200,
};
const continuum = (lam: number): number => 20 * (lam / 6000) ** -1;

function galaxyLines(z: number, scale = 1): SynthLine[] {
  return Object.entries(GALAXY_FLUX).map(([id, f]) => ({
    centreA: (1 + z) * lineById(id)!.restA, flux: f * scale, fwhmKms: FWHM_KMS,
  }));
}

function byId(ms: LineMeasurement[]): Map<string, LineMeasurement> {
  return new Map(ms.map((m) => [m.id, m]));
}

/** Pixel width of a dlog10 = 1e-4 grid at lambda, Angstrom: lambda ln(10) 1e-4. */
const pixA = (lam: number): number => lam * Math.LN10 * 1e-4;

describe('measureLines(spectrum, z, cls) on a synthetic galaxy at z = 0.3', () => {
  const spec = synthSpectrum({
    lambdaMinA: 4600, lambdaMaxA: 9200, continuum, lines: galaxyLines(Z), noise: 0.02, seed: 11,
  });
  const got = byId(measureLines(spec, Z, 'galaxy'));

  it('finds every injected line at high S/N, centre within 0.1 pixel of truth', () => {
    for (const id of Object.keys(GALAXY_FLUX)) {
      const m = got.get(id)!;
      expect(m, id).toBeDefined();
      expect(m.detected, id).toBe(true);
      const truth = (1 + Z) * m.restA;
      expect(Math.abs(m.observedA - truth), id).toBeLessThan(0.1 * pixA(truth));
      expect(Math.abs(m.z - Z), id).toBeLessThan(4 * m.zErr + 1e-12);
    }
  });

  it('FWHM and flux agree with the injected values within 3 errors, and EW_rest = F / C / (1+z)', () => {
    for (const [id, f] of Object.entries(GALAXY_FLUX)) {
      const m = got.get(id)!;
      expect(Math.abs(m.fwhmKms - FWHM_KMS), id).toBeLessThan(3 * m.fwhmErrKms);
      expect(Math.abs(m.flux - f), id).toBeLessThan(3 * m.fluxErr);
      // Analytic rest-frame EW of a Gaussian on the known continuum (definition of EW).
      const ew = f / continuum((1 + Z) * m.restA) / (1 + Z);
      expect(Math.abs(m.ewRestA - ew), id).toBeLessThan(3 * m.ewRestErrA);
      expect(Math.abs(m.ewRestA / ew - 1), id).toBeLessThan(0.01);
      expect(m.snr, id).toBeCloseTo(m.flux / m.fluxErr, 9);
    }
  });

  it('leaves out lines outside the coverage and measures but does not detect absent lines', () => {
    expect(got.has('NeV')).toBe(false); // 3426.85 * 1.3 = 4455 A < 4600 A
    expect(got.has('LyA')).toBe(false); // not a galaxy line, and far outside
    expect(got.has('CaK')).toBe(true); // 5115 A, absorption measured for galaxies
    for (const id of ['SII_6718', 'SII_6733', 'OI_6302', 'NeIII']) {
      expect(got.get(id), id).toBeDefined();
      expect(got.get(id)!.detected, id).toBe(false);
    }
  });

  it('absent lines without a matched-filter signal get a forced measurement at the expected centre', () => {
    // Not injected (GALAXY_FLUX): a free Gaussian would chase noise; the forced fit keeps centre and width fixed.
    const forced = [...got.values()].filter((m) => !Object.hasOwn(GALAXY_FLUX, m.id) && Number.isNaN(m.fwhmKms));
    expect(forced.length).toBeGreaterThanOrEqual(3);
    for (const m of forced) {
      expect(m.detected, m.id).toBe(false);
      expect(m.observedA, m.id).toBeCloseTo((1 + Z) * m.restA, 9);
      expect(m.z, m.id).toBeNaN();
      expect(m.fluxErr, m.id).toBeGreaterThan(0);
      // Pure noise there: the flux is consistent with zero (4 sigma, common practice).
      expect(Math.abs(m.flux), m.id).toBeLessThan(4 * m.fluxErr);
      expect(m.snr, m.id).toBeCloseTo(((m.kind === 'emission' ? 1 : -1) * m.flux) / m.fluxErr, 9);
    }
  });

  it('countDetectedFeatures counts the [O III] doublet and the H-alpha + [N II] blend once each', () => {
    const lines = [...got.values()];
    // [O II], H-beta, [O III] pair, H-alpha group = 4 (from the injected set).
    expect(countDetectedFeatures(lines)).toBe(4);
    expect(countDetectedFeatures(lines.filter((l) => l.id !== 'OII'))).toBe(3);
    expect(countDetectedFeatures([])).toBe(0);
  });

  it('with no uncertainty array, estimates the noise and still finds the centres', () => {
    const noIvar = synthSpectrum({
      lambdaMinA: 4600, lambdaMaxA: 9200, continuum, lines: galaxyLines(Z), noise: 0.02, seed: 11, noIvar: true,
    });
    const m = byId(measureLines(noIvar, Z, 'galaxy'));
    for (const id of Object.keys(GALAXY_FLUX)) {
      const l = m.get(id)!;
      expect(l.detected, id).toBe(true);
      expect(Math.abs(l.observedA - (1 + Z) * l.restA), id).toBeLessThan(0.1 * pixA(l.observedA));
      expect(l.fluxErr / got.get(id)!.fluxErr, id).toBeGreaterThan(0.7);
      expect(l.fluxErr / got.get(id)!.fluxErr, id).toBeLessThan(1.4);
    }
  });

  it('gives masked pixels zero weight, however wild their values', () => {
    const bad: Spectrum = { ...spec, flux: Float64Array.from(spec.flux), mask: Uint8Array.from(spec.mask) };
    const c = (1 + Z) * lineById('Halpha')!.restA;
    for (let i = 0; i < bad.flux.length; i++) {
      if (Math.abs(bad.wavelengthA[i] - c) < 6 && bad.wavelengthA[i] > c) {
        bad.mask[i] = 1;
        bad.flux[i] = i % 2 ? 1e5 : NaN;
      }
    }
    const ha = byId(measureLines(bad, Z, 'galaxy')).get('Halpha')!;
    expect(ha.detected).toBe(true);
    expect(Math.abs(ha.observedA - c)).toBeLessThan(0.1 * pixA(c));
    expect(Math.abs(ha.flux - GALAXY_FLUX.Halpha)).toBeLessThan(3 * ha.fluxErr);
  });
});

describe('measureLines errors over seeded noise realisations', () => {
  it('scatter of centre and flux matches the reported errors (ratio 0.7-1.4), with and without ivar', () => {
    for (const noIvar of [false, true]) {
      const rows: LineMeasurement[] = [];
      for (let k = 0; k < 60; k++) {
        const s = synthSpectrum({
          lambdaMinA: 6200, lambdaMaxA: 7000, continuum, lines: galaxyLines(Z, 0.15), noise: 0.5, seed: 300 + k, noIvar,
        });
        rows.push(measureLines(s, Z, 'galaxy').find((m) => m.id === 'OIII_5008')!);
      }
      expect(rows.every((r) => r.detected)).toBe(true);
      for (const [val, err] of [['observedA', 'observedErrA'], ['flux', 'fluxErr'], ['fwhmKms', 'fwhmErrKms']] as const) {
        const ratio = std(rows.map((r) => r[val])) / mean(rows.map((r) => r[err]));
        expect(ratio, `${val} noIvar=${noIvar}`).toBeGreaterThan(0.7);
        expect(ratio, `${val} noIvar=${noIvar}`).toBeLessThan(1.4);
      }
    }
  });
});

describe('measureLines on a synthetic quasar at z = 1.2', () => {
  const z = 1.2;
  const lines: SynthLine[] = [
    { centreA: (1 + z) * lineById('MgII')!.restA, flux: 3000, fwhmKms: 4000 },
    { centreA: (1 + z) * lineById('CIII')!.restA, flux: 2000, fwhmKms: 5000 },
  ];
  const s = synthSpectrum({
    lambdaMinA: 3800, lambdaMaxA: 9200, continuum: (l) => 10 * (l / 5000) ** -1.5, lines, noise: 0.2, seed: 21,
  });
  const got = byId(measureLines(s, z, 'qso'));

  it('fits the broad Mg II and C III] lines with their widths', () => {
    for (const [id, fwhm, flux] of [['MgII', 4000, 3000], ['CIII', 5000, 2000]] as const) {
      const m = got.get(id)!;
      expect(m.detected, id).toBe(true);
      expect(Math.abs(m.fwhmKms - fwhm), id).toBeLessThan(3 * m.fwhmErrKms);
      expect(Math.abs(m.fwhmKms / fwhm - 1), id).toBeLessThan(0.05);
      expect(Math.abs(m.flux - flux), id).toBeLessThan(3 * m.fluxErr);
      expect(Math.abs(m.z - z), id).toBeLessThan(3 * m.zErr);
    }
  });

  it('leaves out broad lines that fall outside the coverage', () => {
    expect(got.has('LyA')).toBe(false); // 2674 A
    expect(got.has('CIV')).toBe(false); // 3408 A
    expect(got.has('Hbeta')).toBe(false); // 10698 A
    expect(got.get('NeV')?.detected).toBe(false); // 7539 A, narrow, not injected
  });
});

describe('measureLines on absorption features', () => {
  const z = 0.1;
  const ids = ['CaK', 'CaH', 'Gband', 'Mgb', 'NaD'];
  const lines = ids.map((id) => ({ centreA: (1 + z) * lineById(id)!.restA, flux: -200, fwhmKms: 500 }));
  const s = synthSpectrum({ lambdaMinA: 3800, lambdaMaxA: 9200, continuum: () => 50, lines, noise: 0.3, seed: 31 });

  it('gives negative flux and EW, positive snr and detection for troughs', () => {
    const got = byId(measureLines(s, z, 'galaxy'));
    for (const id of ids) {
      const m = got.get(id)!;
      expect(m.kind, id).toBe('absorption');
      expect(m.detected, id).toBe(true);
      expect(m.flux, id).toBeLessThan(0);
      expect(m.ewRestA, id).toBeLessThan(0);
      expect(m.snr, id).toBeGreaterThan(3);
      expect(Math.abs(m.flux + 200), id).toBeLessThan(3 * m.fluxErr);
      // Analytic EW: -200 / 50 / 1.1 = -3.636 A (definition of EW).
      expect(Math.abs(m.ewRestA - -200 / 50 / 1.1), id).toBeLessThan(3 * m.ewRestErrA);
    }
    // H-epsilon emission sits on the Ca II H trough: measured, never detected as emission.
    expect(got.get('Heps')!.detected).toBe(false);
  });

  it('for a star measures only absorption features', () => {
    const got = measureLines(s, z, 'star');
    expect(got.length).toBeGreaterThan(0);
    expect(got.every((m) => m.kind === 'absorption')).toBe(true);
    expect(linesForClass('star').every((p) => p.line.roles.includes('absorption'))).toBe(true);
  });
});

describe('measureLines on a real SDSS galaxy spectrum (spec-0266-51630-0168)', () => {
  // Survey redshift from the SDSS file header, z = 0.067406 +- 1.5e-5 (test/data/lines/README.md).
  const zSurvey = 0.067406;
  const text = readFileSync(new URL('../../data/lines/spec-0266-51630-0168.csv', import.meta.url), 'utf8');
  const spec = parseSimpleCsv(text, 'spec-0266-51630-0168.csv');
  const got = byId(measureLines(spec, zSurvey, 'galaxy'));

  it('H-alpha and [O III] 5008 are detected and agree with the survey z within 100 km/s', () => {
    for (const id of ['Halpha', 'OIII_5008']) {
      const m = got.get(id)!;
      expect(m.detected, id).toBe(true);
      const dvKms = ((m.z - zSurvey) / (1 + zSurvey)) * C_KMS;
      expect(Math.abs(dvKms), id).toBeLessThan(100);
    }
    expect(countDetectedFeatures([...got.values()])).toBeGreaterThanOrEqual(4);
  });
});
