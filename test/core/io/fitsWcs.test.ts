import { describe, expect, it } from 'vitest';
import { SpectrumReadError } from '../../../src/core/types';
import { readFits } from '../../../src/core/io/fits/readFits';
import { readHeader } from '../../../src/core/io/fits/header';
import { guessUnitToAngstrom, spectralAxis, unitToAngstrom } from '../../../src/core/io/fits/wcs';
import { writeFitsFile, writeImageHdu, type FitsCardInput } from '../../../src/core/io/fits/write';
import { caught as readError } from '../../helpers/caught';

/** A 1000-pixel float32 spectrum in the primary HDU with the given WCS cards. */
function imageFile(cards: FitsCardInput[], n = 1000): Uint8Array {
  return writeFitsFile([writeImageHdu({ data: new Float32Array(n).fill(1), cards })]);
}
function headerOf(cards: FitsCardInput[]) {
  return readHeader(writeImageHdu({ data: new Float32Array(2), cards }), 0, 'f', 0).header;
}
const PIXELS = [1, 2, 100, 1000]; // 1-based pixel numbers of reference.md sec. 9

/**
 * Expected values: reference.md sec. 9, computed with astropy 5.2.1 / WCSLIB 7.12
 * `WCS.wcs_pix2world(p, 1)` (Greisen & Calabretta 2002; Greisen et al. 2006), given to 1e-6 A.
 */
const TOL_A = 1e-5;

function expectAt(wl: Float64Array, expected: number[], tol = TOL_A): void {
  PIXELS.forEach((p, k) => expect(Math.abs(wl[p - 1] - expected[k])).toBeLessThan(tol));
}

