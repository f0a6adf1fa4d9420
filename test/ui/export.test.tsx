// @vitest-environment jsdom
import { describe, it, expect, afterEach, vi } from 'vitest';
import { render, screen, fireEvent, cleanup } from '@testing-library/react';
import { buildExport } from '../../src/ui/export/buildExport';
import { DEFAULT_COSMOLOGY } from '../../src/core/cosmology';
import { CATALOGUE_COLUMNS, LINE_COLUMNS, catalogueRow, lineRows, parseCatalogueCsv } from '../../src/core/table';
import { walkHdus } from '../../src/core/io/fits/hdus';
import type { LineMeasurement } from '../../src/core/types';
import { makeResult, makeFailed, makeDecision, textBytes } from './fixtures';
import { fakeReview, makeSession, waitUntil, ScriptedFitter } from './harness';

vi.mock('../../src/ui/plots', () => import('./plotsStub'));
const { App } = await import('../../src/ui/App');

afterEach(cleanup);

const results = new Map([
  ['k1', makeResult('one.fits')],
  ['k2', makeFailed('two.fits', 'two.fits: missing END card')],
  ['k3', makeResult('three.fits', { z: 0.5 })],
]);
const source = {
  rows: [
    { key: 'k1', decision: makeDecision('one.fits', { state: 'changed', z: 1.25, howSet: 'typed', note: '=SUM(A1)' }) },
    { key: 'k2' },
    { key: 'k3' },
    { key: 'k4' }, // never fitted
  ],
  getResult: async (k: string) => results.get(k),
};

