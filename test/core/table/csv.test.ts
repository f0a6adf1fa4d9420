import { describe, expect, it } from 'vitest';
import { catalogueCsv, CatalogueParseError, csvRecord, guardCell, parseCatalogueCsv, quoteCsv } from '../../../src/core/table/csv';
import { AUTOMATIC_COLUMNS, CATALOGUE_COLUMNS, columnByName } from '../../../src/core/table/columns';
import { automaticRow, catalogueRow } from '../../../src/core/table/rows';
import { DEFAULT_COSMOLOGY } from '../../../src/core/cosmology';
import { decision, failedResult, META, okResult } from './fixtures';

const NOTE = columnByName('note')!;
const Z = columnByName('z')!;

describe('quoteCsv(cell): RFC 4180 sec. 2 rules 5-7', () => {
  it('leaves plain cells alone', () => {
    expect(quoteCsv('abc')).toBe('abc');
    expect(quoteCsv('')).toBe('');
    expect(quoteCsv(' padded ')).toBe(' padded ');
  });
  it('quotes cells with comma, double quote, CR or LF and doubles inner quotes', () => {
    expect(quoteCsv('a,b')).toBe('"a,b"');
    expect(quoteCsv('say "hi"')).toBe('"say ""hi"""');
    expect(quoteCsv('two\nlines')).toBe('"two\nlines"');
    expect(quoteCsv('cr\rhere')).toBe('"cr\rhere"');
    expect(quoteCsv('"')).toBe('""""');
  });
});

describe('csvRecord(cells): RFC 4180 sec. 2 rules 1-7', () => {
  it('joins quoted cells with commas and ends the record with CRLF', () => {
    expect(csvRecord(['aaa', 'b,b', 'c"c', ''])).toBe('aaa,"b,b","c""c",\r\n');
    expect(csvRecord(['two\r\nlines', 'x'])).toBe('"two\r\nlines",x\r\n');
  });
});

describe('guardCell(col, cell): formula injection (OWASP CSV injection advice)', () => {
  it('neutralises text that a spreadsheet would run', () => {
    expect(guardCell(NOTE, "=cmd|' /C calc'!A0")).toBe("'=cmd|' /C calc'!A0");
    expect(guardCell(NOTE, '+1+1')).toBe("'+1+1");
    expect(guardCell(NOTE, '@SUM(A1:A9)')).toBe("'@SUM(A1:A9)");
    expect(guardCell(NOTE, '-2+3')).toBe("'-2+3");
    expect(guardCell(NOTE, '\t=1')).toBe("'\t=1");
    expect(guardCell(NOTE, '\r=1')).toBe("'\r=1");
  });
  it('leaves ordinary text and the empty cell alone', () => {
    expect(guardCell(NOTE, 'broad C IV, 2+ lines')).toBe('broad C IV, 2+ lines');
    expect(guardCell(NOTE, '')).toBe('');
  });
  it('keeps a negative number in a numeric column a number', () => {
    expect(guardCell(Z, '-0.000120')).toBe('-0.000120');
    expect(guardCell(columnByName('dec_deg')!, '-2.5000000')).toBe('-2.5000000');
  });
  it('treats a non-number in a numeric column as text', () => {
    expect(guardCell(Z, '-2+3')).toBe("'-2+3");
    expect(guardCell(Z, '=1')).toBe("'=1");
  });
  it('adds one more apostrophe to text already starting with one, so reading back is lossless', () => {
    expect(guardCell(NOTE, "'quoted")).toBe("''quoted");
  });
});

