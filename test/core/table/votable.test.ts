// @vitest-environment jsdom
import { describe, expect, it } from 'vitest';
import { catalogueVotable, voUnit, xmlEscape } from '../../../src/core/table/votable';
import { LINE_COLUMNS, lineRows } from '../../../src/core/table/lines';
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
    // VOUnit 1.0 sec. 2.3: no second solidus ('km/s/Mpc' is ambiguous); a product of powers instead.
    expect(params.H0.getAttribute('unit')).toBe('km.s**-1.Mpc**-1');
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

/**
 * A small VOUnit 1.0 checker (IVOA Recommendation 2014): sec. 2.3 syntax (an
 * optional numeric factor, units joined by '.', powers as '**n', at most one
 * solidus), sec. 2.4 units with the SI prefixes they may take. Only the units
 * this project could write are listed; 'Angstrom' is deprecated (sec. 2.5).
 * Sec. 2.6 functions: a decimal logarithm of a unit is written log(unit)
 * (from memory), as the quasar luminosity and mass columns do.
 */
const PREFIXED = ['m', 's', 'pc', 'yr', 'arcsec', 'g', 'Jy'];
const PLAIN = ['deg', 'mag', 'Angstrom', 'erg', 'solMass'];
const SI_PREFIX = '(?:da|[yzafpnumcdhkMGTPEZY])?';
const ATOM = `(?:${SI_PREFIX}(?:${PREFIXED.join('|')})|${PLAIN.join('|')})(?:\\*\\*-?\\d+)?`;
const PRODUCT = `${ATOM}(?:\\.${ATOM})*`;
const QUOTIENT = `(?:\\d+(?:\\.\\d+)?)?${PRODUCT}(?:/${ATOM})?`;
const VOUNIT = new RegExp(`^(?:${QUOTIENT}|log\\(${QUOTIENT}\\))$`);
const vounitOk = (u: string) => VOUNIT.test(u) && !/Angstrom/.test(u);

/** VOTable 1.4 sec. 2.1, table 1: the primitive datatypes. */
const DATATYPES = ['boolean', 'bit', 'unsignedByte', 'short', 'int', 'long', 'char', 'unicodeChar', 'float', 'double', 'floatComplex', 'doubleComplex'];

describe('the checker of VOUnit strings (test helper)', () => {
  it('accepts VOUnit spellings and refuses what VOUnit 1.0 rules out, so the checks below can fail', () => {
    for (const u of ['deg', 'Mpc', 'Gyr', 'km/s', 'kpc/arcsec', '0.1nm', 'km.s**-1.Mpc**-1', 'mag', 'log(erg/s)', 'log(solMass)']) expect(vounitOk(u), u).toBe(true);
    for (const u of ['km/s/Mpc', 'Angstrom', 'km s-1', 'parsec', '[erg/s]', 'log(erg/s/cm)']) expect(vounitOk(u), u).toBe(false);
  });
  it('voUnit rewrites only the deprecated Angstrom', () => {
    expect(voUnit('Angstrom')).toBe('0.1nm'); // VOUnit 1.0 sec. 2.5: 1 Angstrom = 0.1 nm
    expect(voUnit('km/s')).toBe('km/s');
  });
});

