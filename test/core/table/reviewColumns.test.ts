// @vitest-environment jsdom
/**
 * The review columns a person fills besides the redshift: the named line
 * (line_id, line_observed_a) and the review flags (review_flags), in the core
 * row and in every writer (CSV, JSON, VOTable, FITS).
 */
import { describe, expect, it } from 'vitest';
import { catalogueRow } from '../../../src/core/table/rows';
import { CATALOGUE_COLUMNS, columnByName } from '../../../src/core/table/columns';
import { catalogueCsv, parseCatalogueCsv } from '../../../src/core/table/csv';
import { catalogueJson } from '../../../src/core/table/json';
import { catalogueVotable } from '../../../src/core/table/votable';
import { catalogueFits } from '../../../src/core/table/fitsTable';
import { walkHdus } from '../../../src/core/io/fits/hdus';
import { tableColumns } from '../../../src/core/io/fits/table';
import { DEFAULT_COSMOLOGY } from '../../../src/core/cosmology';
import { restWavelengthA } from '../../../src/core/lines/catalogue';
import { REVIEW_FLAGS, type ReviewDecision } from '../../../src/core/types';
import { decision, failedResult, META, okResult } from './fixtures';

const COSMO = DEFAULT_COSMOLOGY;
// Issue 10's example: C IV named at an observed 5338.8 A; the final z is that line's own, observed / rest - 1.
const OBSERVED_A = 5338.8;
const civ: ReviewDecision = decision({
  state: 'changed',
  z: OBSERVED_A / restWavelengthA('CIV') - 1,
  class: 'qso',
  howSet: 'line',
  lineId: { id: 'CIV', observedA: OBSERVED_A },
  // Given out of order and with a repeat: the cell writes each once, in REVIEW_FLAGS order.
  flags: ['blend', 'broad-absorption', 'blend'],
});
const rows = [
  catalogueRow(okResult(), civ, COSMO),
  catalogueRow(okResult({ file: 'b.fits' }), decision({ file: 'b.fits', state: 'rejected', z: null, zErr: null, class: 'unknown', flags: ['low-snr'], lineId: { id: 'CIV', observedA: 1 } }), COSMO),
  catalogueRow(failedResult(), undefined, COSMO),
];

describe('review columns: names, places and meaning', () => {
  it('line_id and line_observed_a follow how_set; review_flags follows note', () => {
    const names = CATALOGUE_COLUMNS.map((c) => c.name);
    expect(names.slice(names.indexOf('how_set'), names.indexOf('how_set') + 3)).toEqual(['how_set', 'line_id', 'line_observed_a']);
    expect(names[names.indexOf('note') + 1]).toBe('review_flags');
    for (const n of ['line_id', 'line_observed_a', 'review_flags']) expect(columnByName(n)?.group, n).toBe('review');
  });
  it('line_observed_a is a wavelength in Angstrom; review_flags names every flag id in its description', () => {
    expect(columnByName('line_observed_a')).toMatchObject({ type: 'float', unit: 'Angstrom', ucd: 'em.wl' });
    const desc = columnByName('review_flags')!.description;
    for (const f of REVIEW_FLAGS) expect(desc).toContain(f.id);
  });
});

describe('catalogueRow: the named line and the flags', () => {
  it('a line decision writes the line, its observed wavelength and the flags in their fixed order', () => {
    expect(rows[0]).toMatchObject({ how_set: 'line', line_id: 'CIV', line_observed_a: '5338.800', review_flags: 'broad-absorption;blend' });
    // final_z is the named line's own redshift (issue 10 gives 2.4465 for this line).
    expect(Number(rows[0].final_z)).toBeCloseTo(2.4465, 4);
  });
  it('a rejection keeps its flags but names no line (no redshift was kept)', () => {
    expect(rows[1]).toMatchObject({ review_state: 'rejected', line_id: '', line_observed_a: '', review_flags: 'low-snr' });
  });
  it('no decision, an unreviewed decision, or a decision stored before flags existed: empty cells', () => {
    expect(rows[2]).toMatchObject({ line_id: '', line_observed_a: '', review_flags: '' });
    const unreviewed = catalogueRow(okResult(), decision({ state: 'unreviewed', z: null, zErr: null, flags: ['low-snr'] }), COSMO);
    expect(unreviewed.review_flags).toBe('');
    const older = decision({ state: 'accepted' });
    delete older.flags;
    expect(catalogueRow(okResult(), older, COSMO)).toMatchObject({ review_flags: '', line_id: '' });
  });
  it('words that are no flag are left out of the cell', () => {
    const odd = decision({ flags: ['low-snr', 'not-a-flag'] as unknown as ReviewDecision['flags'] });
    expect(catalogueRow(okResult(), odd, COSMO).review_flags).toBe('low-snr');
  });
});