describe('catalogueCsv(rows, columns, meta, options)', () => {
  const rows = [automaticRow(okResult(), DEFAULT_COSMOLOGY), automaticRow(failedResult(), DEFAULT_COSMOLOGY)];
  it('writes the comment block, the column names and one CRLF line per row', () => {
    const text = catalogueCsv(rows, AUTOMATIC_COLUMNS, META);
    const lines = text.split('\r\n');
    expect(lines.at(-1)).toBe(''); // ends with CRLF
    expect(text.replace(/\r\n/g, '')).not.toMatch(/\n/); // no bare LF anywhere here
    const comments = lines.filter((l) => l.startsWith('#'));
    expect(comments[0]).toBe('# software: Shiftmark 0.1.0');
    expect(comments).toContain('# template_set: lantern-templates-1');
    expect(comments).toContain(
      '# cosmology: flat Lambda-CDM: H0 = 70 km/s/Mpc, Omega_m = 0.3, Omega_Lambda = 0.7, Omega_k = 0, Omega_r = 0',
    );
    expect(comments).toContain('# created: 2026-03-05T10:00:00Z');
    expect(comments.some((l) => /^# caution: .*hypotheses/.test(l))).toBe(true);
    const header = lines[comments.length];
    expect(header).toBe(AUTOMATIC_COLUMNS.map((c) => c.name).join(','));
    expect(lines.length).toBe(comments.length + 1 + rows.length + 1);
  });
  it('without the header block, starts with the column names', () => {
    const text = catalogueCsv(rows, AUTOMATIC_COLUMNS, META, { headerBlock: false });
    expect(text.startsWith('file,object_id,ra_deg,')).toBe(true);
    expect(text).not.toMatch(/^#/m);
  });
  it('the failed row carries its error and empty numbers', () => {
    const parsed = parseCatalogueCsv(catalogueCsv(rows, AUTOMATIC_COLUMNS, META));
    expect(parsed.rows[1].error).toBe('night2/ld-0099.fits (HDU 1): NAXIS1 claims 2147483648 pixels');
    expect(parsed.rows[1].z).toBe('');
  });
  it('guards a hostile note and object id but not a negative z', () => {
    const r = okResult({ z: -0.00012, class: 'star' });
    r.input = { ...r.input, meta: { ...r.input.meta, objectId: '=HYPERLINK("http://x")' } };
    const row = catalogueRow(r, decision({ note: '@SUM(1,2)', state: 'accepted', z: -0.00012, class: 'star' }), DEFAULT_COSMOLOGY);
    const text = catalogueCsv([row], CATALOGUE_COLUMNS, META, { headerBlock: false });
    const dataLine = text.split('\r\n')[1];
    expect(dataLine).toContain(`"'=HYPERLINK(""http://x"")"`);
    expect(dataLine).toContain(`"'@SUM(1,2)"`);
    expect(dataLine).toContain(',-0.000120,');
    expect(dataLine).not.toContain("'-0.000120");
  });
  it('flattens line breaks in header values so the comment block stays one line per entry', () => {
    const text = catalogueCsv([], AUTOMATIC_COLUMNS, { ...META, templateSet: 'a\r\nb' });
    expect(text).toContain('# template_set: a b\r\n');
  });
});

describe('parseCatalogueCsv(text)', () => {
  const tricky = [
    catalogueRow(okResult(), decision({ note: 'line one\r\nline "two", with comma' }), DEFAULT_COSMOLOGY),
    catalogueRow(okResult({ file: 'odd,name "x".fits' }), decision({ file: 'odd,name "x".fits', note: "=cmd|' /C calc'!A0" }), DEFAULT_COSMOLOGY),
    catalogueRow(okResult({ file: 'c.fits' }), decision({ file: 'c.fits', note: "'already quoted", reviewer: '+ + +' }), DEFAULT_COSMOLOGY),
    catalogueRow(failedResult(), undefined, DEFAULT_COSMOLOGY),
    catalogueRow(okResult({ file: 'u.fits' }), decision({ file: 'u.fits', note: 'Übergang, naïve — ok', state: 'accepted' }), DEFAULT_COSMOLOGY),
  ];
  it('reads back exactly the rows written (round trip), with and without the header block', () => {
    for (const headerBlock of [true, false]) {
      const parsed = parseCatalogueCsv(catalogueCsv(tricky, CATALOGUE_COLUMNS, META, { headerBlock }));
      expect(parsed.columns).toEqual(CATALOGUE_COLUMNS.map((c) => c.name));
      expect(parsed.rows).toEqual(tricky);
    }
  });
  it('returns the comment block as key/value metadata', () => {
    const parsed = parseCatalogueCsv(catalogueCsv(tricky, CATALOGUE_COLUMNS, META));
    expect(parsed.meta.software).toBe('Shiftmark 0.1.0');
    expect(parsed.meta.template_set).toBe('lantern-templates-1');
    expect(parsed.meta.cosmology).toMatch(/^flat Lambda-CDM: H0 = 70 km\/s\/Mpc/);
  });
  it('accepts LF line ends, a byte-order mark and a missing final line break', () => {
    const parsed = parseCatalogueCsv('\ufeffa,b\n1,"x\ny"\n2,z');
    expect(parsed.columns).toEqual(['a', 'b']);
    expect(parsed.rows).toEqual([{ a: '1', b: 'x\ny' }, { a: '2', b: 'z' }]);
  });
  it('parses the RFC 4180 sec. 2 examples: quoted empty cell, doubled quotes', () => {
    const parsed = parseCatalogueCsv('aaa,bbb,ccc\r\n"a""b",,""\r\n');
    expect(parsed.rows).toEqual([{ aaa: 'a"b', bbb: '', ccc: '' }]);
  });
  it('skips blank lines between rows', () => {
    expect(parseCatalogueCsv('a\r\n1\r\n\r\n2\r\n').rows).toEqual([{ a: '1' }, { a: '2' }]);
  });
  it('throws CatalogueParseError with a line number on malformed input', () => {
    expect(() => parseCatalogueCsv('a,b\r\n1,2,3\r\n')).toThrow(/line 2: 3 cells where the header names 2 columns/);
    expect(() => parseCatalogueCsv('a,b\r\n1,"open\r\n')).toThrow(CatalogueParseError);
    expect(() => parseCatalogueCsv('a,b\r\n"x"y,2\r\n')).toThrow(/text after a closing quote/);
    expect(() => parseCatalogueCsv('a,a\r\n1,2\r\n')).toThrow(/appears twice/);
    expect(() => parseCatalogueCsv('# only: comments\r\n')).toThrow(/no column-name row/);
  });
  it('reads CR-only line ends, and a quote inside an unquoted cell as text (as written by hand)', () => {
    expect(parseCatalogueCsv('a,b\r1,2\r3,"x\ry"\r').rows).toEqual([{ a: '1', b: '2' }, { a: '3', b: 'x\ry' }]);
    expect(parseCatalogueCsv('a,b\r\nx"y,2\r\n').rows).toEqual([{ a: 'x"y', b: '2' }]);
  });
  it('reports an unclosed quote at the line where the cell opens, after the header block', () => {
    try {
      parseCatalogueCsv('# software: x\r\na,b\r\n1,2\r\n3,"open\r\nmore\r\n');
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(CatalogueParseError);
      expect((e as Error).message).toBe('line 4: quoted cell is never closed');
    }
  });
  it('reads a cell of a million characters with doubled quotes back unchanged', () => {
    const long = 'ab"'.repeat(333_334);
    const parsed = parseCatalogueCsv(csvRecord(['a', 'b']) + csvRecord([long, 'x']));
    expect(parsed.rows[0].a).toBe(long);
  });
  it('reports the line of a row that follows a multi-line quoted cell', () => {
    try {
      parseCatalogueCsv('a,b\r\n"x\r\ny",1\r\n1\r\n');
      expect.unreachable();
    } catch (e) {
      expect((e as CatalogueParseError).line).toBe(4);
    }
  });
});
