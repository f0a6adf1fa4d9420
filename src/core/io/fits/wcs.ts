/**
 * The wavelength of each pixel of a 1-D spectrum from its header.
 *
 * Standard spectral WCS: Greisen & Calabretta 2002, A&A 395, 1061 (Paper I:
 * pixel p is 1-based, x = CD1_1 (p - CRPIX1) or PC1_1 CDELT1 (p - CRPIX1));
 * Greisen et al. 2006, A&A 446, 747 (Paper III: CTYPE 'WAVE' vacuum wavelength,
 * 'AWAV' air wavelength, '-LOG' lambda = CRVAL exp(x / CRVAL), default unit metre).
 *
 * Older conventions, read as common practice:
 * - CTYPE1 'LINEAR' (or absent) with CRVAL1/CDELT1; `DC-FLAG = 1` means the
 *   world values are log10(lambda) (not part of the FITS standard);
 *   `DC-FLAG = -1` means not dispersion-corrected, and such a header is refused.
 * - COEFF0/COEFF1 (survey log-linear spectra): lambda_i = 10^(COEFF0 + COEFF1 i), i 0-based.
 *
 * Units: CUNIT1 when given, else `units=` in WAT1_001, else decided from the size
 * of the values (see `guessUnitToAngstrom`).
 */
import { SpectrumReadError } from '../../types';
import type { FitsHeader } from './header';

export interface SpectralAxis {
  /** Pixel-centre wavelengths in Angstrom, as the file states them (air or vacuum). */
  wavelengthA: Float64Array;
  /** True when the file gives air wavelengths (AWAV, or a keyword saying so). */
  air: boolean;
  /** Which rule was used, for messages and tests, e.g. 'WAVE-LOG', 'DC-FLAG log10', 'COEFF0/COEFF1'. */
  rule: string;
  /** How the unit was decided: 'CUNIT1', 'WAT1_001', or 'assumed ...'. */
  unitSource: string;
}

/** Angstrom per unit, keyed by the normalised unit string. */
const UNIT_TO_ANGSTROM: Record<string, number> = {
  angstrom: 1, angstroms: 1, a: 1, aa: 1, ang: 1, angs: 1, '0.1nm': 1, '1e-10m': 1, '10**-10m': 1,
  nm: 10, nanometer: 10, nanometers: 10, nanometre: 10, nanometres: 10,
  um: 1e4, micron: 1e4, microns: 1e4, micrometer: 1e4, micrometers: 1e4, micrometre: 1e4, micrometres: 1e4, mum: 1e4,
  m: 1e10, meter: 1e10, meters: 1e10, metre: 1e10, metres: 1e10,
  cm: 1e8, mm: 1e7, pm: 1e-2,
};

/** Angstrom per unit for a unit string, or undefined when not a known length unit. */
export function unitToAngstrom(unit: string): number | undefined {
  return UNIT_TO_ANGSTROM[unit.trim().toLowerCase().replace(/\s+/g, '')];
}

/**
 * The unit of wavelengths given without one, from their size (largest value):
 * below 1e-3 they can only be metres (the FITS default unit; optical light is
 * ~4e-7 m); below 30 they are micrometres (no spectrum this program reads has
 * Angstrom values below 30); otherwise Angstrom, the unit nearly every optical
 * file without a unit uses (a WAVE axis with CRVAL ~ 3000-11000 and no CUNIT is
 * Angstrom in practice, even though the standard's default is the metre).
 * Nanometres cannot be told from Angstrom by size and must be declared.
 */
export function guessUnitToAngstrom(maxValue: number): { factor: number; source: string } {
  const v = Math.abs(maxValue);
  if (v < 1e-3) return { factor: 1e10, source: 'assumed metres (no unit; values below 1e-3)' };
  if (v < 30) return { factor: 1e4, source: 'assumed micrometres (no unit; values below 30)' };
  return { factor: 1, source: 'assumed Angstrom (no unit)' };
}

/** Unit named in IRAF-style WAT1_001 = 'wtype=linear label=Wavelength units=Angstroms'. */
function watUnit(h: FitsHeader): string | undefined {
  const wat = h.str('WAT1_001');
  const m = wat ? /units=(\S+)/i.exec(wat) : null;
  return m ? m[1] : undefined;
}

