/**
 * readSpectra: files with many spectra, built here with the project's FITS
 * writer. Synthetic data of an invented plate ('KV-17' in an invented field);
 * object ids are invented. Each row's flux carries its own row number
 * (flux = 10 + row), so a mixed-up row shows at once.
 */
import { readdirSync, readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { gzipSync } from 'fflate';
import { describe, expect, it } from 'vitest';
import { readSpectra, spectrumId, type ReadItem } from '../../../src/core/io/readSpectra';
import { readSpectrum } from '../../../src/core/io/readSpectrum';
import { airToVacuumA } from '../../../src/core/io/airVacuum';
import { writeBinTableHdu, writeEmptyPrimaryHdu, writeFitsFile, writeImageHdu, type FitsCardInput } from '../../../src/core/io/fits/write';
import { SpectrumReadError, type Spectrum } from '../../../src/core/types';
import { caught } from '../../helpers/caught';

const N_PIX = 200;
const WCS: FitsCardInput[] = [['CTYPE1', 'WAVE'], ['CUNIT1', 'Angstrom'], ['CRPIX1', 1], ['CRVAL1', 4000], ['CDELT1', 2]];
const wlAt = (i: number) => 4000 + 2 * i;

const spectra = (items: ReadItem[]): Spectrum[] => items.filter((x): x is Spectrum => !(x instanceof SpectrumReadError));
const errors = (items: ReadItem[]): SpectrumReadError[] => items.filter((x): x is SpectrumReadError => x instanceof SpectrumReadError);

/** Flux, ivar and mask planes of `rows` fibres; row r has flux 10 + r, ivar 4, mask on pixel r. */
function planes(rows: number) {
  const flux = new Float32Array(rows * N_PIX);
  const ivar = new Float32Array(rows * N_PIX);
  const mask = new Int16Array(rows * N_PIX);
  for (let r = 0; r < rows; r++) {
    for (let i = 0; i < N_PIX; i++) {
      flux[r * N_PIX + i] = 10 + r;
      ivar[r * N_PIX + i] = 4;
    }
    mask[r * N_PIX + r] = 1;
  }
  return { flux, ivar, mask };
}

/** A fibre table: FIBERID, OBJECT, OBJTYPE, RA, DEC. */
function fibreTable(types: string[]) {
  const n = types.length;
  return writeBinTableHdu({
    extname: 'FIBRES',
    nRows: n,
    columns: [
      { name: 'FIBERID', format: 'J', data: Int32Array.from({ length: n }, (_, i) => i + 1) },
      { name: 'OBJECT', format: '12A', data: types.map((_, i) => `KV17-${String(i + 1).padStart(3, '0')}`) },
      { name: 'OBJTYPE', format: '8A', data: types },
      { name: 'RA', format: 'D', data: Float64Array.from({ length: n }, (_, i) => 150 + i / 100) },
      { name: 'DEC', format: 'D', data: Float64Array.from({ length: n }, (_, i) => -2 - i / 100) },
    ],
  });
}

const TYPES_24 = Array.from({ length: 24 }, (_, i) => (i === 3 || i === 11 ? 'SKY' : i === 20 ? 'UNUSED' : 'TARGET'));

function plateFile(opts: { types?: string[]; breakRow?: number } = {}) {
  const types = opts.types ?? TYPES_24;
  const rows = types.length;
  const p = planes(rows);
  if (opts.breakRow !== undefined) p.ivar.fill(0, opts.breakRow * N_PIX, (opts.breakRow + 1) * N_PIX); // no usable pixel
  return writeFitsFile([
    writeImageHdu({ data: p.flux, axes: [N_PIX, rows], cards: [...WCS, ['OBJECT', 'KV-17 field'], ['EXPTIME', 1800], ['RA', 149.9]] }),
    writeImageHdu({ data: p.ivar, axes: [N_PIX, rows], primary: false, extname: 'IVAR' }),
    writeImageHdu({ data: p.mask, axes: [N_PIX, rows], primary: false, extname: 'MASK' }),
    fibreTable(types),
  ]);
}

describe('readSpectra: a 2-D image whose rows are fibres, with IVAR and MASK images and a fibre table', () => {
  const items = readSpectra(plateFile(), 'kv17.fits');

  it('gives one spectrum per target fibre; sky and unused fibres (the table says so) are dropped', () => {
    expect(items).toHaveLength(21);
    expect(errors(items)).toHaveLength(0);
  });

  it('ids are file#row with the 1-based row number, stable where rows were dropped', () => {
    const ids = spectra(items).map((s) => s.file);
    expect(ids.slice(0, 4)).toEqual(['kv17.fits#1', 'kv17.fits#2', 'kv17.fits#3', 'kv17.fits#5']);
    expect(ids).not.toContain('kv17.fits#4');
    expect(ids).not.toContain('kv17.fits#21');
    expect(ids[ids.length - 1]).toBe('kv17.fits#24');
    expect(spectrumId('kv17.fits', 7)).toBe('kv17.fits#7');
  });

  it('each row gets its own flux, inverse variance, mask, object id and position; the wavelength axis is shared', () => {
    for (const s of spectra(items)) {
      const row = Number(s.file.split('#')[1]) - 1;
      expect(s.format).toBe('fits-image-rows');
      expect(s.flux[0]).toBe(10 + row);
      expect(s.ivar![5]).toBe(4);
      expect(Array.from(s.mask).flatMap((m, i) => (m ? [i] : []))).toEqual([row]);
      expect(s.wavelengthA[0]).toBe(wlAt(0));
      expect(s.wavelengthA[N_PIX - 1]).toBe(wlAt(N_PIX - 1));
      expect(s.meta.objectId).toBe(`KV17-${String(row + 1).padStart(3, '0')}`);
      expect(s.meta.raDeg).toBeCloseTo(150 + row / 100, 12);
      expect(s.meta.decDeg).toBeCloseTo(-2 - row / 100, 12);
      expect(s.meta.exposureS).toBe(1800); // shared header facts stay
    }
  });

  it("the plate's own OBJECT and pointing are not given to every fibre", () => {
    const s = spectra(items)[0];
    expect(s.meta.objectId).not.toBe('KV-17 field');
    expect(s.meta.raDeg).not.toBe(149.9);
  });

  it('rows do not share arrays: changing one spectrum leaves the others alone', () => {
    const [a, b] = spectra(items);
    a.wavelengthA[0] = -1;
    expect(b.wavelengthA[0]).toBe(wlAt(0));
  });

  it('a bad row fails alone, with an error naming file#row', () => {
    const out = readSpectra(plateFile({ breakRow: 6 }), 'kv17.fits');
    expect(out).toHaveLength(21);
    const errs = errors(out);
    expect(errs).toHaveLength(1);
    expect(errs[0].file).toBe('kv17.fits#7');
    expect(errs[0].message).toMatch(/^kv17\.fits#7 \(HDU 0\): no usable pixel/);
    expect(out.indexOf(errs[0])).toBe(5); // in file order: rows 1, 2, 3, 5, 6, then 7
  });

  it('a plate whose fibres are all sky is one error naming the file', () => {
    const out = readSpectra(plateFile({ types: ['SKY', 'sky', 'Unused'] }), 'skies.fits');
    expect(out).toHaveLength(1);
    expect((out[0] as SpectrumReadError).message).toMatch(/^skies\.fits \(HDU 0\): no target spectra: all 3 rows/);
  });

  it('gzip works the same', () => {
    const gz = readSpectra(gzipSync(plateFile()), 'kv17.fits.gz');
    expect(spectra(gz).map((s) => s.file)).toEqual(spectra(items).map((s) => s.file.replace('kv17.fits', 'kv17.fits.gz')));
  });

  it('readSpectrum (the pipeline reader) is unchanged: it still refuses the 24-row image as a frame', () => {
    expect(caught(() => readSpectrum(plateFile(), 'kv17.fits')).reason).toMatch(/2-D frame/);
  });
});

describe('readSpectra: image rows without a fibre table', () => {
  it('an ERROR image of the same shape marks the rows as spectra; no object ids', () => {
    const p = planes(5);
    const err = Float32Array.from(p.ivar, (v) => 1 / Math.sqrt(v)); // error 0.5 -> ivar 4
    const file = writeFitsFile([
      writeImageHdu({ data: p.flux, axes: [N_PIX, 5], cards: WCS }),
      writeImageHdu({ data: err, axes: [N_PIX, 5], primary: false, extname: 'ERROR' }),
    ]);
    const out = spectra(readSpectra(file, 'five.fits'));
    expect(out.map((s) => s.file)).toEqual(['five.fits#1', 'five.fits#2', 'five.fits#3', 'five.fits#4', 'five.fits#5']);
    expect(out[4].flux[0]).toBe(14);
    expect(out[4].ivar![0]).toBeCloseTo(4, 5);
    expect(out[4].meta.objectId).toBeUndefined();
  });

  it('a per-row WAVELENGTH image gives each row its own wavelengths', () => {
    const p = planes(3);
    const wl = Float64Array.from({ length: 3 * N_PIX }, (_, k) => 5000 + 100 * Math.floor(k / N_PIX) + (k % N_PIX));
    const file = writeFitsFile([
      writeImageHdu({ data: p.flux, axes: [N_PIX, 3] }),
      writeImageHdu({ data: p.ivar, axes: [N_PIX, 3], primary: false, extname: 'IVAR' }),
      writeImageHdu({ data: wl, axes: [N_PIX, 3], primary: false, extname: 'WAVELENGTH' }),
    ]);
    const out = spectra(readSpectra(file, 'w.fits'));
    expect(out.map((s) => s.wavelengthA[0])).toEqual([5000, 5100, 5200]);
  });

  it('APIDn keywords mark the rows of a 2-D image as apertures and name them', () => {
    const p = planes(3);
    const cards: FitsCardInput[] = [...WCS, ['APNUM1', '1 1'], ['APID1', 'KV17-A'], ['APID2', 'KV17-B'], ['APID3', 'KV17-C']];
    const out = spectra(readSpectra(writeFitsFile([writeImageHdu({ data: p.flux, axes: [N_PIX, 3], cards })]), 'ap.fits'));
    expect(out.map((s) => s.meta.objectId)).toEqual(['KV17-A', 'KV17-B', 'KV17-C']);
    expect(out[2].ivar).toBeNull();
  });

  it('a 2-D image whose rows EXTEN0 describes stays one spectrum (flux and inverse variance rows)', () => {
    const p = planes(2);
    const cards: FitsCardInput[] = [...WCS, ['EXTEN0', 'Flux Inverse']];
    const out = readSpectra(writeFitsFile([writeImageHdu({ data: p.flux.map((v, k) => (k < N_PIX ? v : 4)), axes: [N_PIX, 2], cards })]), 'one.fits');
    expect(out).toHaveLength(1);
    expect((out[0] as Spectrum).file).toBe('one.fits');
    expect((out[0] as Spectrum).ivar![0]).toBe(4);
  });

  it('a multi-row image without any wavelength axis is one error naming the file and keyword', () => {
    const p = planes(4);
    const file = writeFitsFile([
      writeImageHdu({ data: p.flux, axes: [N_PIX, 4] }),
      writeImageHdu({ data: p.ivar, axes: [N_PIX, 4], primary: false, extname: 'IVAR' }),
    ]);
    const out = readSpectra(file, 'nowave.fits');
    expect(out).toHaveLength(1);
    expect((out[0] as SpectrumReadError).message).toMatch(/^nowave\.fits \(HDU 0, keyword CTYPE1\): no wavelength axis/);
  });
});

describe('readSpectra: a 3-D image of pixels x spectra x planes', () => {
  const cube = (cards: FitsCardInput[], planesData: Float32Array[]) => {
    const data = new Float32Array(planesData.length * planesData[0].length);
    planesData.forEach((p, k) => data.set(p, k * p.length));
    return writeFitsFile([writeImageHdu({ data, axes: [N_PIX, 4, planesData.length], cards: [...WCS, ...cards] })]);
  };

  it('BANDIDn names the planes (a sigma plane is the error); a fibre table gives ids', () => {
    const p = planes(4);
    const sigma = new Float32Array(4 * N_PIX).fill(0.25); // ivar 16
    const raw = new Float32Array(4 * N_PIX).fill(999);
    const data = cube(
      [['BANDID1', 'raw - no background subtraction'], ['BANDID2', 'spectrum - background fit'], ['BANDID3', 'sigma - background fit']],
      [raw, p.flux, sigma],
    );
    const file = new Uint8Array([...data, ...fibreTable(['TARGET', 'SKY', 'TARGET', 'TARGET'])]);
    const out = spectra(readSpectra(file, 'cube.fits'));
    expect(out.map((s) => s.file)).toEqual(['cube.fits#1', 'cube.fits#3', 'cube.fits#4']);
    expect(out.map((s) => s.flux[0])).toEqual([10, 12, 13]);
    expect(out[0].ivar![0]).toBe(16);
    expect(out[1].meta.objectId).toBe('KV17-003');
  });

  it('without BANDIDn: plane 1 flux, plane 2 uncertainty, plane 3 a mask of whole numbers', () => {
    const p = planes(4);
    const out = spectra(readSpectra(cube([], [p.flux, p.ivar, Float32Array.from(p.mask)]), 'cube2.fits'));
    expect(out).toHaveLength(4);
    expect(out[2].flux[0]).toBe(12);
    expect(Array.from(out[2].mask).flatMap((m, i) => (m ? [i] : []))).toEqual([2]);
  });
});

describe('readSpectra: a binary table with one row per object and array columns', () => {
  /** 6 objects; row 5 is sky; row 3 has a wavelength that goes down (a bad row). */
  function objectTable(opts: { badRow?: boolean; air?: boolean } = {}) {
    const n = 6;
    const types = ['QSO', 'GALAXY', 'QSO', 'STAR', 'SKY', 'QSO'];
    const wave = new Float64Array(n * N_PIX);
    const flux = new Float32Array(n * N_PIX);
    const ivar = new Float32Array(n * N_PIX).fill(9);
    const mask = new Uint8Array(n * N_PIX);
    for (let r = 0; r < n; r++) {
      for (let i = 0; i < N_PIX; i++) {
        wave[r * N_PIX + i] = 400 + r + 0.2 * i; // nm: each object its own grid
        flux[r * N_PIX + i] = 10 + r;
      }
      mask[r * N_PIX + 10] = r % 2;
    }
    if (opts.badRow) wave[2 * N_PIX + 50] = 0; // row 3: wavelength goes down
    return writeFitsFile([
      writeEmptyPrimaryHdu([['TELESCOP', 'invented 4-m'], ['DATE-OBS', '2031-02-03']]),
      writeBinTableHdu({
        extname: 'SPECTRA',
        nRows: n,
        columns: [
          // 64-bit ids beyond 2^53 must come out exactly.
          { name: 'TARGETID', format: 'K', data: BigInt64Array.from({ length: n }, (_, i) => 39000000000000001n + BigInt(i)) },
          { name: 'OBJTYPE', format: '6A', data: types },
          { name: 'RA_OBJ', format: 'D', data: Float64Array.from({ length: n }, (_, i) => 10 + i) },
          { name: 'DEC_OBJ', format: 'D', data: Float64Array.from({ length: n }, (_, i) => 20 + i) },
          { name: opts.air ? 'WAVELENGTH_AIR' : 'WAVELENGTH', format: `${N_PIX}D`, unit: 'nm', data: wave },
          { name: 'FLUX', format: `${N_PIX}E`, unit: '1e-17 erg/s/cm2/A', data: flux },
          { name: 'IVAR', format: `${N_PIX}E`, data: ivar },
          { name: 'MASK', format: `${N_PIX}B`, data: mask },
        ],
      }),
    ]);
  }

  it('one spectrum per object row, sky rows dropped, 64-bit object ids exact, positions and units read', () => {
    const out = spectra(readSpectra(objectTable(), 'mos.fits'));
    expect(out.map((s) => s.file)).toEqual(['mos.fits#1', 'mos.fits#2', 'mos.fits#3', 'mos.fits#4', 'mos.fits#6']);
    expect(out.map((s) => s.meta.objectId)).toEqual(['39000000000000001', '39000000000000002', '39000000000000003', '39000000000000004', '39000000000000006']);
    const s = out[1];
    expect(s.format).toBe('fits-table-rows');
    expect(s.wavelengthA[0]).toBeCloseTo(4010, 9); // 401 nm
    expect(s.wavelengthA[1]).toBeCloseTo(4012, 9);
    expect(s.flux[0]).toBe(11);
    expect(s.ivar![0]).toBe(9);
    expect(s.mask[10]).toBe(1);
    expect(s.meta.raDeg).toBe(11);
    expect(s.meta.decDeg).toBe(21);
    expect(s.meta.fluxUnit).toBe('1e-17 erg/s/cm2/A');
    expect(s.meta.dateObs).toBe('2031-02-03');
  });

  it('a bad row fails alone, naming file#row, HDU and the problem', () => {
    const out = readSpectra(objectTable({ badRow: true }), 'mos.fits');
    expect(out).toHaveLength(5);
    const errs = errors(out);
    expect(errs.map((e) => e.file)).toEqual(['mos.fits#3']);
    expect(errs[0].message).toMatch(/^mos\.fits#3 \(HDU 1\): wavelength of pixel 51 is 0, not positive/);
    expect(spectra(out)).toHaveLength(4);
  });

  it('air wavelengths are converted to vacuum per row (Morton 2000, as for single spectra)', () => {
    const s = spectra(readSpectra(objectTable({ air: true }), 'air.fits'))[0];
    expect(s.wavelengthA[0]).toBeCloseTo(airToVacuumA(4000), 9);
    expect(s.meta.convertedFromAir).toBe(true);
  });

  it('without a wavelength column the header axis (COEFF0/COEFF1, log10) is shared by all rows', () => {
    const n = 3;
    const file = writeFitsFile([
      writeEmptyPrimaryHdu(),
      writeBinTableHdu({
        nRows: n,
        cards: [['COEFF0', 3.6], ['COEFF1', 1e-4]],
        columns: [
          { name: 'NAME', format: '8A', data: ['KV-a', 'KV-b', 'KV-c'] },
          { name: 'FLUX', format: `${N_PIX}E`, data: new Float32Array(n * N_PIX).fill(1) },
          { name: 'ERR', format: `${N_PIX}E`, data: new Float32Array(n * N_PIX).fill(0.5) },
        ],
      }),
    ]);
    const out = spectra(readSpectra(file, 'shared.fits'));
    expect(out.map((s) => s.meta.objectId)).toEqual(['KV-a', 'KV-b', 'KV-c']);
    // lambda_i = 10^(COEFF0 + COEFF1 i), i 0-based (reference.md sec. 8, log-linear convention).
    expect(out[2].wavelengthA[1]).toBeCloseTo(10 ** 3.6001, 8);
    expect(out[2].ivar![0]).toBe(4);
  });

  it('readSpectrum (the pipeline reader) still refuses a table of several array rows', () => {
    expect(caught(() => readSpectrum(objectTable(), 'mos.fits')).reason).toMatch(/several spectra in one table/);
  });

  it('array columns of different lengths make the whole file an error naming the column', () => {
    const file = writeFitsFile([
      writeEmptyPrimaryHdu(),
      writeBinTableHdu({
        nRows: 2,
        columns: [
          { name: 'WAVE', format: `${N_PIX}D`, data: new Float64Array(2 * N_PIX).map((_, k) => 4000 + (k % N_PIX)) },
          { name: 'FLUX', format: `${N_PIX}E`, data: new Float32Array(2 * N_PIX) },
          { name: 'IVAR', format: '10E', data: new Float32Array(20) },
        ],
      }),
    ]);
    const out = readSpectra(file, 'ragged.fits');
    expect(out).toHaveLength(1);
    expect((out[0] as SpectrumReadError).where.column).toBe('IVAR');
  });
});

describe('readSpectra: files with one spectrum', () => {
  const DATA = join(dirname(fileURLToPath(import.meta.url)), '../../data/real-spectra');
  const same = (a: Spectrum, b: Spectrum) => {
    expect(a.file).toBe(b.file);
    expect(a.format).toBe(b.format);
    expect(Array.from(a.wavelengthA)).toEqual(Array.from(b.wavelengthA));
    expect(Array.from(a.flux)).toEqual(Array.from(b.flux));
    expect(a.ivar && Array.from(a.ivar)).toEqual(b.ivar && Array.from(b.ivar));
    expect(Array.from(a.mask)).toEqual(Array.from(b.mask));
    expect(a.meta).toEqual(b.meta);
  };

  for (const name of ['spec-55862-B6212_sp06-003.fits', 'spec-0266-51630-0168.fits', 'spec-3655-55240-0110.fits']) {
    it(`real file ${name} (one spectrum; see test/data/real-spectra/README.md) gives exactly what readSpectrum gives`, () => {
      const bytes = new Uint8Array(readFileSync(join(DATA, 'fits', name)));
      const out = readSpectra(bytes, name);
      expect(out).toHaveLength(1);
      same(out[0] as Spectrum, readSpectrum(bytes, name));
    });
  }

  it('every real survey FITS file in test/data/real-spectra/fits is one spectrum with its plain name', () => {
    const names = readdirSync(join(DATA, 'fits')).filter((f) => f.endsWith('.fits'));
    expect(names.length).toBe(58); // MANIFEST.tsv
    for (const name of names) {
      const out = readSpectra(new Uint8Array(readFileSync(join(DATA, 'fits', name))), name);
      expect(out.length, name).toBe(1);
      expect((out[0] as Spectrum).file, name).toBe(name);
    }
  });

  it('a text file gives one spectrum, and a broken file one error, with the plain file name', () => {
    const ok = readSpectra(new TextEncoder().encode('wave,flux\n4000,1\n4001,2\n'), 'a.csv');
    expect((ok[0] as Spectrum).file).toBe('a.csv');
    const bad = readSpectra(new TextEncoder().encode('wave,flux\n4000,1\n3999,2\n4005,3\n'), 'b.csv');
    expect(bad).toHaveLength(1);
    expect((bad[0] as SpectrumReadError).message).toBe(caught(() => readSpectrum(new TextEncoder().encode('wave,flux\n4000,1\n3999,2\n4005,3\n'), 'b.csv')).message);
  });
});