describe('spectral WCS through readFits (files written with our writer)', () => {
  it("S1: 'WAVE', CUNIT1 'Angstrom', CRPIX1 1, CRVAL1 3800, CDELT1 1", () => {
    const s = readFits(imageFile([['CTYPE1', 'WAVE'], ['CUNIT1', 'Angstrom'], ['CRPIX1', 1], ['CRVAL1', 3800], ['CDELT1', 1]]), 's1.fits');
    expectAt(s.wavelengthA, [3800, 3801, 3899, 4799]);
    expect(s.meta.convertedFromAir).toBeUndefined();
  });

  it("S1b: 'WAVE', CRPIX1 10.5, CRVAL1 5000, CD1_1 0.5, no CDELT1 (no CUNIT1: Angstrom by our rule)", () => {
    const s = readFits(imageFile([['CTYPE1', 'WAVE'], ['CRPIX1', 10.5], ['CRVAL1', 5000], ['CD1_1', 0.5]]), 's1b.fits');
    expectAt(s.wavelengthA, [4995.25, 4995.75, 5044.75, 5494.75]);
  });

  it("S2: 'WAVE-LOG', CRPIX1 1, CRVAL1 3800, CDELT1 0.874982335338 (lambda = CRVAL exp(w/CRVAL), Paper III)", () => {
    const s = readFits(imageFile([['CTYPE1', 'WAVE-LOG'], ['CUNIT1', 'Angstrom'], ['CRPIX1', 1], ['CRVAL1', 3800], ['CDELT1', 0.874982335338]]), 's2.fits');
    expectAt(s.wavelengthA, [3800, 3800.875083, 3887.61811, 4782.815154]);
  });

  it("S2 legacy: 'LINEAR', DC-FLAG 1, CRVAL1 3.5797835966, CDELT1 1e-4 gives 10^world (de-facto convention)", () => {
    const s = readFits(imageFile([['CTYPE1', 'LINEAR'], ['DC-FLAG', 1], ['CRPIX1', 1], ['CRVAL1', 3.5797835966], ['CDELT1', 1e-4]]), 's2l.fits');
    expectAt(s.wavelengthA, [3800, 3800.875083, 3887.61811, 4782.815154]);
  });

  it('DC-FLAG = -1 (not dispersion-corrected) is refused with a message naming the keyword', () => {
    // DC-FLAG: -1 no dispersion correction, 0 linear, 1 log-linear (legacy convention, from memory).
    for (const ctype of ['LINEAR', 'PIXEL', 'WAVE']) {
      const e = readError(() => readFits(imageFile([['CTYPE1', ctype], ['DC-FLAG', -1], ['CRPIX1', 1], ['CRVAL1', 1], ['CDELT1', 1]]), 'arc.fits'));
      expect(e.where.keyword, ctype).toBe('DC-FLAG');
      expect(e.where.hdu).toBe(0);
      expect(e.reason).toMatch(/^DC-FLAG = -1: the spectrum is not dispersion-corrected/);
      expect(e.message).toMatch(/^arc\.fits \(HDU 0, keyword DC-FLAG\): /);
    }
    // Without the keyword (or with 0) the same header is an ordinary linear axis.
    expect(readFits(imageFile([['CTYPE1', 'LINEAR'], ['DC-FLAG', 0], ['CRPIX1', 1], ['CRVAL1', 4000], ['CDELT1', 1]]), 'ok.fits').wavelengthA[1]).toBe(4001);
  });

  it("S3: 'AWAV' linear is read as air and converted to vacuum (Morton 2000 inversion, reference.md sec. 9)", () => {
    const s = readFits(imageFile([['CTYPE1', 'AWAV'], ['CUNIT1', 'Angstrom'], ['CRPIX1', 1], ['CRVAL1', 3800], ['CDELT1', 1]]), 's3.fits');
    // Morton 2000 values [C]; WCSLIB's Edlen-1953 values (3801.078918, ...) differ by < 3e-5 A.
    expectAt(s.wavelengthA, [3801.078914, 3802.079174, 3900.10467, 4800.341487], 1e-4);
    expect(s.meta.convertedFromAir).toBe(true);
  });

  it('S3 as the raw air axis: spectralAxis reports air and leaves conversion to the caller', () => {
    const axis = spectralAxis(headerOf([['CTYPE1', 'AWAV'], ['CRPIX1', 1], ['CRVAL1', 3800], ['CDELT1', 1]]), 1000, 'f', 0)!;
    expect(axis.air).toBe(true);
    expectAt(axis.wavelengthA, [3800, 3801, 3899, 4799]);
  });

  it('PC1_1 scales CDELT1 (Paper I: x = s m (p - r))', () => {
    const axis = spectralAxis(headerOf([['CTYPE1', 'WAVE'], ['CRPIX1', 1], ['CRVAL1', 4000], ['CDELT1', 2], ['PC1_1', 0.5]]), 3, 'f', 0)!;
    expect(Array.from(axis.wavelengthA)).toEqual([4000, 4001, 4002]);
  });

  it('CD1_1 overrides CDELT1 (Paper I, sec. 2.1.2)', () => {
    const axis = spectralAxis(headerOf([['CTYPE1', 'WAVE'], ['CRPIX1', 1], ['CRVAL1', 4000], ['CDELT1', 2], ['CD1_1', 3]]), 2, 'f', 0)!;
    expect(Array.from(axis.wavelengthA)).toEqual([4000, 4003]);
  });

  it('CRPIX1 defaults to 0 for standard WAVE axes (Paper I) and to 1 for LINEAR (legacy practice)', () => {
    const std = spectralAxis(headerOf([['CTYPE1', 'WAVE'], ['CRVAL1', 4000], ['CDELT1', 1]]), 2, 'f', 0)!;
    expect(std.wavelengthA[0]).toBe(4001);
    const legacy = spectralAxis(headerOf([['CTYPE1', 'LINEAR'], ['CRVAL1', 4000], ['CDELT1', 1]]), 2, 'f', 0)!;
    expect(legacy.wavelengthA[0]).toBe(4000);
    const none = spectralAxis(headerOf([['CRVAL1', 4000], ['CDELT1', 1]]), 2, 'f', 0)!;
    expect(none.wavelengthA[0]).toBe(4000);
  });

  it('CUNIT1 nm, um and m scale to Angstrom', () => {
    const nm = spectralAxis(headerOf([['CTYPE1', 'WAVE'], ['CUNIT1', 'nm'], ['CRPIX1', 1], ['CRVAL1', 380], ['CDELT1', 0.1]]), 2, 'f', 0)!;
    expect(nm.wavelengthA[0]).toBeCloseTo(3800, 9);
    expect(nm.wavelengthA[1]).toBeCloseTo(3801, 9);
    const um = spectralAxis(headerOf([['CTYPE1', 'WAVE'], ['CUNIT1', 'um'], ['CRPIX1', 1], ['CRVAL1', 0.38], ['CDELT1', 1e-4]]), 2, 'f', 0)!;
    expect(um.wavelengthA[1]).toBeCloseTo(3801, 8);
    const m = spectralAxis(headerOf([['CTYPE1', 'WAVE'], ['CUNIT1', 'm'], ['CRPIX1', 1], ['CRVAL1', 3.8e-7], ['CDELT1', 1e-10]]), 2, 'f', 0)!;
    expect(m.wavelengthA[1]).toBeCloseTo(3801, 6);
  });

  it('without CUNIT1, metre-sized values are metres (the standard default) and 3000-11000 is Angstrom', () => {
    const m = spectralAxis(headerOf([['CTYPE1', 'WAVE'], ['CRPIX1', 1], ['CRVAL1', 3.8e-7], ['CDELT1', 1e-10]]), 2, 'f', 0)!;
    expect(m.wavelengthA[0]).toBeCloseTo(3800, 6);
    expect(m.unitSource).toMatch(/metres/);
    const a = spectralAxis(headerOf([['CTYPE1', 'WAVE'], ['CRPIX1', 1], ['CRVAL1', 3800], ['CDELT1', 1]]), 2, 'f', 0)!;
    expect(a.wavelengthA[0]).toBe(3800);
    expect(a.unitSource).toMatch(/Angstrom/);
  });

  it("WAT1_001 'units=...' is used when CUNIT1 is absent", () => {
    const axis = spectralAxis(headerOf([['CTYPE1', 'LINEAR'], ['WAT1_001', 'wtype=linear label=Wavelength units=nm'], ['CRVAL1', 380], ['CDELT1', 1]]), 2, 'f', 0)!;
    expect(axis.wavelengthA[0]).toBeCloseTo(3800, 9);
    expect(axis.unitSource).toBe('WAT1_001');
  });

  it('COEFF0/COEFF1: lambda_i = 10^(COEFF0 + COEFF1 i), i from 0 (survey log-linear convention)', () => {
    const axis = spectralAxis(headerOf([['COEFF0', 3.5682], ['COEFF1', 1e-4]]), 3904, 'f', 0)!;
    // 10^3.5682 = 3699.98531 and 10^(3.5682 + 0.3903) = 9088.66299 (numpy), as in MANIFEST.tsv for the LAMOST files.
    expect(axis.wavelengthA[0]).toBeCloseTo(3699.98531, 4);
    expect(axis.wavelengthA[3903]).toBeCloseTo(9088.66299, 4);
  });

  it('VACUUM = F or AIRORVAC = air marks a LINEAR axis as air', () => {
    expect(spectralAxis(headerOf([['CRVAL1', 4000], ['CDELT1', 1], ['VACUUM', false]]), 2, 'f', 0)!.air).toBe(true);
    expect(spectralAxis(headerOf([['CRVAL1', 4000], ['CDELT1', 1], ['AIRORVAC', 'air']]), 2, 'f', 0)!.air).toBe(true);
    expect(spectralAxis(headerOf([['CRVAL1', 4000], ['CDELT1', 1]]), 2, 'f', 0)!.air).toBe(false);
  });

  it('returns null when there is no wavelength description', () => {
    expect(spectralAxis(headerOf([['CTYPE1', 'PIXEL']]), 2, 'f', 0)).toBeNull();
    expect(spectralAxis(headerOf([]), 2, 'f', 0)).toBeNull();
  });

  it('unit helpers', () => {
    expect(unitToAngstrom('Angstrom')).toBe(1);
    expect(unitToAngstrom('ANGSTROMS')).toBe(1);
    expect(unitToAngstrom('micron')).toBe(1e4);
    expect(unitToAngstrom('furlong')).toBeUndefined();
    expect(guessUnitToAngstrom(2.5).factor).toBe(1e4);
  });
});

