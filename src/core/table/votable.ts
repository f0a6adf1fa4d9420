/**
 * The catalogue as an IVOA VOTable 1.4 document (Ochsenbein et al. 2019, IVOA
 * Recommendation), TABLEDATA serialisation: provenance in INFO elements, the
 * cosmology in PARAM elements, one FIELD per column with datatype, unit and a
 * UCD where one plainly fits. VOTable 1.4 keeps the v1.3 namespace (spec sec. 3).
 * Empty cells are written as empty TD elements, which VOTable 1.3+ reads as null.
 * Units are written in VOUnit 1.0 (IVOA Recommendation 2014) spelling: one
 * solidus at most (sec. 2.3: 'a/b/c' is not allowed), and 'Angstrom', which
 * VOUnit lists as deprecated, as '0.1nm' (FITS keeps 'Angstrom': FITS 4.0 table 6).
 * With line rows, a second TABLE (line_measurements) follows the catalogue.
 */
import type { ColumnDef, TableRow } from './columns';
import { LINE_COLUMNS } from './lines';
import { cosmologySummary, metaEntries, type ExportMeta } from './meta';

const NS = 'http://www.ivoa.net/xml/VOTable/v1.3';

/**
 * Escape text for XML 1.0 content or attribute values. Characters XML 1.0 does
 * not allow (most C0 controls, lone surrogates, U+FFFE/U+FFFF) become U+FFFD;
 * TAB, LF and CR are written as character references so that attribute-value
 * normalisation cannot turn them into spaces.
 */
export function xmlEscape(s: string): string {
  let out = '';
  for (const ch of s) {
    const c = ch.codePointAt(0)!;
    if (ch === '&') out += '&amp;';
    else if (ch === '<') out += '&lt;';
    else if (ch === '>') out += '&gt;';
    else if (ch === '"') out += '&quot;';
    else if (ch === "'") out += '&apos;';
    else if (c === 0x9 || c === 0xa || c === 0xd) out += `&#${c};`;
    else if (c < 0x20 || (c >= 0xd800 && c <= 0xdfff) || c === 0xfffe || c === 0xffff) out += '\ufffd';
    else out += ch;
  }
  return out;
}

/** A column unit in VOUnit spelling (see module comment); units VOUnit takes as they are pass unchanged. */
export function voUnit(unit: string): string {
  return unit === 'Angstrom' ? '0.1nm' : unit;
}

/** H0's unit, km/s/Mpc, written as a product of powers (VOUnit 1.0 sec. 2.3 allows no second solidus). */
const H0_UNIT = 'km.s**-1.Mpc**-1';

function isAscii(s: string): boolean {
  return /^[\x20-\x7e]*$/.test(s);
}

function fieldAttributes(c: ColumnDef, rows: readonly TableRow[]): string {
  const a: string[] = [`name="${xmlEscape(c.name)}"`];
  switch (c.type) {
    case 'float':
      a.push('datatype="double"');
      break;
    case 'int':
      a.push('datatype="int"');
      break;
    case 'bool':
      a.push('datatype="boolean"');
      break;
    case 'text': {
      // char is ASCII only up to VOTable 1.4; wider text needs unicodeChar.
      const wide = rows.some((r) => !isAscii(r[c.name] ?? ''));
      a.push(`datatype="${wide ? 'unicodeChar' : 'char'}"`, 'arraysize="*"');
      break;
    }
  }
  if (c.unit) a.push(`unit="${xmlEscape(voUnit(c.unit))}"`);
  if (c.ucd) a.push(`ucd="${xmlEscape(c.ucd)}"`);
  return a.join(' ');
}

function tableBody(out: string[], rows: readonly TableRow[], columns: readonly ColumnDef[]): void {
  for (const c of columns) {
    out.push(`<FIELD ${fieldAttributes(c, rows)}><DESCRIPTION>${xmlEscape(c.description)}</DESCRIPTION></FIELD>`);
  }
  out.push('<DATA><TABLEDATA>');
  for (const row of rows) {
    out.push('<TR>' + columns.map((c) => `<TD>${xmlEscape(row[c.name] ?? '')}</TD>`).join('') + '</TR>');
  }
  out.push('</TABLEDATA></DATA>');
}

/**
 * The catalogue as VOTable 1.4 XML text (UTF-8 declared); with `lines`
 * (line-table rows, lines.ts), a second TABLE with one row per spectrum and line.
 */
export function catalogueVotable(rows: readonly TableRow[], columns: readonly ColumnDef[], meta: ExportMeta, lines?: readonly TableRow[]): string {
  const out: string[] = [];
  out.push('<?xml version="1.0" encoding="UTF-8"?>');
  out.push(
    `<VOTABLE version="1.4" xmlns="${NS}" xmlns:xsi="http://www.w3.org/2001/XMLSchema-instance" ` +
      `xsi:schemaLocation="${NS} http://www.ivoa.net/xml/VOTable/votable-1.4.xsd">`,
  );
  out.push('<RESOURCE type="results">');
  out.push('<DESCRIPTION>Redshift catalogue</DESCRIPTION>');
  for (const [k, v] of metaEntries(meta, columns)) out.push(`<INFO name="${xmlEscape(k)}" value="${xmlEscape(v)}"/>`);
  out.push(`<TABLE name="redshift_catalogue" nrows="${rows.length}">`);
  const cosmo = cosmologySummary(meta.cosmology);
  out.push(`<PARAM name="H0" datatype="double" unit="${H0_UNIT}" value="${cosmo.h0}"/>`);
  out.push(`<PARAM name="Omega_m" datatype="double" value="${cosmo.omegaM}"/>`);
  out.push(`<PARAM name="Omega_k" datatype="double" value="${cosmo.omegaK}"/>`);
  out.push(`<PARAM name="Omega_r" datatype="double" value="${cosmo.omegaR}"/>`);
  out.push(`<PARAM name="Omega_Lambda" datatype="double" value="${cosmo.omegaLambda}"/>`);
  tableBody(out, rows, columns);
  out.push('</TABLE>');
  if (lines) {
    out.push(`<TABLE name="line_measurements" nrows="${lines.length}">`);
    out.push('<DESCRIPTION>Line measurements at the automatic solution, one row per spectrum and line; file matches the catalogue</DESCRIPTION>');
    tableBody(out, lines, LINE_COLUMNS);
    out.push('</TABLE>');
  }
  out.push('</RESOURCE>');
  out.push('</VOTABLE>');
  return out.join('\n') + '\n';
}
