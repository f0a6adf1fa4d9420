/**
 * A reviewer who moves a quasar's z gets the physics at the new z in the
 * export: the review box's measurement at that z goes with the decision,
 * survives a reload (IndexedDB) and fills the export's physics cells. The
 * spectrum is a real SDSS quasar (test/data/real-spectra, MANIFEST.tsv:
 * catalogue z 0.876162).
 */
import 'fake-indexeddb/auto';
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { Session, type Fitter } from '../../../src/ui/state/session';
import { SessionDb } from '../../../src/ui/persist/sessionDb';
import type { FitJob, PoolOutcome } from '../../../src/worker/pool';
import { buildExport } from '../../../src/ui/export/buildExport';
import { parseCatalogueCsv } from '../../../src/core/table/csv';
import { readSpectrum } from '../../../src/core/io/readSpectrum';
import { measureQuasar } from '../../../src/core/physics/measure';
import { makeDecision, makeResult } from '../fixtures';

const NAME = 'spec-3655-55240-0436.fits';
const BYTES = new Uint8Array(readFileSync(`test/data/real-spectra/fits/${NAME}`));
const SPECTRUM = readSpectrum(BYTES, NAME);
const Z_FIT = 0.876162;
const COSMO = { h0: 70, omegaM: 0.3, omegaK: 0, omegaR: 0 };

/** Answers with the fit the worker would give: a quasar at the catalogue z with its physics measured there. */
class QuasarFitter implements Fitter {
  async fit(job: FitJob): Promise<PoolOutcome> {
    return { kind: 'result', result: makeResult(job.file, { z: Z_FIT, class: 'qso', quasar: measureQuasar(SPECTRUM, Z_FIT) }) };
  }
}

async function until(cond: () => boolean): Promise<void> {
  for (let i = 0; i < 400 && !cond(); i++) await new Promise((r) => setTimeout(r, 5));
  expect(cond()).toBe(true);
}

async function exportRow(s: Session): Promise<Record<string, string>> {
  const snap = s.getSnapshot();
  const built = await buildExport({ rows: snap.rows, getResult: (k) => s.getResult(k) }, 'csv-plain', COSMO);
  return parseCatalogueCsv(built.data as string).rows[0] as Record<string, string>;
}

describe('physics at a reviewed z in exports', () => {
  it('the box measurement at the changed z goes with the decision, survives reload and fills the cells', async () => {
    const name = 'physics-reviewed-z';
    const db = await SessionDb.open(name);
    const s = new Session(db, new QuasarFitter());
    await s.restore();
    const [key] = await s.addFiles([{ path: NAME, bytes: BYTES }]);
    await until(() => s.getSnapshot().rows[0]?.status === 'ok');
    // The reviewer refits at 0.88; the box measures there (the worker's answer, made here by the same core call).
    s.noteQuasarMeasurement(key, measureQuasar(SPECTRUM, 0.88));
    await s.decide(key, makeDecision(NAME, { state: 'changed', z: 0.88, howSet: 'refit' }));
    db.close();

    const db2 = await SessionDb.open(name);
    const s2 = new Session(db2, new QuasarFitter());
    await s2.restore();
    expect(s2.getSnapshot().rows[0].decision?.quasar?.z).toBe(0.88);
    const row = await exportRow(s2);
    expect(row.final_z).toMatch(/^0\.88/);
    expect(row.qso_phys_z).toBe('0.880000');
    expect(row.qso_phys_note).not.toContain("not at this row's z");
    // Mg II is in range at z 0.88 (2798.75 x 1.88 = 5262 A): a width, a luminosity and a mass, as at the fitted z.
    expect(Number(row.fwhm_mgii_kms)).toBeGreaterThan(1000);
    expect(Number(row.loglam3000)).toBeGreaterThan(44);
    expect(row.log_mbh).not.toBe('');
    db2.close();
  });

  it('a decision at a z nobody measured keeps empty cells and the note (a measurement at another z is not taken)', async () => {
    const db = await SessionDb.open('physics-reviewed-z-unmeasured');
    const s = new Session(db, new QuasarFitter());
    await s.restore();
    const [key] = await s.addFiles([{ path: NAME, bytes: BYTES }]);
    await until(() => s.getSnapshot().rows[0]?.status === 'ok');
    s.noteQuasarMeasurement(key, measureQuasar(SPECTRUM, 0.88));
    await s.decide(key, makeDecision(NAME, { state: 'changed', z: 0.9, howSet: 'typed' }));
    expect(s.getSnapshot().rows[0].decision?.quasar).toBeUndefined();
    const row = await exportRow(s);
    expect(row.log_mbh).toBe('');
    expect(row.qso_phys_note).toContain('measured at z = 0.87616');
    db.close();
  });
});