describe('spectral WCS errors', () => {
  it("error: unsupported spectral type 'FREQ'", () => {
    const e = readError(() => readFits(imageFile([['CTYPE1', 'FREQ'], ['CRVAL1', 1e14], ['CDELT1', 1e9]]), 'freq.fits'));
    expect(e.message).toBe(
      "freq.fits (HDU 0, keyword CTYPE1): spectral axis type 'FREQ' is not supported; wavelength axes (WAVE, AWAV, WAVE-LOG, AWAV-LOG, LINEAR) are",
    );
  });
  it("error: unsupported algorithm 'WAVE-TAB'", () => {
    const e = readError(() => readFits(imageFile([['CTYPE1', 'WAVE-TAB'], ['CRVAL1', 1], ['CDELT1', 1]]), 'tab.fits'));
    expect(e.message).toBe("tab.fits (HDU 0, keyword CTYPE1): spectral algorithm '-TAB' is not supported (linear and -LOG are)");
  });
  it('error: unknown CUNIT1', () => {
    const e = readError(() => readFits(imageFile([['CTYPE1', 'WAVE'], ['CUNIT1', 'furlong'], ['CRVAL1', 1], ['CDELT1', 1]]), 'u.fits'));
    expect(e.message).toBe("u.fits (HDU 0, keyword CUNIT1): unknown wavelength unit 'furlong'");
  });
  it('error: no step', () => {
    const e = readError(() => readFits(imageFile([['CTYPE1', 'WAVE'], ['CRVAL1', 4000]]), 'nostep.fits'));
    expect(e.message).toBe('nostep.fits (HDU 0, keyword CDELT1): no wavelength step: neither CDELT1 nor CD1_1 is given');
  });
  it('error: zero step', () => {
    const e = readError(() => readFits(imageFile([['CTYPE1', 'WAVE'], ['CRVAL1', 4000], ['CDELT1', 0]]), 'zero.fits'));
    expect(e.message).toBe('zero.fits (HDU 0, keyword CDELT1): wavelength step 0 is unusable');
  });
  it('error: WAVE without CRVAL1', () => {
    const e = readError(() => readFits(imageFile([['CTYPE1', 'WAVE'], ['CDELT1', 1]]), 'nocrval.fits'));
    expect(e.message).toBe('nocrval.fits (HDU 0, keyword CRVAL1): CRVAL1 is missing: no reference wavelength');
  });
  it('error: no wavelength axis at all', () => {
    const e = readError(() => readFits(imageFile([]), 'nowave.fits'));
    expect(e.message).toBe(
      'nowave.fits (HDU 0, keyword CTYPE1): no wavelength axis: the header has no spectral WCS (CTYPE1/CRVAL1/CDELT1 or CD1_1), no COEFF0/COEFF1, and no wavelength image',
    );
  });
});