describe('catalogueVotable against the VOTable 1.4 rules', () => {
  const rows = [catalogueRow(okResult(), decision({ note: 'Zoë' }), DEFAULT_COSMOLOGY), catalogueRow(failedResult(), undefined, DEFAULT_COSMOLOGY)];
  const withLine = okResult({
    lines: [
      { id: 'CIV', label: 'C IV', kind: 'emission', restA: 1549.48, observedA: 5184.3, observedErrA: 0.4, z: 2.3458, zErr: 0.0003, fwhmKms: 3000, fwhmErrKms: 100, flux: 12, fluxErr: 1, ewRestA: 30, ewRestErrA: 2, snr: 12, detected: true },
    ],
  });
  const lines = lineRows(withLine);
  const xml = catalogueVotable(rows, CATALOGUE_COLUMNS, META, lines);
  const doc = parse(xml);

  it('starts with the XML declaration (XML 1.0 sec. 2.8) naming UTF-8, and points xsi:schemaLocation at the 1.4 schema', () => {
    expect(xml.startsWith('<?xml version="1.0" encoding="UTF-8"?>\n')).toBe(true);
    const loc = doc.documentElement.getAttributeNS('http://www.w3.org/2001/XMLSchema-instance', 'schemaLocation')!.split(/\s+/);
    expect(loc).toEqual([NS, 'http://www.ivoa.net/xml/VOTable/votable-1.4.xsd']);
  });

  it('gives every FIELD a name and a known datatype, every text FIELD an arraysize, every PARAM a value, every INFO name and value', () => {
    for (const f of [...doc.getElementsByTagName('FIELD'), ...doc.getElementsByTagName('PARAM')]) {
      expect(f.getAttribute('name')).toBeTruthy();
      expect(DATATYPES).toContain(f.getAttribute('datatype'));
      // sec. 2.2: char without arraysize is one character, so strings need arraysize="*".
      if (/char/i.test(f.getAttribute('datatype')!)) expect(f.getAttribute('arraysize')).toBe('*');
    }
    for (const p of doc.getElementsByTagName('PARAM')) expect(p.hasAttribute('value')).toBe(true); // sec. 4.1: value is required
    for (const i of doc.getElementsByTagName('INFO')) {
      expect(i.hasAttribute('name')).toBe(true);
      expect(i.hasAttribute('value')).toBe(true);
    }
  });

  it('writes every unit in VOUnit (no deprecated Angstrom, no double solidus)', () => {
    const units = [...doc.querySelectorAll('[unit]')].map((e) => e.getAttribute('unit')!);
    expect(units.length).toBeGreaterThan(5);
    for (const u of units) expect(vounitOk(u), u).toBe(true);
  });

  it('uses UCD1+ words for the file column (meta.id;meta.dataset, as the SSA standard does for a dataset id)', () => {
    const file = [...doc.getElementsByTagName('FIELD')].find((f) => f.getAttribute('name') === 'file')!;
    expect(file.getAttribute('ucd')).toBe('meta.id;meta.dataset');
  });

  it('orders elements as the 1.4 schema does: RESOURCE (DESCRIPTION, INFO, TABLE...), TABLE (DESCRIPTION, PARAM, FIELD, DATA)', () => {
    const resource = doc.getElementsByTagName('RESOURCE')[0];
    const kids = (e: Element) => [...e.children].map((c) => c.localName);
    const order = (names: string[], expected: string[]) => names.map((n) => expected.indexOf(n));
    const r = order(kids(resource), ['DESCRIPTION', 'INFO', 'TABLE']);
    expect(r).toEqual([...r].sort((a, b) => a - b));
    expect(r).not.toContain(-1);
    for (const t of doc.getElementsByTagName('TABLE')) {
      const k = order(kids(t), ['DESCRIPTION', 'PARAM', 'FIELD', 'DATA']);
      expect(k).toEqual([...k].sort((a, b) => a - b));
      expect(k).not.toContain(-1);
    }
  });

  it('puts the line table in a second TABLE, one row per spectrum and line', () => {
    const tables = [...doc.getElementsByTagName('TABLE')];
    expect(tables.map((t) => t.getAttribute('name'))).toEqual(['redshift_catalogue', 'line_measurements']);
    expect(tables[1].getAttribute('nrows')).toBe('1');
    expect([...tables[1].getElementsByTagName('FIELD')].map((f) => f.getAttribute('name'))).toEqual(LINE_COLUMNS.map((c) => c.name));
    const tds = [...tables[1].getElementsByTagName('TD')].map((td) => td.textContent);
    expect(tds).toEqual(LINE_COLUMNS.map((c) => lines[0][c.name]));
    // Without lines, one TABLE as before.
    expect(parse(catalogueVotable(rows, CATALOGUE_COLUMNS, META)).getElementsByTagName('TABLE').length).toBe(1);
  });
});
