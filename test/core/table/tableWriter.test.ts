import { describe, expect, it } from 'vitest';
import { catalogueTableWriter } from '../../../src/core/table/tableWriter';
import { catalogueCsv, parseCatalogueCsv } from '../../../src/core/table/csv';
import { catalogueJson, catalogueJsonText } from '../../../src/core/table/json';
import { AUTOMATIC_COLUMNS, CATALOGUE_COLUMNS } from '../../../src/core/table/columns';
import { automaticRow, catalogueRow } from '../../../src/core/table/rows';
import { DEFAULT_COSMOLOGY } from '../../../src/core/cosmology';
import { decision, failedResult, META, okResult } from './fixtures';

const rows = [automaticRow(okResult(), DEFAULT_COSMOLOGY), automaticRow(failedResult(), DEFAULT_COSMOLOGY)];

function writeAll(format: 'csv' | 'json', opts: Parameters<typeof catalogueTableWriter>[1], rs = rows): string {
  const w = catalogueTableWriter(format, opts);
  return w.begin() + rs.map((r) => w.row(r)).join('') + w.end();
}

describe('catalogueTableWriter(format, options)', () => {
  it('csv: row by row gives the same bytes as catalogueCsv, automatic columns by default', () => {
    expect(writeAll('csv', META)).toBe(catalogueCsv(rows, AUTOMATIC_COLUMNS, META));
    expect(writeAll('csv', { ...META, headerBlock: false })).toBe(catalogueCsv(rows, AUTOMATIC_COLUMNS, META, { headerBlock: false }));
  });
  it('json: row by row gives the same bytes as catalogueJsonText and parses to catalogueJson', () => {
    const text = writeAll('json', META);
    expect(text).toBe(catalogueJsonText(rows, AUTOMATIC_COLUMNS, META));
    expect(JSON.parse(text)).toEqual(catalogueJson(rows, AUTOMATIC_COLUMNS, META));
    expect(text.split('\n').filter((l) => l.startsWith('    {"file"')).length).toBe(2); // one line per row
  });
  it('json with no rows is still valid', () => {
    expect(JSON.parse(writeAll('json', META, [])).rows).toEqual([]);
  });
  it('honours a column list (full catalogue)', () => {
    const full = [catalogueRow(okResult(), decision(), DEFAULT_COSMOLOGY)];
    expect(writeAll('csv', { ...META, columns: CATALOGUE_COLUMNS }, full)).toBe(catalogueCsv(full, CATALOGUE_COLUMNS, META));
  });
  it('writes extra provenance (e.g. the shard) after the creation time, one line each', () => {
    const text = writeAll('csv', { ...META, extra: { shard: '2/8', 'input list': 'ab12\ncd' } });
    const comments = text.split('\r\n').filter((l) => l.startsWith('#'));
    const created = comments.findIndex((l) => l.startsWith('# created:'));
    expect(comments[created + 1]).toBe('# shard: 2/8');
    expect(comments[created + 2]).toBe('# input_list: ab12 cd');
    expect(parseCatalogueCsv(text).meta.shard).toBe('2/8');
    expect(JSON.parse(writeAll('json', { ...META, extra: { shard: '2/8' } })).meta.extra).toEqual({ shard: '2/8' });
  });
  it('refuses a row whose cells are not formatted strings, and an unknown format', () => {
    const w = catalogueTableWriter('csv', META);
    expect(() => w.row({ file: 'a.fits', z: 1.5 })).toThrow(/cell z must be a formatted string/);
    expect(() => catalogueTableWriter('xml' as 'csv', META)).toThrow(/unknown table format/);
  });
  it('shards merge: the rows of two CSV shards read back equal the rows of one table', () => {
    const a = parseCatalogueCsv(writeAll('csv', { ...META, extra: { shard: '1/2' } }, rows.slice(0, 1)));
    const b = parseCatalogueCsv(writeAll('csv', { ...META, extra: { shard: '2/2' } }, rows.slice(1)));
    expect(a.columns).toEqual(b.columns);
    expect([...a.rows, ...b.rows]).toEqual(parseCatalogueCsv(writeAll('csv', META)).rows);
  });
});
