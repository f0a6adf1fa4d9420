import { describe, expect, it } from 'vitest';
import { nameTokens, parseColumnName, stripQuotes, wavelengthWords } from '../../../src/core/io/text/columnNames';

// Expected roles and units below are this project's naming conventions (common practice in survey exports).
describe('parseColumnName(name)', () => {
  it.each([
    ['wavelength', 'wavelength'],
    ['Wave', 'wavelength'],
    ['LAMBDA', 'wavelength'],
    ['loglam', 'wavelength'],
    ['wavelength_vacuum_angstrom', 'wavelength'],
    ['flux', 'flux'],
    ['f_lambda', 'flux'],
    ['FLUX_DENSITY', 'flux'],
    ['ivar', 'ivar'],
    ['inverse_variance', 'ivar'],
    ['inv_var', 'ivar'],
    ['err', 'error'],
    ['flux_error', 'error'],
    ['e_flux', 'error'],
    ['Sigma', 'error'],
    ['noise', 'error'],
    ['uncertainty', 'error'],
    ['var', 'variance'],
    ['flux_variance', 'variance'],
    ['mask', 'mask'],
    ['and_mask', 'mask'],
    ['sky', null],
    ['model', null],
  ])('%s -> %s', (name, role) => {
    expect(parseColumnName(name).role).toBe(role);
  });

  it('reads unit, medium and scale of a wavelength column', () => {
    expect(parseColumnName('wavelength_air_nm')).toMatchObject({ role: 'wavelength', unit: 'nm', medium: 'air' });
    expect(parseColumnName('"Wavelength [Angstrom]"')).toMatchObject({ raw: 'Wavelength [Angstrom]', unit: 'angstrom' });
    expect(parseColumnName('waveAir')).toMatchObject({ role: 'wavelength', medium: 'air' });
    expect(parseColumnName('loglam')).toMatchObject({ scale: 'log10' });
    expect(parseColumnName('log_lambda')).toMatchObject({ role: 'wavelength', scale: 'log10' });
  });

  it('leaves a wavelength name with contradicting words unrecognised', () => {
    expect(parseColumnName('wave_air_vac').role).toBeNull();
  });

  it('marks AND masks', () => {
    expect(parseColumnName('and_mask').andMask).toBe(true);
    expect(parseColumnName('or_mask').andMask).toBeUndefined();
  });

  it('keeps the bracketed unit of a name', () => {
    expect(parseColumnName('flux (1e-17 erg/s/cm2/A)').bracketUnit).toBe('1e-17 erg/s/cm2/A');
  });
});

describe('helpers', () => {
  it('nameTokens folds micro sign and Angstrom sign', () => {
    expect(nameTokens('Wavelength [\u00b5m]')).toEqual(['wavelength', 'um']);
    expect(nameTokens('lambda(\u212b)')).toEqual(['lambda', 'angstrom']);
  });
  it('wavelengthWords reports a conflict', () => {
    expect(wavelengthWords(['nm', 'angstrom'])).toBe('conflict');
    expect(wavelengthWords(['air', 'nm'])).toEqual({ medium: 'air', unit: 'nm' });
  });
  it('stripQuotes removes one pair and unescapes doubled quotes', () => {
    expect(stripQuotes('"a ""b"""')).toBe('a "b"');
    expect(stripQuotes("'x'")).toBe('x');
    expect(stripQuotes('"x')).toBe('"x');
  });
});
