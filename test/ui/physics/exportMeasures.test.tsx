// @vitest-environment jsdom
/**
 * Quasar decisions the review box never measured (here a bulk accept of fits
 * from before quasar physics existed) are measured when the catalogue is
 * exported: the worker reads each file's stored bytes, the cells are filled as
 * the core row would fill them, the measurement stays with the decision (a
 * second export measures nothing), and a file the worker cannot read keeps the
 * note. Measurements are hand-made (the UI moves data; the physics is tested
 * in test/core/physics).
 */
import { describe, it, expect, afterEach, vi } from 'vitest';
import { render, screen, fireEvent, cleanup } from '@testing-library/react';
import { fakeReview, makeSession, waitUntil, ScriptedFitter } from '../harness';
import { textBytes, makeResult, makeDecision } from '../fixtures';
import { measureMissingPhysics, MEASURE_BATCH } from '../../../src/ui/export/measureMissing';
import { catalogueRow, parseCatalogueCsv } from '../../../src/core/table';
import { decisionWithPhysics, withDecisionPhysics } from '../../../src/core/physics/rowValues';
import type { QuasarMeasurement } from '../../../src/core/physics/types';

vi.mock('../../../src/ui/plots', () => import('../plotsStub'));
const { App } = await import('../../../src/ui/App');

afterEach(cleanup);

/** The quasar box test's measurement (C IV 5000 km/s, calibrated flux), made at the asked z. */
function measurementAt(z: number, calibrated: boolean): QuasarMeasurement {
  return {
    z,
    fluxScale: calibrated ? { ok: true, ergPerSCm2A: 1e-17, unit: '1e-17 erg/s/cm2/A' } : { ok: false, reason: 'no flux unit in the file' },
    continua: [{ restA: 1350, ok: true, flux: 10, fluxErr: 0.1 }],
    lines: [{ id: 'CIV', ok: true, fwhmKms: 5000, fwhmErrKms: 100, sigmaKms: 2100, sigmaErrKms: 50 }],
    absorption: { ok: false, reason: 'C IV trough region not covered', troughs: [] },
    draws: 0,
    noiseEstimated: false,
  };
}

