/**
 * Every real survey FITS file in test/data/real-spectra/fits reads with the pixel
 * count and wavelength range listed in MANIFEST.tsv (SDSS and LAMOST public data
 * releases; see test/data/real-spectra/README.md for sources and terms), and its
 * flux and inverse variance agree with the CSV copies in ../csv, which were written
 * from the same files by a separate route.
 */
import { readdirSync, readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { readFits } from '../../../src/core/io/fits/readFits';

const DATA = join(dirname(fileURLToPath(import.meta.url)), '../../data/real-spectra');
const TOL_A = 0.05; // MANIFEST gives two decimals

interface Row {
  name: string;
  survey: string;
  nPix: number;
  lambdaMin: number;
  lambdaMax: number;
}
const rows: Row[] = readFileSync(join(DATA, 'MANIFEST.tsv'), 'utf8')
  .trim()
  .split('\n')
  .slice(1)
  .map((l) => l.split('\t'))
  .map((f) => ({ name: f[0], survey: f[1], nPix: Number(f[6]), lambdaMin: Number(f[7]), lambdaMax: Number(f[8]) }));
const fitsFiles = readdirSync(join(DATA, 'fits')).filter((f) => f.endsWith('.fits'));

function csvColumns(name: string): { wl: number[]; flux: number[]; ivar: number[] } | null {
  let text: string;
  try {
    text = readFileSync(join(DATA, 'csv', `${name}.csv`), 'utf8');
  } catch {
    return null;
  }
  const wl: number[] = [];
  const flux: number[] = [];
  const ivar: number[] = [];
  for (const line of text.trim().split('\n').slice(1)) {
    const [a, b, c] = line.split(',').map(Number);
    wl.push(a);
    flux.push(b);
    ivar.push(c);
  }
  return { wl, flux, ivar };
}

describe('real survey FITS files (MANIFEST.tsv)', () => {
  it('every FITS file has a MANIFEST row and there are 58 of them', () => {
    expect(fitsFiles).toHaveLength(58);
    for (const f of fitsFiles) expect(rows.some((r) => `${r.name}.fits` === f)).toBe(true);
  });

  for (const row of rows) {
    it(`${row.name} (${row.survey}): ${row.nPix} pixels, ${row.lambdaMin}-${row.lambdaMax} A`, () => {
      const s = readFits(new Uint8Array(readFileSync(join(DATA, 'fits', `${row.name}.fits`))), `${row.name}.fits`);
      const n = s.wavelengthA.length;
      expect(n).toBe(row.nPix);
      expect(Math.abs(s.wavelengthA[0] - row.lambdaMin)).toBeLessThan(TOL_A);
      expect(Math.abs(s.wavelengthA[n - 1] - row.lambdaMax)).toBeLessThan(TOL_A);
      // SDSS/BOSS: binary table with loglam in HDU 1; LAMOST: 2-D primary image (README.md).
      expect(s.format).toBe(row.survey.startsWith('LAMOST') ? 'fits-image' : 'fits-table');
      expect(s.ivar).not.toBeNull();
      expect(s.meta.convertedFromAir).toBeUndefined(); // all are vacuum wavelengths

      const csv = csvColumns(row.name);
      if (csv) {
        expect(csv.wl.length).toBe(n);
        for (let i = 0; i < n; i += 37) {
          expect(Math.abs(s.wavelengthA[i] - csv.wl[i])).toBeLessThan(1e-3);
          expect(Math.abs(s.flux[i] - csv.flux[i])).toBeLessThanOrEqual(1e-5 * Math.max(1, Math.abs(csv.flux[i])));
          expect(Math.abs(s.ivar![i] - csv.ivar[i])).toBeLessThanOrEqual(1e-5 * Math.max(1e-3, Math.abs(csv.ivar[i])));
        }
      }
    });
  }

  it('LAMOST metadata: DESIG, RA/DEC, DATE-OBS, EXPTIME, TELESCOP', () => {
    const s = readFits(new Uint8Array(readFileSync(join(DATA, 'fits', 'spec-55862-B6212_sp06-003.fits'))), 'l.fits');
    expect(s.meta).toMatchObject({ objectId: 'LAMOST J063715.90+271356.5', raDeg: 99.316263, decDeg: 27.23237, dateObs: '2011-10-27T20:02:34.19', exposureS: 3600, instrument: 'LAMOST' });
  });

  it('SDSS metadata: object position from PLUG_RA/PLUG_DEC, flux unit from BUNIT', () => {
    const s = readFits(new Uint8Array(readFileSync(join(DATA, 'fits', 'spec-0266-51602-0013.fits'))), 's.fits');
    // Header values: RA = 145.89219 (telescope boresight), PLUG_RA = 146.9341 (object).
    expect(s.meta.raDeg).toBe(146.9341);
    expect(s.meta.fluxUnit).toBe('1E-17 erg/cm^2/s/Ang');
  });
});
