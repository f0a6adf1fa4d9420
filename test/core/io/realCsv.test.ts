/**
 * The text reader on real survey spectra (SDSS, BOSS/eBOSS, LAMOST; attribution in
 * test/data/real-spectra/README.md). Expected pixel counts, wavelength ranges and
 * redshifts come from MANIFEST.tsv, i.e. from the surveys' own files.
 */
import { describe, expect, it } from 'vitest';
import { readFileSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import { readTextSpectrum } from '../../../src/core/io/text';
import type { Spectrum } from '../../../src/core/types';
import { parseManifest, readManifest, REAL_SPECTRA_DIR, type ManifestRow } from '../../helpers/manifest';

const CSV_DIR = join(REAL_SPECTRA_DIR, 'csv');
const manifest = readManifest();
const byName = new Map(manifest.map((r) => [r.name, r]));
const cache = new Map<string, Spectrum>();
function load(name: string): Spectrum {
  let s = cache.get(name);
  if (!s) {
    s = readTextSpectrum(readFileSync(join(CSV_DIR, `${name}.csv`)), `${name}.csv`);
    cache.set(name, s);
  }
  return s;
}

/** Rest vacuum wavelengths, Angstrom: reference.md sec. 1 (SDSS line table / Vanden Berk et al. 2001, AJ 122, 549). */
const REST_A = { Halpha: 6564.61, OIII_5008: 5008.24, MgII: 2798.75, CIV: 1549.06 } as const;

/** Offset in pixels between the brightest good pixel within +-15 pixels of `obsA` and the pixel nearest `obsA`. */
function peakOffsetPixels(s: Spectrum, obsA: number): number {
  const wl = s.wavelengthA;
  let k = 0;
  while (k < wl.length - 1 && Math.abs(wl[k + 1] - obsA) < Math.abs(wl[k] - obsA)) k++;
  let best = -1;
  for (let i = Math.max(0, k - 15); i <= Math.min(wl.length - 1, k + 15); i++) {
    if (s.ivar![i] > 0 && s.mask[i] === 0 && (best < 0 || s.flux[i] > s.flux[best])) best = i;
  }
  return best - k;
}

describe('real CSV spectra (MANIFEST.tsv)', () => {
  it('has one CSV per manifest row and no other', () => {
    const files = readdirSync(CSV_DIR).filter((f) => f.endsWith('.csv')).map((f) => f.slice(0, -4)).sort();
    expect(files).toEqual(manifest.map((r) => r.name).sort());
    expect(files.length).toBe(58); // README: 58 spectra
  });

  it.each(manifest.map((r) => [r.name, r] as [string, ManifestRow]))('%s reads with the manifest pixel count and range', (name, row) => {
    const s = load(name);
    expect(s.format).toBe('text');
    expect(s.wavelengthA.length).toBe(row.nPix);
    // The manifest rounds to 0.01 A; the CSV carries 4 decimals.
    expect(Math.abs(s.wavelengthA[0] - row.lambdaMinA)).toBeLessThanOrEqual(0.0051);
    expect(Math.abs(s.wavelengthA[s.wavelengthA.length - 1] - row.lambdaMaxA)).toBeLessThanOrEqual(0.0051);
    expect(s.ivar).not.toBeNull();
    expect(s.meta.convertedFromAir).toBeUndefined(); // the column says vacuum
    let good = 0;
    for (let i = 0; i < s.flux.length; i++) if (s.ivar![i] > 0) good++;
    expect(good).toBeGreaterThan(row.nPix / 2);
  });

  // Every emission-line galaxy (survey subclass STARFORMING or STARBURST in the manifest notes):
  // H-alpha is the brightest pixel within 2 pixels (~140 km/s) of (1 + z) * 6564.61.
  const emissionGalaxies = manifest.filter((r) => r.class === 'galaxy' && /subclass=(STARFORMING|STARBURST)\b/.test(r.notes));
  it('finds eight emission-line galaxies in the manifest', () => {
    expect(emissionGalaxies.length).toBe(8);
  });
  it.each(emissionGalaxies.map((r) => [r.name, r.zTrue]))('%s: H-alpha peak at (1 + %f) * 6564.61 A', (name, z) => {
    expect(Math.abs(peakOffsetPixels(load(name), (1 + z) * REST_A.Halpha))).toBeLessThanOrEqual(2);
  });

  // A few bright quasars, chosen by hand. Broad-line peaks sit up to a few hundred km/s from the
  // systemic redshift (README cautions), so the tolerance is 3 pixels (~210 km/s) and this is not
  // claimed for every quasar.
  it.each([
    ['spec-6717-56397-0534', 'OIII_5008'],
    ['spec-3655-55240-0258', 'MgII'],
    ['spec-3655-55240-0340', 'MgII'],
    ['spec-3655-55240-0686', 'CIV'],
  ] as const)('%s: %s peak within 3 pixels of (1 + z_true) * rest', (name, line) => {
    const row = byName.get(name)!;
    expect(row.class).toBe('qso');
    expect(Math.abs(peakOffsetPixels(load(name), (1 + row.zTrue) * REST_A[line]))).toBeLessThanOrEqual(3);
  });

  it('puts H-alpha of a galaxy at the wrong place when the redshift is wrong (the check can fail)', () => {
    const row = byName.get('spec-0854-52373-0369')!;
    expect(Math.abs(peakOffsetPixels(load(row.name), (1 + row.zTrue + 0.003) * REST_A.Halpha))).toBeGreaterThan(2);
  });
});

describe('parseManifest(text)', () => {
  const header = 'name\tsurvey\tclass\tz_true\tz_err\tquality\tn_pix\tlambda_min\tlambda_max\tnotes';
  it('reads typed rows', () => {
    expect(parseManifest(`${header}\nx\tS\tqso\t1.5\t1e-4\tok\t10\t3800.5\t9000\tn\n`)).toEqual([
      { name: 'x', survey: 'S', class: 'qso', zTrue: 1.5, zErr: 1e-4, quality: 'ok', nPix: 10, lambdaMinA: 3800.5, lambdaMaxA: 9000, notes: 'n' },
    ]);
  });
  it('refuses a malformed row', () => {
    expect(() => parseManifest(`${header}\nx\tS\tqso\tabc\t1\tok\t10\t1\t2\tn`)).toThrow(/z_true 'abc'/);
    expect(() => parseManifest(`${header}\nx\tS\tqso`)).toThrow(/3 fields/);
  });
});
