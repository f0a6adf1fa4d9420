// @vitest-environment jsdom
import { describe, expect, it } from 'vitest';
import { catalogueVotable, xmlEscape } from '../../../src/core/table/votable';
import { CATALOGUE_COLUMNS } from '../../../src/core/table/columns';
import { catalogueRow } from '../../../src/core/table/rows';
import { DEFAULT_COSMOLOGY } from '../../../src/core/cosmology';
import { decision, failedResult, META, okResult } from './fixtures';

const NS = 'http://www.ivoa.net/xml/VOTable/v1.3'; // VOTable 1.4 keeps the 1.3 namespace (IVOA VOTable 1.4, sec. 3)

function parse(xml: string): Document {
  const doc = new DOMParser().parseFromString(xml, 'application/xml');
  const err = doc.getElementsByTagName('parsererror');
  if (err.length) throw new Error(`not well-formed: ${err[0].textContent}`);
  return doc;
}

describe('parse (the test helper)', () => {
  it('rejects XML that is not well-formed, so the checks below can fail', () => {
    expect(() => parse('<a><b></a>')).toThrow(/not well-formed/);
  });
});

describe('xmlEscape(s)', () => {
  it('escapes the five XML specials and writes TAB/LF/CR as references', () => {
    expect(xmlEscape(`<a href="x">&'</a>`)).toBe('&lt;a href=&quot;x&quot;&gt;&amp;&apos;&lt;/a&gt;');
    expect(xmlEscape('a\tb\nc\rd')).toBe('a&#9;b&#10;c&#13;d');
  });
  it('replaces characters XML 1.0 forbids with U+FFFD and keeps other Unicode', () => {
    expect(xmlEscape('a\u0000b\u001bc')).toBe('a\ufffdb\ufffdc');
    expect(xmlEscape('\ud800')).toBe('\ufffd');
    expect(xmlEscape('naïve Ω 😀')).toBe('naïve Ω 😀');
  });
});

describe('catalogueVotable(rows, columns, meta)', () => {
  const hostile = decision({ note: 'a < b && c > "d" \'e\' ]]> <!-- x -->\r\nnext line', reviewer: 'Zoë' });
  const rows = [catalogueRow(okResult(), hostile, DEFAULT_COSMOLOGY), catalogueRow(failedResult(), undefined, DEFAULT_COSMOLOGY)];
  const xml = catalogueVotable(rows, CATALOGUE_COLUMNS, META);
  const doc = parse(xml);

  it('is well-formed VOTable 1.4 in the v1.3 namespace', () => {
    const root = doc.documentElement;
    expect(root.localName).toBe('VOTABLE');
    expect(root.namespaceURI).toBe(NS);
    expect(root.getAttribute('version')).toBe('1.4');
    expect(doc.getElementsByTagName('RESOURCE').length).toBe(1);
    expect(doc.getElementsByTagName('TABLE')[0].getAttribute('nrows')).toBe('2');
  });
  it('has one FIELD per column with datatype, unit and UCD', () => {
    const fields = [...doc.getElementsByTagName('FIELD')];
    expect(fields.length).toBe(CATALOGUE_COLUMNS.length);
    expect(fields.map((f) => f.getAttribute('name'))).toEqual(CATALOGUE_COLUMNS.map((c) => c.name));
    const by = (n: string) => fields.find((f) => f.getAttribute('name') === n)!;
    expect(by('z').getAttribute('datatype')).toBe('double');
    expect(by('z').getAttribute('ucd')).toBe('src.redshift');
    expect(by('ra_deg').getAttribute('ucd')).toBe('pos.eq.ra;meta.main');
    expect(by('ra_deg').getAttribute('unit')).toBe('deg');
    expect(by('n_pix').getAttribute('datatype')).toBe('int');
    expect(by('noise_estimated').getAttribute('datatype')).toBe('boolean');
    expect(by('class').getAttribute('datatype')).toBe('char');
    expect(by('class').getAttribute('arraysize')).toBe('*');
    expect(by('reviewer').getAttribute('datatype')).toBe('unicodeChar'); // 'Zoë' is not ASCII
    expect(by('z').hasAttribute('unit')).toBe(false);
  });
  it('carries provenance in INFO and the cosmology in PARAM', () => {
    const info = Object.fromEntries([...doc.getElementsByTagName('INFO')].map((e) => [e.getAttribute('name'), e.getAttribute('value')]));
    expect(info.software).toBe('Shiftmark 0.1.0');
    expect(info.template_set).toBe('lantern-templates-1');
    expect(info.cosmology).toMatch(/^flat Lambda-CDM: H0 = 70/);
    expect(info.caution).toMatch(/hypotheses/);
    const params = Object.fromEntries([...doc.getElementsByTagName('PARAM')].map((e) => [e.getAttribute('name'), e]));
    expect(params.H0.getAttribute('value')).toBe('70');
    expect(params.H0.getAttribute('unit')).toBe('km/s/Mpc');
    expect(Number(params.Omega_Lambda.getAttribute('value'))).toBeCloseTo(0.7, 12);
  });
  it('has one TR per row with one TD per FIELD holding the table cells, text intact after escaping', () => {
    const trs = [...doc.getElementsByTagName('TR')];
    expect(trs.length).toBe(2);
    for (const [i, tr] of trs.entries()) {
      const tds = [...tr.getElementsByTagName('TD')].map((td) => td.textContent);
      expect(tds.length).toBe(CATALOGUE_COLUMNS.length);
      expect(tds).toEqual(CATALOGUE_COLUMNS.map((c) => rows[i][c.name]));
    }
    const noteIdx = CATALOGUE_COLUMNS.findIndex((c) => c.name === 'note');
    expect(trs[0].getElementsByTagName('TD')[noteIdx].textContent).toBe('a < b && c > "d" \'e\' ]]> <!-- x -->\r\nnext line');
  });
  it('the failed row has its error and empty numeric cells', () => {
    const tds = [...doc.getElementsByTagName('TR')[1].getElementsByTagName('TD')];
    const at = (n: string) => tds[CATALOGUE_COLUMNS.findIndex((c) => c.name === n)].textContent;
    expect(at('error')).toMatch(/NAXIS1 claims/);
    expect(at('z')).toBe('');
    expect(at('lum_dist_mpc')).toBe('');
  });
  it('writes an empty table as valid XML', () => {
    const d = parse(catalogueVotable([], CATALOGUE_COLUMNS, META));
    expect(d.getElementsByTagName('TR').length).toBe(0);
    expect(d.getElementsByTagName('FIELD').length).toBe(CATALOGUE_COLUMNS.length);
  });
});
