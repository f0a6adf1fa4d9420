/**
 * Spectra built from published templates that the fitted families leave out
 * (the engine never saw them) are fitted to the right redshift and class.
 * Truth is the redshift we put in; "right" is |dz|/(1+z) < 0.003, the
 * project's definition of a correct redshift.
 */
import { describe, expect, it } from 'vitest';
import { fitSpectrum } from '../../../src/core/engine';
import { familiesWithout, observe } from './synth';

const cases: { name: string; z: number; cls: string; layout?: 'log-3800-9200' | 'linear-3700-9100-dead-end' | 'linear-4000-8800' | 'log-3600-10300' }[] = [
  { name: 'kc96_elliptical', z: 0.4512, cls: 'galaxy' },
  { name: 'bc03_ssp_z0.02_chabrier_12.25gyr', z: 0.7012, cls: 'galaxy', layout: 'log-3600-10300' },
  { name: 'kc96_starb2', z: 0.2311, cls: 'galaxy', layout: 'linear-4000-8800' },
  { name: 'kc96_sb', z: 0.1033, cls: 'galaxy' },
  { name: 'pickles_uk031_k0v', z: 0.0002, cls: 'star' },
  { name: 'pickles_uk009_a0v', z: -0.0003, cls: 'star', layout: 'linear-3700-9100-dead-end' },
  { name: 'pickles_uk043_m4v', z: 0.0001, cls: 'star' },
  { name: 'pickles_uk078_k0iii', z: -0.0001, cls: 'star' },
  { name: 'harris2016_boss_composite', z: 2.734, cls: 'qso' },
  { name: 'glikman2006_optical_nir_composite', z: 0.612, cls: 'qso', layout: 'log-3600-10300' },
  { name: 'vandenberk2001_sdss_median_composite', z: 1.4211, cls: 'qso' },
];

describe('fitSpectrum on published templates held out of its families', () => {
  for (const c of cases) {
    it(`${c.name} at z = ${c.z} (S/N 8) -> ${c.cls}`, () => {
      const s = observe(c.name, c.z, 8, 17, c.layout);
      const r = fitSpectrum(s, { templateFamilies: familiesWithout(c.name) });
      expect(r.status).toBe('ok');
      expect(r.class).toBe(c.cls);
      expect(Math.abs(r.z - c.z) / (1 + c.z)).toBeLessThan(0.003);
      expect(r.zErr).toBeGreaterThan(0);
    });
  }
});
