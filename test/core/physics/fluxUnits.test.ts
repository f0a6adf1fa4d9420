import { describe, expect, it } from 'vitest';
import { readFileSync, readdirSync } from 'node:fs';
import { fluxScaleOf } from '../../../src/core/physics/fluxUnits';
import { readSpectrum } from '../../../src/core/io/readSpectrum';

const DIR = 'test/data/real-spectra/fits';

describe('fluxScaleOf(unit)', () => {
  it('reads the spellings surveys write (factor to erg/s/cm2/A)', () => {
    expect(fluxScaleOf('1E-17 erg/cm^2/s/Ang')).toEqual({ ok: true, ergPerSCm2A: 1e-17 });
    expect(fluxScaleOf('1e-17 erg/s/cm2/A')).toEqual({ ok: true, ergPerSCm2A: 1e-17 });
    expect(fluxScaleOf('erg s-1 cm-2 A-1')).toEqual({ ok: true, ergPerSCm2A: 1 });
    expect((fluxScaleOf('10**-16 erg/s/cm**2/Angstrom') as { ergPerSCm2A: number }).ergPerSCm2A).toBeCloseTo(1e-16, 30);
    // 1 W m^-2 nm^-1 = 1e7 erg/s / 1e4 cm^2 / 10 A = 100 erg/s/cm2/A (SI definitions).
    expect((fluxScaleOf('W/m2/nm') as { ergPerSCm2A: number }).ergPerSCm2A).toBeCloseTo(100, 10);
  });
  it('refuses a missing, relative, per-frequency or incomplete unit with the reason', () => {
    expect(fluxScaleOf(undefined)).toEqual({ ok: false, reason: expect.stringContaining('no flux unit') });
    expect(fluxScaleOf('relative flux')).toEqual({ ok: false, reason: expect.stringContaining('relative') });
    expect(fluxScaleOf('erg/s/cm2/Hz')).toEqual({ ok: false, reason: expect.stringContaining('f_nu') });
    expect(fluxScaleOf('erg/s/cm2')).toEqual({ ok: false, reason: expect.stringContaining('not a flux density per unit wavelength') });
    expect(fluxScaleOf('furlong/fortnight')).toEqual({ ok: false, reason: expect.stringContaining('not understood') });
  });
});

describe('flux units of the real files in test/data (MANIFEST.tsv: SDSS/BOSS 1e-17 erg/s/cm2/A, LAMOST relative)', () => {
  const files = readdirSync(DIR).filter((f) => f.endsWith('.fits'));
  it('every SDSS/BOSS table gives 1e-17 erg/s/cm2/A from its TUNIT, every LAMOST image gives a reason', () => {
    let sdss = 0;
    let lamost = 0;
    for (const f of files) {
      const s = readSpectrum(new Uint8Array(readFileSync(`${DIR}/${f}`)), f);
      const scale = fluxScaleOf(s.meta.fluxUnit);
      if (f.startsWith('spec-55862-')) {
        lamost++;
        expect(scale.ok, f).toBe(false);
      } else {
        sdss++;
        expect(scale, f).toEqual({ ok: true, ergPerSCm2A: 1e-17 });
      }
    }
    expect(sdss).toBe(43);
    expect(lamost).toBe(15);
  });
});
