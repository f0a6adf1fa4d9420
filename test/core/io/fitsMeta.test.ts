import { describe, expect, it } from 'vitest';
import { metaFromHeaders, objectIdFromHeaders, parseSexagesimal } from '../../../src/core/io/fits/meta';
import { plateMjdFibreId } from '../../../src/core/io/objectId';
import { readHeader } from '../../../src/core/io/fits/header';
import { readFits } from '../../../src/core/io/fits/readFits';
import { writeFitsFile, writeImageHdu, type FitsCardInput } from '../../../src/core/io/fits/write';

const headerOf = (cards: FitsCardInput[]) => readHeader(writeImageHdu({ data: new Float32Array(2), cards }), 0, 'f', 0).header;

describe('parseSexagesimal(text)', () => {
  // Arithmetic: h + m/60 + s/3600 (common practice).
  it('reads colon- and space-separated and letter-marked forms', () => {
    expect(parseSexagesimal('12:30:00')).toBe(12.5);
    expect(parseSexagesimal('-05 30 00.0')).toBe(-5.5);
    expect(parseSexagesimal('-00:30:00')).toBe(-0.5);
    expect(parseSexagesimal('06h37m15.90s')).toBeCloseTo(6 + 37 / 60 + 15.9 / 3600, 12);
    expect(parseSexagesimal('+27d13m56.5s')).toBeCloseTo(27 + 13 / 60 + 56.5 / 3600, 12);
    expect(parseSexagesimal('145.89219')).toBe(145.89219);
  });
  it('refuses minutes or seconds of 60 or more and non-angles', () => {
    expect(parseSexagesimal('12:61:00')).toBeUndefined();
    expect(parseSexagesimal('noon')).toBeUndefined();
  });
});

describe('metaFromHeaders(headers, fluxUnit)', () => {
  it('reads OBJECT, RA/DEC in degrees, DATE-OBS, EXPTIME, INSTRUME, BUNIT', () => {
    const h = headerOf([
      ['OBJECT', 'SMK-0042'],
      ['RA', 187.5],
      ['DEC', -5.5],
      ['DATE-OBS', '2031-04-05T01:02:03'],
      ['EXPTIME', 1200.5],
      ['INSTRUME', 'SPECTROGRAPH-B'],
      ['TELESCOP', 'T1'],
      ['BUNIT', 'erg/s/cm2/A'],
    ]);
    expect(metaFromHeaders([h])).toEqual({
      objectId: 'SMK-0042',
      raDeg: 187.5,
      decDeg: -5.5,
      dateObs: '2031-04-05T01:02:03',
      exposureS: 1200.5,
      instrument: 'SPECTROGRAPH-B',
      fluxUnit: 'erg/s/cm2/A',
    });
  });

  it('sexagesimal RA strings are hours, DEC strings degrees', () => {
    const m = metaFromHeaders([headerOf([['RA', '12:30:00.0'], ['DEC', '-05:30:00']])]);
    expect(m.raDeg).toBe(187.5);
    expect(m.decDeg).toBe(-5.5);
  });

  it('falls back to OBJNAME, EXPOSURE and TELESCOP; the first header wins', () => {
    const ext = headerOf([['OBJNAME', 'from-ext']]);
    const primary = headerOf([['OBJECT', 'from-primary'], ['EXPOSURE', 300], ['TELESCOP', 'T2']]);
    expect(metaFromHeaders([ext, primary])).toEqual({ objectId: 'from-ext', exposureS: 300, instrument: 'T2' });
  });

  it('PLUG_RA/PLUG_DEC (object position) beat RA/DEC (telescope pointing in fibre-fed files)', () => {
    const m = metaFromHeaders([headerOf([['RA', 145.89], ['DEC', 0.05], ['PLUG_RA', 146.93], ['PLUG_DEC', -0.67]])]);
    expect(m.raDeg).toBe(146.93);
    expect(m.decDeg).toBe(-0.67);
  });

  it('a table flux unit overrides BUNIT', () => {
    expect(metaFromHeaders([headerOf([['BUNIT', 'counts']])], 'Jy').fluxUnit).toBe('Jy');
  });

  it('reaches the Spectrum through readFits', () => {
    const cards: FitsCardInput[] = [['CRVAL1', 4000], ['CDELT1', 1], ['OBJECT', 'SMK-7'], ['OBJID', 99]];
    const s = readFits(writeFitsFile([writeImageHdu({ data: new Float32Array([1, 2]), cards })]), 'm.fits');
    expect(s.meta.objectId).toBe('SMK-7');
  });
});

