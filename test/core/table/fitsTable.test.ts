import { describe, expect, it } from 'vitest';
import { catalogueFits, fitsAscii, FITS_INT_NULL } from '../../../src/core/table/fitsTable';
import { CATALOGUE_COLUMNS } from '../../../src/core/table/columns';
import { catalogueRow } from '../../../src/core/table/rows';
import { DEFAULT_COSMOLOGY } from '../../../src/core/cosmology';
import { walkHdus } from '../../../src/core/io/fits/hdus';
import { tableColumns } from '../../../src/core/io/fits/table';
import { decision, failedResult, META, okResult } from './fixtures';

/**
 * A tiny independent FITS decoder for the test (FITS Standard 4.0 sec. 3-4, 7.3):
 * 2880-byte blocks, 80-character cards, big-endian binary-table rows.
 */
interface Hdu {
  cards: Map<string, string>;
  comments: string[];
  dataStart: number;
}

function readHdus(bytes: Uint8Array): Hdu[] {
  const text = (a: number, b: number) => String.fromCharCode(...bytes.subarray(a, b));
  const hdus: Hdu[] = [];
  let pos = 0;
  while (pos < bytes.length) {
    const cards = new Map<string, string>();
    const comments: string[] = [];
    for (;;) {
      const card = text(pos, pos + 80);
      pos += 80;
      const key = card.slice(0, 8).trim();
      if (key === 'END') break;
      if (key === 'COMMENT') comments.push(card.slice(8).trimEnd());
      else if (card.slice(8, 10) === '= ') cards.set(key, card.slice(10).trim());
    }
    pos = Math.ceil(pos / 2880) * 2880;
    const dataStart = pos;
    const naxis = Number(cards.get('NAXIS')?.split('/')[0]);
    let size = 0;
    if (naxis > 0) {
      size = Math.abs(Number(cards.get('BITPIX')!.split('/')[0])) / 8;
      for (let i = 1; i <= naxis; i++) size *= Number(cards.get(`NAXIS${i}`)!.split('/')[0]);
    }
    pos += Math.ceil(size / 2880) * 2880;
    hdus.push({ cards, comments, dataStart });
  }
  return hdus;
}

function value(h: Hdu, key: string): string {
  const raw = h.cards.get(key);
  if (raw === undefined) throw new Error(`no ${key}`);
  if (raw.startsWith("'")) return raw.slice(1, raw.indexOf("'", 1)).replace(/ +$/, '');
  return raw.split('/')[0].trim();
}

const WIDTH: Record<string, number> = { L: 1, J: 4, K: 8, D: 8, E: 4, A: 1 };

function decodeTable(bytes: Uint8Array, h: Hdu): Array<Record<string, string | number | boolean | null>> {
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  const n = Number(value(h, 'TFIELDS'));
  const rowBytes = Number(value(h, 'NAXIS1'));
  const cols = Array.from({ length: n }, (_, i) => {
    const m = /^(\d*)([A-Z])$/.exec(value(h, `TFORM${i + 1}`))!;
    const tnull = h.cards.has(`TNULL${i + 1}`) ? Number(value(h, `TNULL${i + 1}`)) : undefined;
    return { name: value(h, `TTYPE${i + 1}`), repeat: m[1] ? Number(m[1]) : 1, type: m[2], tnull };
  });
  const rows = [];
  for (let r = 0; r < Number(value(h, 'NAXIS2')); r++) {
    let off = h.dataStart + r * rowBytes;
    const row: Record<string, string | number | boolean | null> = {};
    for (const c of cols) {
      if (c.type === 'A') row[c.name] = String.fromCharCode(...bytes.subarray(off, off + c.repeat)).replace(/[ \0]+$/, '');
      else if (c.type === 'D') row[c.name] = view.getFloat64(off, false);
      else if (c.type === 'J') {
        const v = view.getInt32(off, false);
        row[c.name] = v === c.tnull ? null : v;
      } else if (c.type === 'L') row[c.name] = bytes[off] === 0x54 ? true : bytes[off] === 0x46 ? false : null;
      off += c.repeat * WIDTH[c.type];
    }
    rows.push(row);
  }
  return rows;
}