describe('buildExport', () => {
  it('CSV carries the header block, the column names and one row per fitted file', async () => {
    const built = await buildExport(source, 'csv', DEFAULT_COSMOLOGY, 'all', '2026-01-02T00:00:00Z');
    expect(built.rowCount).toBe(3);
    expect(built.notFitted).toBe(1);
    const text = built.data as string;
    expect(text).toMatch(/^# software: Shiftmark /);
    expect(text).toMatch(/# cosmology: flat Lambda-CDM: H0 = 70/);
    const parsed = parseCatalogueCsv(text);
    expect(parsed.rows.map((r) => r.file)).toEqual(['one.fits', 'two.fits', 'three.fits']);
    expect(parsed.rows[0]).toMatchObject({ review_state: 'changed', how_set: 'typed', final_z: '1.250000', reviewer: 'Tester', note: '=SUM(A1)' });
    expect(parsed.rows[1]).toMatchObject({ review_state: 'unreviewed', error: 'two.fits: missing END card' });
    // The formula guard (RFC 4180 export, common practice against CSV injection) is applied in the file itself.
    expect(text).toContain("'=SUM(A1)");
  });

  it('plain CSV has no comment block; reviewed-only keeps decided rows', async () => {
    const built = await buildExport(source, 'csv-plain', DEFAULT_COSMOLOGY, 'reviewed');
    const text = built.data as string;
    expect(text.startsWith('file,')).toBe(true);
    expect(built.rowCount).toBe(1);
  });

  it('FITS, VOTable and JSON come out of the same rows', async () => {
    const fits = await buildExport(source, 'fits', DEFAULT_COSMOLOGY);
    expect(fits.data).toBeInstanceOf(Uint8Array);
    // FITS 4.0 sec. 3.1: a file is a whole number of 2880-byte blocks, starting with SIMPLE.
    expect((fits.data as Uint8Array).length % 2880).toBe(0);
    expect(new TextDecoder().decode((fits.data as Uint8Array).subarray(0, 6))).toBe('SIMPLE');
    const vot = await buildExport(source, 'votable', DEFAULT_COSMOLOGY);
    expect(vot.data as string).toContain('<VOTABLE');
    const json = JSON.parse((await buildExport(source, 'json', DEFAULT_COSMOLOGY)).data as string);
    expect(JSON.stringify(json)).toContain('three.fits');
  });
});

describe('review columns from the core catalogue row: named line and flags', () => {
  const flagged = {
    rows: [
      {
        key: 'k1',
        decision: makeDecision('one.fits', { state: 'changed', z: 5338.8 / 1549.48 - 1, howSet: 'line', lineId: { id: 'CIV', observedA: 5338.8 }, flags: ['broad-absorption', 'blend'] }),
      },
      { key: 'k3', decision: makeDecision('three.fits', { state: 'rejected', z: null, zErr: null }) },
    ],
    getResult: async (k: string) => results.get(k),
  };

  it('CSV: line id, observed wavelength and flags beside the review columns; empty where none', async () => {
    const built = await buildExport(flagged, 'csv', DEFAULT_COSMOLOGY, 'all', '2026-01-02T00:00:00Z');
    const parsed = parseCatalogueCsv(built.data as string);
    const cols = parsed.columns;
    // The browser adds no columns of its own: its table is the core catalogue, cell for cell.
    expect(cols).toEqual(CATALOGUE_COLUMNS.map((c) => c.name));
    expect(parsed.rows[0]).toEqual(catalogueRow(results.get('k1')!, flagged.rows[0].decision, DEFAULT_COSMOLOGY));
    expect(cols.indexOf('line_id')).toBe(cols.indexOf('how_set') + 1);
    expect(cols.indexOf('review_flags')).toBe(cols.indexOf('note') + 1);
    expect(parsed.rows[0]).toMatchObject({ how_set: 'line', line_id: 'CIV', line_observed_a: '5338.800', review_flags: 'broad-absorption;blend' });
    // The final z is the named line's own: observed / rest - 1.
    expect(Number(parsed.rows[0].final_z)).toBeCloseTo(Number(parsed.rows[0].line_observed_a) / 1549.48 - 1, 6);
    expect(parsed.rows[1]).toMatchObject({ review_state: 'rejected', line_id: '', line_observed_a: '', review_flags: '' });
  });

  it('JSON, VOTable and FITS carry the same columns', async () => {
    const json = (await buildExport(flagged, 'json', DEFAULT_COSMOLOGY)).data as string;
    expect(json).toContain('broad-absorption;blend');
    expect(json).toContain('"line_id"');
    const vot = (await buildExport(flagged, 'votable', DEFAULT_COSMOLOGY)).data as string;
    expect(vot).toMatch(/<FIELD[^>]*name="review_flags"/);
    expect(vot).toMatch(/<FIELD[^>]*name="line_observed_a"/);
    const fits = new TextDecoder().decode((await buildExport(flagged, 'fits', DEFAULT_COSMOLOGY)).data as Uint8Array);
    expect(fits).toContain("'review_flags");
  });
});

describe('line measurements in the exports (the core line table, as the command line writes it)', () => {
  // Invented measurements (fixtures.ts: the UI moves data, not science).
  const measured = (id: string, observedA: number): LineMeasurement => ({
    id, label: id, kind: 'emission', restA: 1549.48, observedA, observedErrA: 0.5, z: observedA / 1549.48 - 1, zErr: 0.0003,
    fwhmKms: 2500, fwhmErrKms: 100, flux: 12.5, fluxErr: 1.5, ewRestA: 30, ewRestErrA: 3, snr: 8.3, detected: true,
  });
  const fitted = new Map([
    ['k1', makeResult('night1/one.fits', { lines: [measured('CIV', 5338.8), measured('CIII', 6560.1)] })],
    ['k2', makeFailed('night1/two.fits', 'night1/two.fits: missing END card')],
    ['k3', makeResult('three.fits', { lines: [measured('MgII', 7001.2)] })],
  ]);
  const withLines = { rows: [{ key: 'k1' }, { key: 'k2' }, { key: 'k3' }], getResult: async (k: string) => fitted.get(k) };
  const expectedLines = [...fitted.values()].flatMap((r) => lineRows(r));

  it('lines CSV: one row per spectrum and line, the file as in the catalogue', async () => {
    const built = await buildExport(withLines, 'lines-csv', DEFAULT_COSMOLOGY);
    expect(built.lineCount).toBe(3);
    const parsed = parseCatalogueCsv(built.data as string);
    expect(parsed.columns).toEqual(LINE_COLUMNS.map((c) => c.name));
    expect(parsed.rows).toEqual(expectedLines);
    expect(parsed.rows.map((r) => r.file)).toEqual(['night1/one.fits', 'night1/one.fits', 'three.fits']);
  });

  it('JSON: every row carries its lines; FITS and VOTable: a line table after the catalogue', async () => {
    const json = JSON.parse((await buildExport(withLines, 'json', DEFAULT_COSMOLOGY)).data as string);
    expect(json.rows.map((r: { lines: unknown[] }) => r.lines.length)).toEqual([2, 0, 1]);
    expect(json.rows[0].lines[1]).toMatchObject({ line_id: 'CIII', observed_a: 6560.1, fwhm_err_kms: 100, ew_rest_err_a: 3 });
    const fits = await buildExport(withLines, 'fits', DEFAULT_COSMOLOGY);
    expect(fits.lineCount).toBe(3);
    const hdus = walkHdus(fits.data as Uint8Array, 'export.fits');
    expect(hdus.map((h) => h.extname)).toEqual(['', 'CATALOGUE', 'LINES']);
    expect(hdus[2].axes[1]).toBe(3); // NAXIS2 (FITS 4.0 sec. 7.3.1): one row per line
    const vot = (await buildExport(withLines, 'votable', DEFAULT_COSMOLOGY)).data as string;
    expect(vot).toContain('<TABLE name="line_measurements" nrows="3">');
  });
});

describe('ExportPanel', () => {
  it('t opens the panel and Download saves a CSV through a Blob link', async () => {
    const { session, db } = await makeSession(undefined, new ScriptedFitter());
    await session.addFiles([{ path: 'a.txt', bytes: textBytes('a') }]);
    await waitUntil(() => session.getSnapshot().rows[0]?.status === 'ok', 'fit');
    const blobs: Blob[] = [];
    const created = vi.fn((b: Blob) => (blobs.push(b), 'blob:test'));
    Object.assign(URL, { createObjectURL: created, revokeObjectURL: vi.fn() });
    const clicks: string[] = [];
    const spy = vi.spyOn(HTMLAnchorElement.prototype, 'click').mockImplementation(function (this: HTMLAnchorElement) {
      clicks.push(this.download);
    });
    render(<App services={{ session, review: fakeReview() }} />);
    await screen.findByTestId('review-panel');
    fireEvent.keyDown(window, { key: 't' });
    fireEvent.click(await screen.findByTestId('export-download'));
    await screen.findByText(/Saved 1 rows/);
    expect(clicks[0]).toMatch(/^shiftmark-catalogue-.*\.csv$/);
    const text = await blobs[0].text();
    expect(text).toContain('\r\nfile,object_id,');
    expect(text).toContain('a.txt,OBJ-a.txt');
    spy.mockRestore();
    db.close();
  });

  it('offers the line measurements CSV, saved under its own name with the line columns', async () => {
    const { session, db } = await makeSession(undefined, new ScriptedFitter());
    await session.addFiles([{ path: 'night1/a.txt', bytes: textBytes('a') }]);
    await waitUntil(() => session.getSnapshot().rows[0]?.status === 'ok', 'fit');
    const blobs: Blob[] = [];
    Object.assign(URL, { createObjectURL: vi.fn((b: Blob) => (blobs.push(b), 'blob:test')), revokeObjectURL: vi.fn() });
    const clicks: string[] = [];
    const spy = vi.spyOn(HTMLAnchorElement.prototype, 'click').mockImplementation(function (this: HTMLAnchorElement) {
      clicks.push(this.download);
    });
    render(<App services={{ session, review: fakeReview() }} />);
    await screen.findByTestId('review-panel');
    fireEvent.keyDown(window, { key: 't' });
    fireEvent.click(await screen.findByLabelText(/Line measurements CSV/));
    fireEvent.click(await screen.findByTestId('export-download'));
    await screen.findByText(/line rows from 1 spectra/);
    expect(clicks[0]).toMatch(/^shiftmark-lines-.*\.csv$/);
    const parsed = parseCatalogueCsv(await blobs[0].text());
    expect(parsed.columns).toEqual(LINE_COLUMNS.map((c) => c.name));
    spy.mockRestore();
    db.close();
  });
});