describe('object id from survey numbers (objectIdFromHeaders)', () => {
  // Header values of the real file spec-0266-51630-0168.fits (test/data/real-spectra); the survey pads
  // plate, MJD and fibre to 4, 5 and 4 digits in that file name.
  it('builds plate-MJD-fibre, zero-padded, from PLATEID, MJD and FIBERID when no name keyword exists', () => {
    expect(objectIdFromHeaders([headerOf([['PLATEID', 266], ['MJD', 51630], ['FIBERID', 168]])])).toBe('0266-51630-0168');
  });
  it('keeps every digit of wider numbers (spec-10656-58163-0366.fits)', () => {
    expect(objectIdFromHeaders([headerOf([['PLATEID', 10656], ['MJD', 58163], ['FIBERID', 366]])])).toBe('10656-58163-0366');
  });
  it('takes PLATE and FIBER too, and numbers spread over the data and primary headers', () => {
    const ext = headerOf([['FIBER', 7]]);
    const primary = headerOf([['PLATE', '0412'], ['MJD', 51871]]);
    expect(objectIdFromHeaders([ext, primary])).toBe('0412-51871-0007');
  });
  it('a name keyword wins over the numbers; the designation over an input-catalogue number', () => {
    const numbers: FitsCardInput[] = [['PLATEID', 266], ['MJD', 51630], ['FIBERID', 168]];
    expect(objectIdFromHeaders([headerOf([...numbers, ['OBJID', '1237648720693755918']])])).toBe('1237648720693755918');
    expect(objectIdFromHeaders([headerOf([['OBJNAME', '258151458599632'], ['DESIG', 'LAMOST J063715.90+271356.5']])])).toBe('LAMOST J063715.90+271356.5');
    expect(objectIdFromHeaders([headerOf([...numbers, ['TARGNAME', 'SMK-9']])])).toBe('SMK-9');
  });
  it('no id from incomplete or impossible numbers; OBSID is the last resort', () => {
    expect(objectIdFromHeaders([headerOf([['PLATEID', 266], ['MJD', 51630]])])).toBeUndefined();
    expect(objectIdFromHeaders([headerOf([['PLATEID', 266], ['MJD', 51630], ['FIBERID', -1]])])).toBeUndefined();
    expect(objectIdFromHeaders([headerOf([['PLATEID', 266.5], ['MJD', 51630], ['FIBERID', 3]])])).toBeUndefined();
    expect(objectIdFromHeaders([headerOf([['PLATEID', 'B6212'], ['MJD', 55863], ['FIBERID', 3], ['OBSID', 101003]])])).toBe('101003');
  });
  it('reaches the Spectrum through readFits', () => {
    const cards: FitsCardInput[] = [['CRVAL1', 4000], ['CDELT1', 1], ['PLATEID', 266], ['MJD', 51630], ['FIBERID', 168]];
    expect(readFits(writeFitsFile([writeImageHdu({ data: new Float32Array([1, 2]), cards })]), 'p.fits').meta.objectId).toBe('0266-51630-0168');
  });
});

describe('plateMjdFibreId(plate, mjd, fibre)', () => {
  it('accepts whole numbers as numbers, bigints or digit strings and refuses the rest', () => {
    expect(plateMjdFibreId(1, 2, 3)).toBe('0001-00002-0003');
    expect(plateMjdFibreId('266', 51630n, ' 168 ')).toBe('0266-51630-0168');
    expect(plateMjdFibreId(266, 51630, 'x')).toBeUndefined();
    expect(plateMjdFibreId(266, 51630, undefined)).toBeUndefined();
    expect(plateMjdFibreId(266, Number.NaN, 3)).toBeUndefined();
  });
});