/** True when keywords say the wavelengths are in air: VACUUM = F or AIRORVAC = 'air'. */
export function headerSaysAir(h: FitsHeader): boolean {
  if (h.bool('VACUUM') === false) return true;
  const aov = h.str('AIRORVAC');
  return aov !== undefined && /^air/i.test(aov);
}

const OTHER_SPECTRAL = /^(FREQ|ENER|WAVN|VRAD|VOPT|ZOPT|VELO|BETA)/;
const LEGACY_LINEAR = new Set(['', 'LINEAR', 'WAVELENGTH', 'LAMBDA', 'WAVE-WAV', 'ANGSTROM', 'ANGSTROMS']);

/**
 * Wavelengths of `n` pixels along axis 1, or null when the header has no
 * wavelength description at all. Throws SpectrumReadError for a description
 * that is present but unusable (unsupported spectral type, unknown unit,
 * missing step, zero step).
 */
export function spectralAxis(h: FitsHeader, n: number, file: string, hdu: number): SpectralAxis | null {
  if (h.num('DC-FLAG', file, hdu) === -1) {
    throw new SpectrumReadError(
      file,
      'DC-FLAG = -1: the spectrum is not dispersion-corrected (its pixels have no wavelength calibration); calibrate it in wavelength first',
      { hdu, keyword: 'DC-FLAG' },
    );
  }
  const ctypeRaw = h.str('CTYPE1');
  const ctype = (ctypeRaw ?? '').toUpperCase();
  const std = /^(WAVE|AWAV)(?:-+([A-Z0-9]{3}))?$/.exec(ctype);
  if (std) return standardAxis(h, n, file, hdu, std[1] === 'AWAV', std[2]);
  if (OTHER_SPECTRAL.test(ctype)) {
    throw new SpectrumReadError(
      file,
      `spectral axis type '${ctypeRaw}' is not supported; wavelength axes (WAVE, AWAV, WAVE-LOG, AWAV-LOG, LINEAR) are`,
      { hdu, keyword: 'CTYPE1' },
    );
  }
  const c0 = h.num('COEFF0', file, hdu);
  const c1 = h.num('COEFF1', file, hdu);
  if (c0 !== undefined && c1 !== undefined) {
    if (c1 === 0) throw new SpectrumReadError(file, 'COEFF1 = 0: the wavelength does not change along the spectrum', { hdu, keyword: 'COEFF1' });
    const wl = new Float64Array(n);
    for (let i = 0; i < n; i++) wl[i] = 10 ** (c0 + c1 * i);
    return { wavelengthA: wl, air: headerSaysAir(h), rule: 'COEFF0/COEFF1 log10', unitSource: 'Angstrom (log10 convention)' };
  }
  if (LEGACY_LINEAR.has(ctype) && h.get('CRVAL1') !== undefined) return legacyAxis(h, n, file, hdu);
  return null;
}

/** Linear pixel-to-intermediate coefficients: x = step (p - crpix). */
function linearTerms(h: FitsHeader, file: string, hdu: number, defaultCrpix: number): { crval: number; crpix: number; step: number } {
  const crval = h.num('CRVAL1', file, hdu);
  if (crval === undefined) throw new SpectrumReadError(file, 'CRVAL1 is missing: no reference wavelength', { hdu, keyword: 'CRVAL1' });
  const crpix = h.num('CRPIX1', file, hdu) ?? defaultCrpix;
  const cd = h.num('CD1_1', file, hdu);
  const cdelt = h.num('CDELT1', file, hdu);
  const pc = h.num('PC1_1', file, hdu) ?? 1;
  let step: number;
  let stepKey: string;
  if (cd !== undefined) {
    step = cd; // CDi_j takes precedence over PCi_j/CDELTi (Paper I, sec. 2.1.2)
    stepKey = 'CD1_1';
  } else if (cdelt !== undefined) {
    step = cdelt * pc;
    stepKey = 'CDELT1';
  } else {
    throw new SpectrumReadError(file, 'no wavelength step: neither CDELT1 nor CD1_1 is given', { hdu, keyword: 'CDELT1' });
  }
  if (step === 0 || !Number.isFinite(step)) {
    throw new SpectrumReadError(file, `wavelength step ${step} is unusable`, { hdu, keyword: stepKey });
  }
  return { crval, crpix, step };
}

