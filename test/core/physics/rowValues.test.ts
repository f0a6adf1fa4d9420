import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { readSpectrum } from '../../../src/core/io/readSpectrum';
import { measureQuasar } from '../../../src/core/physics/measure';
import { automaticRow, catalogueRow, AUTOMATIC_COLUMNS } from '../../../src/core/table';
import { failedResult } from '../../../src/core/failedResult';
import type { FitResult, ReviewDecision } from '../../../src/core/types';

const COSMO = { h0: 70, omegaM: 0.3, omegaK: 0, omegaR: 0 };
const read = (dir: string, name: string) => readSpectrum(new Uint8Array(readFileSync(`test/data/real-spectra/${dir}/${name}`)), name);

function asQuasarFit(file: string, z: number, quasar: FitResult['quasar']): FitResult {
  return { ...failedResult(file, ''), status: 'ok', error: undefined, class: 'qso', z, zErr: 0.001, quasar };
}

describe('physics cells of an export row', () => {
  it('LAMOST (relative flux, no unit in the header): luminosity and mass cells empty, the note says why', () => {
    // A LAMOST DR1 file measured as if it were a quasar at z = 0.1 (its flux is only relatively calibrated: MANIFEST.tsv).
    const s = read('fits', 'spec-55862-B6212_sp06-003.fits');
    const row = automaticRow(asQuasarFit('lamost.fits', 0.1, measureQuasar(s, 0.1, { draws: 0 })), COSMO);
    for (const c of ['loglam5100', 'loglam5100_err', 'log_mbh', 'log_mbh_hbeta_vp06', 'log_lbol', 'log_edd_ratio']) expect(row[c], c).toBe('');
    expect(row.qso_phys_note).toContain('no luminosities: the file states no flux unit');
    expect(row.qso_phys_z).toBe('0.100000');
    expect(row.qso_phys_draws).toBe('0'); // errors from the fits alone
  });
  it('SDSS (1e-17 erg/s/cm2/A): luminosities, an H-beta and Mg II mass with the 0.4 dex systematic beside it', () => {
    const s = read('fits', 'spec-3655-55240-0436.fits');
    const row = automaticRow(asQuasarFit('sdss.fits', 0.876162, measureQuasar(s, 0.876162, { draws: 2 })), COSMO);
    expect(row.qso_phys_draws).toBe('2'); // the export says the errors came from 2 resampled spectra
    expect(Number(row.loglam3000)).toBeGreaterThan(44);
    expect(Number(row.loglam3000)).toBeLessThan(47);
    expect(row.log_mbh_from).toBe('mgii_s11'); // 0.7 <= z < 1.9 (Shen et al. 2011 rule)
    expect(row.log_mbh_sys_dex).toBe('0.40');
    expect(Number(row.log_mbh)).toBeGreaterThan(7);
    expect(Number(row.log_mbh)).toBeLessThan(10.5);
    expect(row.log_mbh_hbeta_vp06).not.toBe('');
    expect(Object.keys(row)).toEqual(AUTOMATIC_COLUMNS.map((c) => c.name));
  });
  it('a reviewer who changed z gets empty cells and a note, never numbers measured at the other z', () => {
    const s = read('fits', 'spec-3655-55240-0436.fits');
    const fit = asQuasarFit('sdss.fits', 0.876162, measureQuasar(s, 0.876162, { draws: 0 }));
    const decision: ReviewDecision = { file: 'sdss.fits', state: 'changed', z: 0.9, zErr: 0.001, class: 'qso', reviewerGrade: null, howSet: 'typed', reviewer: 'r', decidedAt: '2026-01-01T00:00:00Z', note: '' };
    const row = catalogueRow(fit, decision, COSMO);
    expect(row.log_mbh).toBe('');
    expect(row.qso_phys_note).toContain('measured at z = 0.87616');
  });
  it('galaxies and stars get no physics and no note', () => {
    const row = automaticRow({ ...asQuasarFit('g.fits', 0.1, undefined), class: 'galaxy' }, COSMO);
    expect(row.qso_phys_note).toBe('');
    expect(row.log_mbh).toBe('');
  });
});
