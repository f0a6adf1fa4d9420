/**
 * The bundled demo set (sample-spectra/): every spectrum reads and matches
 * truth.csv; every broken file is refused with the expected message; and the
 * set is exactly what buildSampleSet(SAMPLE_SEED) produces.
 * Check values: truth.csv, written by the same generator (internal consistency,
 * not an external source); the air/vacuum conversion is checked twice (the
 * simulator's and the reader's own code).
 */
import { describe, it, expect } from 'vitest';
import { readFileSync, readdirSync, statSync } from 'node:fs';
import { join, dirname } from 'node:path';
import { fileURLToPath } from 'node:url';
import { readSpectrum } from '../../../src/core/io/readSpectrum';
import { SpectrumReadError } from '../../../src/core/types';
import { buildSampleSet, parseTruthCsv, SAMPLE_SEED } from '../../../src/core/sim/sampleSet';
import { PLATE_NAME, PLATE_TRUTH_NAME } from '../../../src/core/sim/samplePlate';

const dir = join(dirname(fileURLToPath(import.meta.url)), '..', '..', '..', 'sample-spectra');
const truth = parseTruthCsv(readFileSync(join(dir, 'truth.csv'), 'utf8'));
const spectra = truth.filter((t) => t.layout !== 'broken');
const broken = truth.filter((t) => t.layout === 'broken');

function listFiles(d: string, prefix = ''): string[] {
  return readdirSync(d).flatMap((e) => (statSync(join(d, e)).isDirectory() ? listFiles(join(d, e), `${prefix}${e}/`) : [`${prefix}${e}`]));
}

describe('sample-spectra/', () => {
  it('has at least 40 spectra, every class, and every layout at least twice', () => {
    expect(spectra.length).toBeGreaterThanOrEqual(40);
    expect(new Set(spectra.map((t) => t.class))).toEqual(new Set(['qso', 'galaxy-sf', 'galaxy-passive', 'star']));
    const counts = new Map<string, number>();
    for (const t of spectra) counts.set(t.layout, (counts.get(t.layout) ?? 0) + 1);
    expect(counts.size).toBe(18);
    for (const c of counts.values()) expect(c).toBeGreaterThanOrEqual(2);
    const zq = spectra.filter((t) => t.class === 'qso').map((t) => t.z);
    expect(Math.min(...zq)).toBeLessThan(0.3);
    expect(Math.max(...zq)).toBeGreaterThan(4.9);
  });

  it('lists every file in truth.csv and nothing else (besides README.md, truth.csv and the plate with its own truth, test/core/io/samplePlate.test.ts)', () => {
    const apart = ['README.md', 'truth.csv', PLATE_NAME, PLATE_TRUTH_NAME];
    const onDisk = listFiles(dir).filter((f) => !apart.includes(f)).sort();
    expect(onDisk).toEqual(truth.map((t) => t.file).sort());
  });

  it('stays small (< 8 MB)', () => {
    const total = listFiles(dir).reduce((s, f) => s + statSync(join(dir, f)).size, 0);
    expect(total).toBeLessThan(8e6);
  });

  it.each(spectra.map((t) => [t.file, t] as const))('%s reads and matches truth.csv', (file, t) => {
    const s = readSpectrum(new Uint8Array(readFileSync(join(dir, file))), file);
    expect(s.file).toBe(file);
    expect(s.wavelengthA.length).toBe(t.nPix);
    expect(s.flux.length).toBe(t.nPix);
    // Text rounds wavelengths to 0.001 A (air nm files to 1e-4 nm); float64 WCS keywords are exact.
    expect(Math.abs(s.wavelengthA[0] - t.waveMinA)).toBeLessThan(0.005);
    expect(Math.abs(s.wavelengthA[t.nPix - 1] - t.waveMaxA)).toBeLessThan(0.005);
    expect(Boolean(s.meta.convertedFromAir)).toBe(t.air === 1);
    if (t.idInFile) expect(s.meta.objectId).toBe(t.objectId);
    expect(s.ivar).not.toBeNull();
    expect(s.mask.some((m) => m === 1) || s.ivar!.some((v) => v === 0)).toBe(true); // bad columns survive
  });

  it('every file gives back the simulated flux and inverse variance', () => {
    const { simulated } = buildSampleSet(SAMPLE_SEED);
    for (const t of spectra) {
      const sim = simulated.get(t.file)!.spectrum;
      const s = readSpectrum(new Uint8Array(readFileSync(join(dir, t.file))), t.file);
      let worstFlux = 0;
      let worstIvar = 0;
      for (let i = 0; i < t.nPix; i++) {
        const iv = sim.ivar![i];
        if (iv === 0) {
          expect(s.ivar![i]).toBe(0);
          continue;
        }
        // Flux difference in units of the pixel's sigma: text keeps 5 significant digits,
        // BITPIX 16 quantises to 1/65000 of the range, float32 to 6e-8 relative.
        worstFlux = Math.max(worstFlux, Math.abs(s.flux[i] - sim.flux[i]) * Math.sqrt(iv));
        worstIvar = Math.max(worstIvar, Math.abs(s.ivar![i] / iv - 1));
      }
      expect(worstFlux, t.file).toBeLessThan(0.02);
      // 4 significant digits of ivar or error: <= 1e-3 relative.
      expect(worstIvar, t.file).toBeLessThan(1.1e-3);
    }
  });

  it.each(broken.map((t) => [t.file, t] as const))('%s is refused with the expected message', (file, t) => {
    const bytes = new Uint8Array(readFileSync(join(dir, file)));
    let err: unknown;
    try {
      readSpectrum(bytes, file);
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(SpectrumReadError);
    const msg = (err as SpectrumReadError).message;
    expect(msg).toContain(t.expectedError);
    expect(msg).toContain(file);
  });

  it('is byte for byte what buildSampleSet(SAMPLE_SEED) builds, twice over', () => {
    const a = buildSampleSet(SAMPLE_SEED);
    const b = buildSampleSet(SAMPLE_SEED);
    expect(a.files.map((f) => f.name)).toEqual(b.files.map((f) => f.name));
    for (let i = 0; i < a.files.length; i++) {
      expect(Buffer.compare(Buffer.from(a.files[i].bytes), Buffer.from(b.files[i].bytes))).toBe(0);
      const onDisk = readFileSync(join(dir, a.files[i].name));
      expect(Buffer.compare(Buffer.from(a.files[i].bytes), onDisk), a.files[i].name).toBe(0);
    }
  });

  it('a different seed gives different spectra', () => {
    const a = buildSampleSet(SAMPLE_SEED);
    const c = buildSampleSet(SAMPLE_SEED + 1);
    expect(Buffer.compare(Buffer.from(a.files[0].bytes), Buffer.from(c.files[0].bytes))).not.toBe(0);
  });
});
