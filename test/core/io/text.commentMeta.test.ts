import { describe, expect, it } from 'vitest';
import { parseAngleDeg, readCommentFacts } from '../../../src/core/io/text/commentMeta';

const facts = (...bodies: string[]) => readCommentFacts(bodies.map((body, i) => ({ line: i + 1, body })));

describe('readCommentFacts(comments)', () => {
  it('reads key: value and KEY = value forms, first statement wins', () => {
    const f = facts("OBJECT  = 'FIELD7-0042'  / target", 'object: other', 'exptime: 900 s', 'bunit: counts');
    expect(f.meta).toEqual({ objectId: 'FIELD7-0042', exposureS: 900, fluxUnit: 'counts' });
  });
  it('collects wavelength statements with their lines', () => {
    const f = facts('source: synthetic', 'wavelength: air, nm', 'wave_unit = micron');
    expect(f.wavelength).toEqual([
      { line: 2, medium: 'air', unit: 'nm' },
      { line: 3, unit: 'um' },
    ]);
  });
  it('finds a columns line', () => {
    expect(facts('columns: wave flux ivar').columns).toEqual({ line: 1, names: 'wave flux ivar' });
  });
  it('ignores free text', () => {
    expect(facts('made by hand, see notes', 'wavelength flux')).toEqual({ meta: {}, wavelength: [] });
  });
  it('leaves out an unreadable exposure and keeps the other facts', () => {
    const f = facts('object: Q1', 'exptime: long');
    expect(f.meta.exposureS).toBeUndefined();
    expect(f.meta.objectId).toBe('Q1');
  });
});

describe('parseAngleDeg(value, isRa)', () => {
  it('reads decimal degrees', () => {
    expect(parseAngleDeg('150.1', true)).toBe(150.1);
    expect(parseAngleDeg('-2.2 deg', false)).toBe(-2.2);
  });
  it('reads sexagesimal hours for RA and degrees for Dec', () => {
    // 12h30m00s = 187.5 deg (15 deg per hour, common practice)
    expect(parseAngleDeg('12h30m00s', true)).toBeCloseTo(187.5, 12);
    expect(parseAngleDeg('12 30 00', true)).toBeCloseTo(187.5, 12);
    expect(parseAngleDeg('-00:30:00', false)).toBeCloseTo(-0.5, 12);
    expect(parseAngleDeg('+45d15m36s', false)).toBeCloseTo(45.26, 12);
  });
  it('refuses out-of-range values', () => {
    expect(parseAngleDeg('360', true)).toBeUndefined();
    expect(parseAngleDeg('-91', false)).toBeUndefined();
    expect(parseAngleDeg('10:61:00', true)).toBeUndefined();
    expect(parseAngleDeg('north', false)).toBeUndefined();
  });
});

describe('object id from plate, MJD and fibre comments', () => {
  // Same rule and padding as the FITS headers (src/core/io/objectId.ts); numbers of the real file spec-0266-51630-0168.
  it('builds plate-MJD-fibre when no name is given, in either comment style', () => {
    expect(facts('plateid: 266', 'mjd: 51630', 'fiberid: 168').meta.objectId).toBe('0266-51630-0168');
    expect(facts('PLATEID =                  266 / Current plate', 'MJD     =                51630 / MJD of observation', 'FIBERID =                  168 / Fiber ID (1-640)').meta.objectId).toBe('0266-51630-0168');
  });
  it('a name wins, wherever it stands; a designation is a name', () => {
    expect(facts('plate: 266', 'mjd: 51630', 'fiber: 168', 'object: Q7').meta.objectId).toBe('Q7');
    expect(facts('desig: LAMOST J063715.90+271356.5', 'mjd: 55863', 'fiberid: 3').meta.objectId).toBe('LAMOST J063715.90+271356.5');
  });
  it('no id from incomplete numbers', () => {
    expect(facts('plate: 266', 'fiber: 168').meta.objectId).toBeUndefined();
    expect(facts('plate: 266', 'mjd: soon', 'fiber: 168').meta.objectId).toBeUndefined();
  });
});