describe('every writer carries the review columns', () => {
  it('CSV: written and read back unchanged (the ; list needs no quoting)', () => {
    const text = catalogueCsv(rows, CATALOGUE_COLUMNS, META);
    const back = parseCatalogueCsv(text);
    expect(back.columns).toEqual(CATALOGUE_COLUMNS.map((c) => c.name));
    expect(back.rows[0]).toMatchObject({ line_id: 'CIV', line_observed_a: '5338.800', review_flags: 'broad-absorption;blend' });
    expect(back.rows).toEqual(rows);
  });
  it('JSON: the wavelength a number, the flags text, empty wavelength null', () => {
    const doc = catalogueJson(rows, CATALOGUE_COLUMNS, META);
    expect(doc.rows[0]).toMatchObject({ line_id: 'CIV', line_observed_a: 5338.8, review_flags: 'broad-absorption;blend' });
    expect(doc.rows[1].line_observed_a).toBeNull();
    expect(doc.columns.find((c) => c.name === 'line_observed_a')).toMatchObject({ unit: 'Angstrom', type: 'float' });
  });
  it('VOTable: a double FIELD in 0.1 nm (Angstrom in VOUnit 1.0 sec. 2.5 spelling) for the wavelength, char FIELDs for the line and the flags, the cells in TD', () => {
    const doc = new DOMParser().parseFromString(catalogueVotable(rows, CATALOGUE_COLUMNS, META), 'application/xml');
    expect(doc.getElementsByTagName('parsererror').length).toBe(0);
    const fields = [...doc.getElementsByTagName('FIELD')];
    const at = (n: string) => fields.findIndex((f) => f.getAttribute('name') === n);
    expect(fields[at('line_observed_a')].getAttribute('datatype')).toBe('double');
    expect(fields[at('line_observed_a')].getAttribute('unit')).toBe('0.1nm');
    expect(fields[at('review_flags')].getAttribute('datatype')).toBe('char');
    const tds = [...doc.getElementsByTagName('TR')[0].getElementsByTagName('TD')].map((t) => t.textContent);
    expect([tds[at('line_id')], tds[at('line_observed_a')], tds[at('review_flags')]]).toEqual(['CIV', '5338.800', 'broad-absorption;blend']);
  });
  it('FITS: the project reader finds the columns; the cells decode to the row values', () => {
    const bytes = catalogueFits(rows, CATALOGUE_COLUMNS, META);
    const hdus = walkHdus(bytes, 'cat.fits');
    const cols = tableColumns(hdus[1], 'cat.fits');
    const hdu = hdus[1];
    const rowBytes = cols.reduce((n, c) => Math.max(n, c.offset + c.width), 0);
    const view = new DataView(bytes.buffer, bytes.byteOffset);
    const cell = (r: number, name: string) => {
      const c = cols.find((x) => x.name === name)!;
      const off = hdu.dataOffset + r * rowBytes + c.offset;
      // FITS 4.0 sec. 7.3.3: D is big-endian IEEE double, A is ASCII padded with blanks or NULs.
      if (c.type === 'D') return view.getFloat64(off, false);
      return new TextDecoder().decode(bytes.subarray(off, off + c.width)).replace(/[ \0]+$/, '');
    };
    expect(cell(0, 'line_id')).toBe('CIV');
    expect(cell(0, 'line_observed_a')).toBe(5338.8);
    expect(cell(0, 'review_flags')).toBe('broad-absorption;blend');
    expect(cell(1, 'review_flags')).toBe('low-snr');
    expect(Number.isNaN(cell(1, 'line_observed_a') as number)).toBe(true);
  });
});
