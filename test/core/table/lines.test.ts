/**
 * The line table in every export: rows built once (lineRows), a lines CSV,
 * a `lines` array per spectrum in JSON and a second BINTABLE (LINES) in FITS.
 * Measurements are invented (fixtures.ts scenario); the expected cells follow
 * ECMA-262 Number.prototype.toFixed / toExponential at each column's digits.
 */
import { describe, expect, it } from 'vitest';
import type { LineMeasurement } from '../../../src/core/types';
import {
  CATALOGUE_COLUMNS,
  LINE_COLUMNS,
  catalogueCsv,
  catalogueFits,
  catalogueJson,
  catalogueJsonText,
  catalogueRow,
  catalogueTableWriter,
  lineRows,
  parseCatalogueCsv,
} from '../../../src/core/table';
import { DEFAULT_COSMOLOGY } from '../../../src/core/cosmology';
import { walkHdus } from '../../../src/core/io/fits/hdus';
import { tableColumns } from '../../../src/core/io/fits/table';
import { failedResult, META, okResult } from './fixtures';

function line(over: Partial<LineMeasurement>): LineMeasurement {
  return {
    id: 'CIV',
    label: 'C IV',
    kind: 'emission',
    restA: 1549.48,
    observedA: 5184.26789,
    observedErrA: 0.4321,
    z: 2.3457,
    zErr: 0.00028,
    fwhmKms: 3210.44,
    fwhmErrKms: 120.06,
    flux: 1.23456789e-15,
    fluxErr: 4.5e-17,
    ewRestA: 35.25049,
    ewRestErrA: 2.1,
    snr: 27.4349,
    detected: true,
    ...over,
  };
}

const withLines = okResult({
  lines: [line({}), line({ id: 'SiIV', label: 'Si IV', kind: 'absorption', flux: -2e-16, ewRestA: -3.5, snr: 1.2, detected: false, fwhmKms: NaN })],
  input: { ...okResult().input, meta: { ...okResult().input.meta, fluxUnit: 'erg/s/cm2/A' } },
});
const other = okResult({ file: 'night2/ld-0043.fits', lines: [line({ id: 'Lya', label: 'Ly-alpha', restA: 1215.67 })] });
const failed = failedResult();

describe('lineRows', () => {
  it('gives one row per measured line, tied to the catalogue by file, with fixed-digit cells', () => {
    const rows = lineRows(withLines);
    expect(rows).toHaveLength(2);
    expect(Object.keys(rows[0])).toEqual(LINE_COLUMNS.map((c) => c.name));
    expect(rows[0]).toMatchObject({
      file: 'night2/ld-0042.fits',
      line_id: 'CIV',
      kind: 'emission',
      rest_a: '1549.480',
      observed_a: '5184.268', // toFixed(3) rounds 5184.26789 up
      observed_err_a: '0.432',
      fwhm_kms: '3210.4',
      flux: '1.23457e-15', // 6 significant digits: flux scale depends on the file's unit
      flux_err: '4.50000e-17',
      flux_unit: 'erg/s/cm2/A',
      ew_rest_a: '35.250',
      snr: '27.43',
      detected: 'true',
    });
    expect(rows[1]).toMatchObject({ kind: 'absorption', flux: '-2.00000e-16', fwhm_kms: '', detected: 'false' });
  });

  it('gives a failed fit no line rows', () => {
    expect(lineRows(failed)).toEqual([]);
  });
});

describe('line table in the exports', () => {
  const results = [withLines, failed, other];
  const rows = results.map((r) => catalogueRow(r, undefined, DEFAULT_COSMOLOGY));
  const perRow = results.map((r) => lineRows(r));
  const flat = perRow.flat();

  it('lines CSV: one record per spectrum and line, read back unchanged (RFC 4180 quoting, csv.ts)', () => {
    const back = parseCatalogueCsv(catalogueCsv(flat, LINE_COLUMNS, META));
    expect(back.columns).toEqual(LINE_COLUMNS.map((c) => c.name));
    expect(back.rows).toEqual(flat);
    expect(back.rows.map((r) => r.file)).toEqual(['night2/ld-0042.fits', 'night2/ld-0042.fits', 'night2/ld-0043.fits']);
  });

  it('JSON: each row holds its own lines, typed, without the file the row already names', () => {
    const json = catalogueJson(rows, CATALOGUE_COLUMNS, META, perRow);
    expect(json.lineColumns!.map((c) => c.name)).toEqual(LINE_COLUMNS.filter((c) => c.name !== 'file').map((c) => c.name));
    expect(json.rows.map((r) => (r.lines as unknown[]).length)).toEqual([2, 0, 1]);
    const first = (json.rows[0].lines as Record<string, unknown>[])[0];
    expect(first).not.toHaveProperty('file');
    expect(first).toMatchObject({ line_id: 'CIV', observed_a: 5184.268, flux: 1.23457e-15, detected: true });
    expect((json.rows[0].lines as Record<string, unknown>[])[1].fwhm_kms).toBeNull();
    // Without lines the JSON keeps its earlier shape.
    expect(catalogueJson(rows, CATALOGUE_COLUMNS, META)).not.toHaveProperty('lineColumns');
    expect(catalogueJson(rows, CATALOGUE_COLUMNS, META).rows[0]).not.toHaveProperty('lines');
    expect(() => catalogueJson(rows, CATALOGUE_COLUMNS, META, perRow.slice(1))).toThrow(/2 line lists for 3 rows/);
  });

  it('JSON text, whole or row by row, parses to the same object', () => {
    const text = catalogueJsonText(rows, CATALOGUE_COLUMNS, META, perRow);
    expect(JSON.parse(text)).toEqual(catalogueJson(rows, CATALOGUE_COLUMNS, META, perRow));
    const w = catalogueTableWriter('json', { ...META, columns: CATALOGUE_COLUMNS, lines: true });
    expect(w.begin() + rows.map((r, i) => w.row(r, perRow[i])).join('') + w.end()).toBe(text);
  });

  it('FITS: a second BINTABLE named LINES, one row per spectrum and line (FITS 4.0 sec. 7.3), read by the project reader', () => {
    const bytes = catalogueFits(rows, CATALOGUE_COLUMNS, META, flat);
    expect(bytes.length % 2880).toBe(0); // FITS 4.0 sec. 3.1: whole 2880-byte blocks
    const hdus = walkHdus(bytes, 'c.fits');
    expect(hdus.map((h) => h.kind)).toEqual(['empty', 'bintable', 'bintable']);
    expect(hdus.map((h) => h.extname)).toEqual(['', 'CATALOGUE', 'LINES']);
    expect(hdus[2].axes[1]).toBe(3); // NAXIS2
    const cols = tableColumns(hdus[2], 'c.fits');
    expect(cols.map((c) => c.name)).toEqual(LINE_COLUMNS.map((c) => c.name));
    // The file column is wide enough for the longest name (FITS 4.0 sec. 7.3.3: rA, r characters).
    expect(cols[0].repeat).toBe('night2/ld-0042.fits'.length);
    // The first FILE cell holds the first line's spectrum.
    const text = new TextDecoder().decode(bytes.subarray(hdus[2].dataOffset, hdus[2].dataOffset + cols[0].repeat));
    expect(text).toBe('night2/ld-0042.fits');
    // Without lines there is no LINES extension.
    expect(walkHdus(catalogueFits(rows, CATALOGUE_COLUMNS, META), 'c.fits')).toHaveLength(2);
  });
});