function unitFactor(h: FitsHeader, file: string, hdu: number, sampleMax: number): { factor: number; source: string } {
  const cunit = h.str('CUNIT1');
  if (cunit !== undefined && cunit !== '') {
    const f = unitToAngstrom(cunit);
    if (f === undefined) throw new SpectrumReadError(file, `unknown wavelength unit '${cunit}'`, { hdu, keyword: 'CUNIT1' });
    return { factor: f, source: 'CUNIT1' };
  }
  const wat = watUnit(h);
  if (wat !== undefined) {
    const f = unitToAngstrom(wat);
    if (f !== undefined) return { factor: f, source: 'WAT1_001' };
  }
  return guessUnitToAngstrom(sampleMax);
}

/** WAVE / AWAV, linear or -LOG (Greisen et al. 2006). CRPIX1 defaults to 0 as Paper I says. */
function standardAxis(h: FitsHeader, n: number, file: string, hdu: number, air: boolean, algo: string | undefined): SpectralAxis {
  if (algo !== undefined && algo !== 'LOG') {
    throw new SpectrumReadError(file, `spectral algorithm '-${algo}' is not supported (linear and -LOG are)`, { hdu, keyword: 'CTYPE1' });
  }
  const { crval, crpix, step } = linearTerms(h, file, hdu, 0);
  const wl = new Float64Array(n);
  if (algo === 'LOG') {
    // Paper III, eq. 5 (logarithmic algorithm): lambda = CRVAL exp(x / CRVAL).
    if (crval <= 0) throw new SpectrumReadError(file, `CRVAL1 = ${crval} must be positive for a -LOG axis`, { hdu, keyword: 'CRVAL1' });
    for (let i = 0; i < n; i++) wl[i] = crval * Math.exp((step * (i + 1 - crpix)) / crval);
  } else {
    for (let i = 0; i < n; i++) wl[i] = crval + step * (i + 1 - crpix);
  }
  const { factor, source } = unitFactor(h, file, hdu, Math.max(Math.abs(wl[0]), Math.abs(wl[n - 1])));
  if (factor !== 1) for (let i = 0; i < n; i++) wl[i] *= factor;
  return { wavelengthA: wl, air, rule: `${air ? 'AWAV' : 'WAVE'}${algo ? '-' + algo : ''}`, unitSource: source };
}

/**
 * CTYPE1 'LINEAR' or absent: world = CRVAL1 + step (p - CRPIX1), with CRPIX1
 * defaulting to 1 (legacy files put the first pixel's wavelength in CRVAL1);
 * `DC-FLAG = 1` makes the world value log10(lambda).
 */
function legacyAxis(h: FitsHeader, n: number, file: string, hdu: number): SpectralAxis {
  const { crval, crpix, step } = linearTerms(h, file, hdu, 1);
  const dcFlag = h.num('DC-FLAG', file, hdu);
  const log10 = dcFlag === 1;
  if (dcFlag !== undefined && dcFlag !== 0 && dcFlag !== 1) {
    throw new SpectrumReadError(file, `DC-FLAG = ${dcFlag} is not understood (0 linear, 1 log10; -1, not dispersion-corrected, is refused)`, { hdu, keyword: 'DC-FLAG' });
  }
  const wl = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const w = crval + step * (i + 1 - crpix);
    wl[i] = log10 ? 10 ** w : w;
  }
  const { factor, source } = unitFactor(h, file, hdu, Math.max(Math.abs(wl[0]), Math.abs(wl[n - 1])));
  if (factor !== 1) for (let i = 0; i < n; i++) wl[i] *= factor;
  return { wavelengthA: wl, air: headerSaysAir(h), rule: log10 ? 'LINEAR, DC-FLAG log10' : 'LINEAR', unitSource: source };
}