describe('catalogueFits(rows, columns, meta)', () => {
  const rows = [
    catalogueRow(okResult(), decision({ note: 'naïve note, "quoted"', reviewer: 'Zoë' }), DEFAULT_COSMOLOGY),
    catalogueRow(failedResult(), undefined, DEFAULT_COSMOLOGY),
    catalogueRow(okResult({ file: 'z.fits', z: -0.00012, class: 'star', noiseEstimated: true }), undefined, DEFAULT_COSMOLOGY),
  ];
  const bytes = catalogueFits(rows, CATALOGUE_COLUMNS, META);
  const hdus = readHdus(bytes);
  const table = hdus[1];

  it('is a whole number of 2880-byte blocks: empty primary HDU plus one BINTABLE', () => {
    expect(bytes.length % 2880).toBe(0);
    expect(hdus.length).toBe(2);
    expect(value(hdus[0], 'SIMPLE')).toBe('T');
    expect(value(hdus[0], 'NAXIS')).toBe('0');
    expect(value(table, 'XTENSION')).toBe('BINTABLE');
    expect(value(table, 'EXTNAME')).toBe('CATALOGUE');
  });
  it('has TTYPE/TFORM for every column and NAXIS1 equal to the sum of the column widths', () => {
    expect(Number(value(table, 'TFIELDS'))).toBe(CATALOGUE_COLUMNS.length);
    let sum = 0;
    CATALOGUE_COLUMNS.forEach((c, i) => {
      expect(value(table, `TTYPE${i + 1}`)).toBe(c.name);
      const tform = value(table, `TFORM${i + 1}`);
      const m = /^(\d*)([LJDA])$/.exec(tform)!;
      expect(m, tform).not.toBeNull();
      const expectLetter = { float: 'D', int: 'J', bool: 'L', text: 'A' }[c.type];
      expect(m[2]).toBe(expectLetter);
      sum += (m[1] ? Number(m[1]) : 1) * WIDTH[m[2]];
      if (c.unit) expect(value(table, `TUNIT${i + 1}`)).toBe(c.unit);
    });
    expect(Number(value(table, 'NAXIS1'))).toBe(sum);
    expect(Number(value(table, 'NAXIS2'))).toBe(rows.length);
  });
  it('sizes text columns to the longest value', () => {
    const i = CATALOGUE_COLUMNS.findIndex((c) => c.name === 'error');
    expect(value(table, `TFORM${i + 1}`)).toBe(`${rows[1].error.length}A`);
    const j = CATALOGUE_COLUMNS.findIndex((c) => c.name === 'final_class'); // all rows but one empty
    expect(value(table, `TFORM${j + 1}`)).toBe('6A'); // 'galaxy'
  });
  it('names software, template set, creation date and cosmology in the header', () => {
    expect(value(table, 'CREATOR')).toBe('Shiftmark 0.1.0');
    expect(value(table, 'TEMPLSET')).toBe('lantern-templates-1');
    expect(value(table, 'DATE')).toBe('2026-03-05T10:00:00');
    expect(Number(value(table, 'H0'))).toBe(70);
    expect(Number(value(table, 'OMEGA_M'))).toBe(0.3);
    expect(Number(value(table, 'OMEGA_L'))).toBeCloseTo(0.7, 12);
    expect(table.comments.join(' ')).toMatch(/caution: .*hypotheses/);
  });
  it('decodes back to the table values: floats, ints, booleans, text, nulls', () => {
    const back = decodeTable(bytes, table);
    expect(back.length).toBe(3);
    expect(back[0].z).toBe(2.345679);
    expect(back[0].final_z).toBe(0.987654);
    expect(back[0].n_pix).toBe(3900);
    expect(back[0].noise_estimated).toBe(false);
    expect(back[0].class).toBe('qso');
    expect(back[0].reviewer).toBe('Zo?'); // FITS text is ASCII only
    expect(back[0].note).toBe('na?ve note, "quoted"');
    expect(back[0].lum_dist_mpc).toBe(Number(rows[0].lum_dist_mpc));
    expect(back[2].z).toBe(-0.00012);
    expect(back[2].noise_estimated).toBe(true);
    for (const c of CATALOGUE_COLUMNS) {
      if (c.type !== 'text') continue;
      expect(back[2][c.name], c.name).toBe(fitsAscii(rows[2][c.name]));
    }
  });
  it('a failed row carries its error; its numbers are NaN / TNULL / undefined logical', () => {
    const back = decodeTable(bytes, table);
    expect(back[1].error).toBe(rows[1].error);
    expect(back[1].error).toMatch(/NAXIS1 claims/);
    expect(Number.isNaN(back[1].z as number)).toBe(true);
    expect(back[1].n_pix).toBeNull();
    expect(back[1].noise_estimated).toBeNull();
    const i = CATALOGUE_COLUMNS.findIndex((c) => c.name === 'n_pix');
    expect(Number(value(table, `TNULL${i + 1}`))).toBe(FITS_INT_NULL);
  });
  it("is accepted by the project's own FITS reader (HDU walk, column layout checked against NAXIS1)", () => {
    const found = walkHdus(bytes, 'catalogue.fits');
    expect(found.map((h) => h.kind)).toEqual(['empty', 'bintable']);
    expect(found[1].extname).toBe('CATALOGUE');
    const cols = tableColumns(found[1], 'catalogue.fits');
    expect(cols.map((c) => c.name)).toEqual(CATALOGUE_COLUMNS.map((c) => c.name));
    expect(cols.find((c) => c.name === 'n_pix')?.tnull).toBe(FITS_INT_NULL);
  });
  it('writes an empty catalogue as a valid zero-row table', () => {
    const h = readHdus(catalogueFits([], CATALOGUE_COLUMNS, META));
    expect(value(h[1], 'NAXIS2')).toBe('0');
    expect(value(h[1], `TFORM1`)).toBe('1A');
  });
});