describe('export of bulk-accepted quasars', () => {
  it('measures them in the worker at their z, fills the physics cells and keeps the note where it cannot', async () => {
    const files = ['cal.txt', 'uncal.txt', 'unreadable.txt'];
    const { session, db } = await makeSession(undefined, new ScriptedFitter((f) => makeResult(f)));
    await session.setReviewer('Tester');
    await session.addFiles(files.map((f) => ({ path: f, bytes: textBytes(f) })));
    await waitUntil(() => session.getSnapshot().rows.every((r) => r.status === 'ok'), 'fits');
    const measureQuasarFile = vi.fn(async (bytes: Uint8Array, file: string, z: number) =>
      file === 'unreadable.txt' ? { error: `${file}: not a spectrum this reader knows` } : measurementAt(z, new TextDecoder().decode(bytes) === 'cal.txt'),
    );
    const review = fakeReview({ measureQuasarFile });
    const blobs: Blob[] = [];
    Object.assign(URL, { createObjectURL: vi.fn((b: Blob) => (blobs.push(b), 'blob:test')), revokeObjectURL: vi.fn() });
    const spy = vi.spyOn(HTMLAnchorElement.prototype, 'click').mockImplementation(() => {});
    render(<App services={{ session, review }} />);
    await screen.findByText('200 px');

    fireEvent.click(screen.getByTestId('bulk-accept'));
    fireEvent.click(screen.getByTestId('bulk-confirm-accept'));
    await waitUntil(() => session.getSnapshot().rows.every((r) => r.decision?.state === 'accepted'), 'bulk accept');
    // The fixture fits are quasars at z 1.2 with no quasar measurement (fitted before quasar physics existed).
    expect(session.getSnapshot().rows.every((r) => r.decision!.class === 'qso' && r.decision!.quasar === undefined)).toBe(true);

    fireEvent.keyDown(window, { key: 't' });
    fireEvent.click(await screen.findByTestId('export-download'));
    const status = await screen.findByText(/Saved 3 rows/);
    expect(status.textContent).toContain('Quasar physics measured now for 2 decisions');
    expect(status.textContent).toContain('1 quasar decisions could not be measured');
    expect(measureQuasarFile).toHaveBeenCalledTimes(3);
    expect(measureQuasarFile).toHaveBeenCalledWith(textBytes('cal.txt'), 'cal.txt', 1.2);

    const rows = parseCatalogueCsv(await blobs[0].text()).rows;
    const byFile = new Map(rows.map((r) => [r.file, r]));
    // Cell for cell what the core row gives with that measurement on the decision.
    const snap = session.getSnapshot();
    for (const f of ['cal.txt', 'uncal.txt']) {
      const row = snap.rows.find((r) => r.file === f)!;
      const decision = decisionWithPhysics(row.decision!, measurementAt(1.2, f === 'cal.txt'));
      const expected = catalogueRow(withDecisionPhysics(makeResult(f), decision), decision, snap.cosmology);
      expect(byFile.get(f)).toEqual(expected);
    }
    const cal = byFile.get('cal.txt')!;
    expect(cal.qso_phys_z).toBe('1.200000');
    expect(Number(cal.fwhm_civ_kms)).toBe(5000);
    expect(cal.log_mbh).not.toBe('');
    // Uncalibrated flux: the width, no luminosity or mass, and the note says why.
    const uncal = byFile.get('uncal.txt')!;
    expect(Number(uncal.fwhm_civ_kms)).toBe(5000);
    expect(uncal.loglam1350).toBe('');
    expect(uncal.qso_phys_note).toContain('no luminosities: no flux unit in the file');
    // Not measurable: empty cells, the earlier note.
    const none = byFile.get('unreadable.txt')!;
    expect(none.fwhm_civ_kms).toBe('');
    expect(none.qso_phys_note).toContain('not measured');

    // The measurements stay with the decisions (same decidedAt: a bulk undo still knows them); a second export measures only the unreadable one.
    await waitUntil(() => session.getSnapshot().rows.filter((r) => r.decision?.quasar).length === 2, 'kept measurements');
    expect(session.getSnapshot().rows.find((r) => r.file === 'cal.txt')!.decision!.decidedAt).toBe(snap.rows.find((r) => r.file === 'cal.txt')!.decision!.decidedAt);
    fireEvent.click(screen.getByTestId('export-download'));
    await waitUntil(() => blobs.length === 2, 'second export');
    expect(measureQuasarFile).toHaveBeenCalledTimes(4);
    expect(measureQuasarFile).toHaveBeenLastCalledWith(textBytes('unreadable.txt'), 'unreadable.txt', 1.2);
    spy.mockRestore();
    db.close();
  });
});

describe('measureMissingPhysics', () => {
  it('asks only for decided quasars without physics at their z, in batches, with progress after each', async () => {
    const n = MEASURE_BATCH + 2;
    const rows = [
      ...Array.from({ length: n }, (_, i) => ({ key: `q${i}`, decision: makeDecision(`q${i}`, { state: 'changed', z: 1.3, howSet: 'typed' }) })),
      { key: 'measured', decision: makeDecision('measured', { z: 1.2, quasar: measurementAt(1.2, true) }) },
      { key: 'fitHasIt', decision: makeDecision('fitHasIt', { z: 1.2 }) },
      { key: 'rejected', decision: makeDecision('rejected', { state: 'rejected', z: null, zErr: null }) },
      { key: 'galaxy', decision: makeDecision('galaxy', { class: 'galaxy', z: 0.3 }) },
      { key: 'unreviewed' },
    ];
    const results = new Map(rows.map((r) => [r.key, makeResult(r.key, r.key === 'fitHasIt' ? { quasar: measurementAt(1.2, true) } : {})]));
    const measure = vi.fn(async (key: string, z: number) => (key === 'q0' ? null : measurementAt(z, true)));
    const progress: [number, number][] = [];
    const got = await measureMissingPhysics(rows, async (k) => results.get(k), measure, (d, t) => progress.push([d, t]));
    expect(measure.mock.calls.map((c) => c[0]).sort()).toEqual(rows.slice(0, n).map((r) => r.key).sort());
    expect(measure.mock.calls.every((c) => c[1] === 1.3)).toBe(true);
    expect(progress).toEqual([[MEASURE_BATCH, n], [n, n]]);
    expect(got.measured.size).toBe(n - 1);
    expect(got.failed).toBe(1);
  });
});
