/**
 * The invented 64-fibre demo plate (src/core/sim/samplePlate.ts) through
 * readSpectra: sky and unused fibres dropped, the dead fibre refused alone,
 * every other fibre a spectrum with its id, object id and position. Check
 * values: the plate's own truth (internal consistency, not an external source)
 * and the simulator's log grid (3600 A, 1e-4 in log10 per pixel).
 */
import { describe, expect, it } from 'vitest';
import { readSpectra } from '../../../src/core/io/readSpectra';
import { readFileSync } from 'node:fs';
import { buildSamplePlate, parsePlateTruthCsv, plateTruthCsv, PLATE_DEAD_FIBRE, PLATE_FIBRES, PLATE_NAME, PLATE_TRUTH_NAME } from '../../../src/core/sim/samplePlate';
import { SAMPLE_SEED } from '../../../src/core/sim/sampleSet';
import { SpectrumReadError, type Spectrum } from '../../../src/core/types';

const { file, truth } = buildSamplePlate(SAMPLE_SEED);
const items = readSpectra(file.bytes, file.name);

describe('demo plate P01 (invented) through readSpectra', () => {
  it('has 64 fibres: 53 spectra, 1 refused (the dead fibre), 10 dropped (8 sky, 2 unused)', () => {
    expect(truth).toHaveLength(PLATE_FIBRES);
    expect(truth.filter((t) => t.expect === 'dropped')).toHaveLength(10);
    expect(items).toHaveLength(54);
    const errs = items.filter((x): x is SpectrumReadError => x instanceof SpectrumReadError);
    expect(errs.map((e) => e.file)).toEqual([`${PLATE_NAME}#${PLATE_DEAD_FIBRE}`]);
    expect(errs[0].reason).toMatch(/^no usable pixel/);
  });

  it('every spectrum is the fibre the truth says, with its object id and position', () => {
    const byId = new Map(truth.map((t) => [t.id, t]));
    const got = items.filter((x): x is Spectrum => !(x instanceof SpectrumReadError));
    expect(got.map((s) => s.file)).toEqual(truth.filter((t) => t.expect === 'spectrum').map((t) => t.id));
    for (const s of got) {
      const t = byId.get(s.file)!;
      expect(s.meta.objectId).toBe(t.objectId);
      expect(s.meta.raDeg).toBe(t.raDeg);
      expect(s.meta.decDeg).toBe(t.decDeg);
      expect(s.wavelengthA[0]).toBeCloseTo(3600, 6);
      expect(s.wavelengthA[1] / s.wavelengthA[0]).toBeCloseTo(10 ** 1e-4, 12);
      expect(s.meta.exposureS).toBe(5400);
    }
    expect(new Set(got.map((s) => byId.get(s.file)!.class))).toEqual(new Set(['qso', 'galaxy-sf', 'galaxy-passive', 'star']));
  });

  it('is the same bytes for the same seed, and under 3 MB', () => {
    expect(Buffer.from(buildSamplePlate(SAMPLE_SEED).file.bytes).equals(Buffer.from(file.bytes))).toBe(true);
    expect(file.bytes.length).toBeLessThan(3e6);
  });

  it('is in the demo set (sample-spectra/) byte for byte, with its truth table, which reads back to the truth', () => {
    const demo = new URL('../../../sample-spectra/', import.meta.url);
    expect(Buffer.from(file.bytes).equals(readFileSync(new URL(PLATE_NAME, demo)))).toBe(true);
    const text = readFileSync(new URL(PLATE_TRUTH_NAME, demo), 'utf8');
    expect(text).toBe(plateTruthCsv(truth));
    const back = parsePlateTruthCsv(text);
    expect(back.map((t) => [t.id, t.objectId, t.type, t.class, t.expect])).toEqual(truth.map((t) => [t.id, t.objectId, t.type, t.class, t.expect]));
    back.forEach((t, i) => {
      if (Number.isFinite(truth[i].z)) expect(t.z).toBeCloseTo(truth[i].z, 6);
      else expect(t.z).toBeNaN();
      expect(t.raDeg).toBeCloseTo(truth[i].raDeg, 7);
    });
  });
});
