/**
 * Over 400 lines on purpose: the one FITS writer (cards, image and binary-
 * table HDUs, padding); each part is small, and the byte rules they share live
 * here once.
 *
 * A small FITS writer: header cards, IMAGE and BINTABLE HDUs, whole files.
 *
 * Follows the FITS Standard 4.0 (IAU FITS Working Group, 2016; version 3.0 is
 * Pence et al. 2010, A&A 524, A42): 2880-byte blocks, 80-character ASCII cards,
 * big-endian data, headers padded with spaces after END, data padded with zeros.
 * Long strings use the CONTINUE convention (FITS 4.0, sec. 4.2.1.2).
 *
 * The writer serves our own code (demo-set generator, catalogue exporter, tests),
 * so a request it cannot honour (bad keyword, NaN value, wrong array length) is a
 * programming error and throws a RangeError.
 */

/** FITS logical record (block) length, bytes. */
export const FITS_BLOCK_BYTES = 2880;
/** Header card length, characters (bytes). */
export const FITS_CARD_CHARS = 80;

/** A header value: string, logical, number (integer or float), 64-bit integer, or undefined (null). */
export type FitsValue = string | boolean | number | bigint | null;

/** One header card to write. `value` absent for commentary keywords (COMMENT, HISTORY, blank). */
export interface FitsCardSpec {
  key: string;
  value?: FitsValue;
  comment?: string;
}

/** A card as an object or as a `[key, value, comment]` tuple. */
export type FitsCardInput = FitsCardSpec | readonly [string, FitsValue?, string?];

const COMMENTARY_KEYS = new Set(['COMMENT', 'HISTORY', '']);

/** Keywords the writer sets itself; callers may not pass them in `cards`. */
const RESERVED_KEY = /^(SIMPLE|XTENSION|BITPIX|NAXIS\d*|EXTEND|PCOUNT|GCOUNT|TFIELDS|TTYPE\d+|TFORM\d+|TUNIT\d+|TSCAL\d+|TZERO\d+|TNULL\d+|BSCALE|BZERO|BLANK|EXTNAME|END)$/;

function isPrintableAscii(s: string): boolean {
  for (let i = 0; i < s.length; i++) {
    const c = s.charCodeAt(i);
    if (c < 32 || c > 126) return false;
  }
  return true;
}

/** Replace characters a FITS header cannot hold (non-printable, non-ASCII) with '?'. */
function asciiOnly(s: string): string {
  let out = '';
  for (let i = 0; i < s.length; i++) {
    const c = s.charCodeAt(i);
    out += c >= 32 && c <= 126 ? s[i] : '?';
  }
  return out;
}

function checkKey(key: string): string {
  if (key.length > 8 || !/^[A-Z0-9_-]*$/.test(key)) {
    throw new RangeError(`FITS keyword '${key}' must be at most 8 characters of A-Z, 0-9, '_' or '-'`);
  }
  return key.padEnd(8, ' ');
}

/**
 * Format a float for a fixed-format value field (at most 20 characters), with a
 * decimal point so that no reader takes it for an integer. Shortest round-trip
 * digits when they fit, fewer significant digits otherwise.
 */
export function formatFitsFloat(v: number): string {
  if (!Number.isFinite(v)) throw new RangeError(`FITS header values cannot be ${v}`);
  const fix = (s: string): string => {
    let [mant, exp] = s.toUpperCase().split('E');
    if (!mant.includes('.')) mant += '.0';
    if (exp === undefined) return mant;
    if (exp.startsWith('+')) exp = exp.slice(1);
    return `${mant}E${exp}`;
  };
  let s = fix(String(v));
  for (let digits = 16; s.length > 20 && digits > 0; digits--) s = fix(v.toExponential(digits));
  return s;
}

function formatFixedValue(value: Exclude<FitsValue, string>): string {
  if (value === null) return '';
  if (typeof value === 'boolean') return value ? 'T' : 'F';
  if (typeof value === 'bigint') return value.toString();
  if (Number.isInteger(value) && Math.abs(value) <= Number.MAX_SAFE_INTEGER) return String(value);
  return formatFitsFloat(value);
}

/** Quote a string value: '' escapes a quote; padded to at least 8 characters inside the quotes. */
function quote(s: string): string {
  return `'${s.replace(/'/g, "''").padEnd(8, ' ')}'`;
}

/** Append ` / comment` to a card text, truncating the comment to fit 80 characters. */
function withComment(text: string, comment: string | undefined): string {
  if (comment && text.length + 3 < FITS_CARD_CHARS) {
    text += ` / ${asciiOnly(comment)}`;
  }
  return text.slice(0, FITS_CARD_CHARS).padEnd(FITS_CARD_CHARS, ' ');
}

/**
 * Split a string into pieces whose quoted form plus the '&' continuation marker
 * fits the 70 characters of columns 11-80, never splitting an escaped quote pair.
 */
function splitLongString(s: string, firstRoom: number, room: number): string[] {
  const pieces: string[] = [];
  let rest = s;
  let limit = firstRoom;
  while (rest.length > 0) {
    // Budget: 2 quotes + '&' + escaped text.
    let take = 0;
    let used = 0;
    while (take < rest.length) {
      const w = rest[take] === "'" ? 2 : 1;
      if (used + w > limit - 3) break;
      used += w;
      take++;
    }
    if (take === 0) take = 1; // cannot happen with sane limits; guards against a loop
    pieces.push(rest.slice(0, take));
    rest = rest.slice(take);
    limit = room;
  }
  return pieces;
}

/**
 * Format one header card: keyword in columns 1-8, `= ` in 9-10, fixed-format
 * numbers and logicals right-justified to column 30, strings quoted from column 11,
 * then ` / comment` (truncated to fit). Commentary keywords (COMMENT, HISTORY, '')
 * take `value` as free text in columns 9-80.
 *
 * Returns 80 characters, or a multiple of 80 when a string is too long for one card
 * (CONTINUE long-string convention) or commentary text needs several cards.
 * Throws RangeError for a bad keyword, a non-finite number, or a non-ASCII string value.
 */
export function fitsCard(key: string, value?: FitsValue, comment?: string): string {
  const k = checkKey(key);
  if (COMMENTARY_KEYS.has(key)) {
    const text = asciiOnly(value === undefined || value === null ? '' : String(value));
    let out = '';
    for (let i = 0; i === 0 || i < text.length; i += 72) out += (k + text.slice(i, i + 72)).padEnd(FITS_CARD_CHARS, ' ');
    return out;
  }
  if (value === undefined) value = null;
  if (typeof value !== 'string') {
    return withComment(`${k}= ${formatFixedValue(value).padStart(20, ' ')}`, comment);
  }
  if (!isPrintableAscii(value)) throw new RangeError(`FITS string value for ${key} must be printable ASCII`);
  const q = quote(value);
  if (q.length <= 70) return withComment(`${k}= ${q}`, comment);
  // CONTINUE convention: every piece but the last ends with '&'.
  const pieces = splitLongString(value, 70, 70);
  let out = '';
  pieces.forEach((p, i) => {
    const last = i === pieces.length - 1;
    const body = `'${p.replace(/'/g, "''")}${last ? '' : '&'}'`;
    const text = i === 0 ? `${k}= ${body}` : `CONTINUE  ${body}`;
    out += last ? withComment(text, comment) : text.padEnd(FITS_CARD_CHARS, ' ');
  });
  return out;
}

function cardText(c: FitsCardInput): string {
  if (Array.isArray(c)) {
    const [key, value, comment] = c as readonly [string, FitsValue?, string?];
    return cardOf({ key, value, comment });
  }
  return cardOf(c as FitsCardSpec);
}

function cardOf(c: FitsCardSpec): string {
  if (RESERVED_KEY.test(c.key)) {
    throw new RangeError(`keyword ${c.key} is set by the writer; do not pass it in cards`);
  }
  return fitsCard(c.key, c.value, c.comment);
}

/** ASCII text to bytes (the header is pure ASCII). */
function asciiBytes(s: string, out: Uint8Array, offset: number): void {
  for (let i = 0; i < s.length; i++) out[offset + i] = s.charCodeAt(i) & 0x7f;
}

/**
 * Build a header from formatted cards (each a multiple of 80 characters), add the
 * END card and pad with spaces to a whole number of 2880-byte blocks. Exported for
 * tests that need hand-made (even malformed) headers.
 */
export function fitsHeaderBytes(cards: readonly string[], withEnd = true): Uint8Array {
  let text = cards.join('');
  if (text.length % FITS_CARD_CHARS !== 0) throw new RangeError('header cards must be multiples of 80 characters');
  if (withEnd) text += 'END'.padEnd(FITS_CARD_CHARS, ' ');
  const size = Math.ceil(text.length / FITS_BLOCK_BYTES) * FITS_BLOCK_BYTES;
  const out = new Uint8Array(size).fill(0x20);
  asciiBytes(text, out, 0);
  return out;
}

/** Size of `n` bytes rounded up to whole 2880-byte blocks. */
export function paddedSize(n: number): number {
  return Math.ceil(n / FITS_BLOCK_BYTES) * FITS_BLOCK_BYTES;
}

function concat(parts: readonly Uint8Array[]): Uint8Array {
  let n = 0;
  for (const p of parts) n += p.length;
  const out = new Uint8Array(n);
  let o = 0;
  for (const p of parts) {
    out.set(p, o);
    o += p.length;
  }
  return out;
}

export type Bitpix = 8 | 16 | 32 | 64 | -32 | -64;

export type ImageData =
  | Float32Array
  | Float64Array
  | Int8Array
  | Uint8Array
  | Int16Array
  | Uint16Array
  | Int32Array
  | Uint32Array
  | BigInt64Array
  | readonly number[];

export interface ImageHduSpec {
  /** Pixel values (physical values when bscale/bzero are given), first axis fastest. */
  data: ImageData;
  /** Storage type; default from the array type (Float64Array and plain arrays -> -64). */
  bitpix?: Bitpix;
  /** Axis lengths NAXIS1, NAXIS2, ... (NAXIS1 varies fastest); default [data.length]. */
  axes?: readonly number[];
  /** Extra header cards (WCS, metadata). */
  cards?: readonly FitsCardInput[];
  /** Write SIMPLE (primary HDU) rather than XTENSION = 'IMAGE'. Default true. */
  primary?: boolean;
  extname?: string;
  /** physical = bzero + bscale * stored: stored = round((physical - bzero) / bscale) for integer BITPIX. */
  bscale?: number;
  bzero?: number;
  /** Integer BITPIX only: stored value written for NaN physical values (BLANK keyword). */
  blank?: number;
}

function defaultBitpix(data: ImageData): Bitpix {
  if (data instanceof Float32Array) return -32;
  if (data instanceof Uint8Array) return 8;
  if (data instanceof Int16Array || data instanceof Int8Array) return 16;
  if (data instanceof Int32Array || data instanceof Uint16Array) return 32;
  if (data instanceof BigInt64Array || data instanceof Uint32Array) return 64;
  return -64;
}

const BITPIX_BYTES: Record<Bitpix, number> = { 8: 1, 16: 2, 32: 4, 64: 8, [-32]: 4, [-64]: 8 } as Record<Bitpix, number>;

const INT_RANGE: Record<8 | 16 | 32, [number, number]> = {
  8: [0, 255],
  16: [-32768, 32767],
  32: [-2147483648, 2147483647],
};

/** Write one value at `offset` in big-endian FITS storage. Integers are range-checked. */
function putValue(view: DataView, offset: number, bitpix: Bitpix, v: number | bigint, what: string): void {
  switch (bitpix) {
    case -32:
      view.setFloat32(offset, Number(v), false);
      return;
    case -64:
      view.setFloat64(offset, Number(v), false);
      return;
    case 64:
      view.setBigInt64(offset, typeof v === 'bigint' ? v : BigInt(checkedInt(v, [-(2 ** 63), 2 ** 63 - 1024], what)), false);
      return;
    default: {
      const n = checkedInt(Number(v), INT_RANGE[bitpix], what);
      if (bitpix === 8) view.setUint8(offset, n);
      else if (bitpix === 16) view.setInt16(offset, n, false);
      else view.setInt32(offset, n, false);
    }
  }
}

function checkedInt(v: number, [lo, hi]: [number, number], what: string): number {
  if (!Number.isFinite(v)) throw new RangeError(`${what}: ${v} cannot be stored as an integer (give a blank value)`);
  const n = Math.round(v);
  if (n < lo || n > hi) throw new RangeError(`${what}: ${v} is outside the integer range ${lo}..${hi}`);
  return n;
}

/**
 * One IMAGE HDU (primary or extension): header plus big-endian data, each padded
 * to 2880-byte blocks. The writer sets SIMPLE/XTENSION, BITPIX, NAXISn, EXTEND
 * (primary), PCOUNT/GCOUNT (extension), EXTNAME, BSCALE/BZERO/BLANK; `cards` adds
 * the rest.
 */
export function writeImageHdu(spec: ImageHduSpec): Uint8Array {
  const { data } = spec;
  const bitpix = spec.bitpix ?? defaultBitpix(data);
  if (!(bitpix in BITPIX_BYTES)) throw new RangeError(`unsupported BITPIX ${bitpix}`);
  const axes = spec.axes ?? [data.length];
  const nPix = axes.reduce((a, b) => a * b, 1);
  if (axes.some((n) => !Number.isInteger(n) || n < 0)) throw new RangeError(`bad image axes ${axes.join('x')}`);
  if (nPix !== data.length) throw new RangeError(`image axes ${axes.join('x')} need ${nPix} values, got ${data.length}`);
  const primary = spec.primary ?? true;
  const isInt = bitpix > 0;
  const bscale = spec.bscale ?? 1;
  const bzero = spec.bzero ?? 0;
  if (bscale === 0 || !Number.isFinite(bscale) || !Number.isFinite(bzero)) throw new RangeError('bscale must be finite and non-zero, bzero finite');
  if (spec.blank !== undefined && !isInt) throw new RangeError('BLANK applies to integer BITPIX only');

  const cards: string[] = [];
  cards.push(primary ? fitsCard('SIMPLE', true, 'conforms to FITS standard') : fitsCard('XTENSION', 'IMAGE', 'image extension'));
  cards.push(fitsCard('BITPIX', bitpix, 'bits per data value'));
  cards.push(fitsCard('NAXIS', axes.length, 'number of data axes'));
  axes.forEach((n, i) => cards.push(fitsCard(`NAXIS${i + 1}`, n)));
  if (primary) cards.push(fitsCard('EXTEND', true, 'extensions may follow'));
  else {
    cards.push(fitsCard('PCOUNT', 0));
    cards.push(fitsCard('GCOUNT', 1));
  }
  if (spec.extname !== undefined) cards.push(fitsCard('EXTNAME', spec.extname));
  if (spec.bscale !== undefined) cards.push(fitsCard('BSCALE', bscale));
  if (spec.bzero !== undefined) cards.push(fitsCard('BZERO', bzero));
  if (spec.blank !== undefined) cards.push(fitsCard('BLANK', spec.blank));
  for (const c of spec.cards ?? []) cards.push(cardText(c));
  const header = fitsHeaderBytes(cards);

  const width = BITPIX_BYTES[bitpix];
  const body = new Uint8Array(paddedSize(nPix * width));
  const view = new DataView(body.buffer);
  const scaled = spec.bscale !== undefined || spec.bzero !== undefined;
  for (let i = 0; i < nPix; i++) {
    const v = data[i];
    let stored: number | bigint = v;
    if (typeof v === 'number') {
      if (isInt && Number.isNaN(v) && spec.blank !== undefined) stored = spec.blank;
      else if (scaled) stored = isInt ? Math.round((v - bzero) / bscale) : (v - bzero) / bscale;
    }
    putValue(view, i * width, bitpix, stored, `pixel ${i + 1}`);
  }
  return concat([header, body]);
}

/** Binary-table column type letters the writer supports (FITS 4.0, Table 18). */
export type BinTableType = 'L' | 'B' | 'I' | 'J' | 'K' | 'A' | 'E' | 'D';

export interface BinTableColumn {
  /** TTYPEn, e.g. 'wavelength'. */
  name: string;
  /** TFORMn: repeat count and type letter, e.g. 'E', '4000D', '16A'. */
  format: string;
  /** TUNITn, e.g. 'Angstrom'. */
  unit?: string;
  /**
   * Values row by row; a column with repeat r holds nRows * r numbers (row i is
   * elements i*r .. i*r+r-1). 'A' columns: one string per row (padded with spaces,
   * longer strings throw). 'L' columns: booleans (null = undefined logical).
   * Numbers are physical values: stored = (value - tzero) / tscal.
   */
  data: ArrayLike<number> | BigInt64Array | readonly string[] | readonly (boolean | null)[];
  tscal?: number;
  tzero?: number;
  /** Integer columns: stored value written for NaN (TNULLn). */
  tnull?: number;
}

export interface BinTableHduSpec {
  columns: readonly BinTableColumn[];
  nRows: number;
  cards?: readonly FitsCardInput[];
  extname?: string;
}

const TYPE_BYTES: Record<BinTableType, number> = { L: 1, B: 1, I: 2, J: 4, K: 8, A: 1, E: 4, D: 8 };
const TYPE_BITPIX: Partial<Record<BinTableType, Bitpix>> = { B: 8, I: 16, J: 32, K: 64, E: -32, D: -64 };

/** Parse a TFORM the writer supports into repeat count and type letter. */
export function parseWriterTform(format: string): { repeat: number; type: BinTableType } {
  const m = /^(\d*)([LBIJKAED])$/.exec(format.trim());
  if (!m) throw new RangeError(`unsupported TFORM '${format}' (writer knows rL, rB, rI, rJ, rK, rA, rE, rD)`);
  return { repeat: m[1] === '' ? 1 : Number(m[1]), type: m[2] as BinTableType };
}

/**
 * One BINTABLE extension HDU with fixed-width columns (no heap): header with
 * TTYPEn/TFORMn/TUNITn (and TSCALn/TZEROn/TNULLn when given), then the rows,
 * big-endian, padded with zeros to 2880-byte blocks. Works for one-row-per-pixel
 * tables (repeat 1) and one-row-of-arrays tables (repeat = pixel count, nRows 1).
 */
export function writeBinTableHdu(spec: BinTableHduSpec): Uint8Array {
  const { columns, nRows } = spec;
  if (!Number.isInteger(nRows) || nRows < 0) throw new RangeError(`bad row count ${nRows}`);
  const layout = columns.map((c) => {
    const { repeat, type } = parseWriterTform(c.format);
    return { col: c, repeat, type, width: repeat * TYPE_BYTES[type] };
  });
  const rowBytes = layout.reduce((a, l) => a + l.width, 0);

  const cards: string[] = [
    fitsCard('XTENSION', 'BINTABLE', 'binary table extension'),
    fitsCard('BITPIX', 8, 'array data type'),
    fitsCard('NAXIS', 2, 'number of array dimensions'),
    fitsCard('NAXIS1', rowBytes, 'bytes per row'),
    fitsCard('NAXIS2', nRows, 'number of rows'),
    fitsCard('PCOUNT', 0, 'size of the heap'),
    fitsCard('GCOUNT', 1),
    fitsCard('TFIELDS', columns.length, 'number of columns'),
  ];
  layout.forEach(({ col }, i) => {
    const n = i + 1;
    cards.push(fitsCard(`TTYPE${n}`, col.name));
    cards.push(fitsCard(`TFORM${n}`, col.format.trim()));
    if (col.unit !== undefined) cards.push(fitsCard(`TUNIT${n}`, col.unit));
    if (col.tscal !== undefined) cards.push(fitsCard(`TSCAL${n}`, col.tscal));
    if (col.tzero !== undefined) cards.push(fitsCard(`TZERO${n}`, col.tzero));
    if (col.tnull !== undefined) cards.push(fitsCard(`TNULL${n}`, col.tnull));
  });
  if (spec.extname !== undefined) cards.push(fitsCard('EXTNAME', spec.extname));
  for (const c of spec.cards ?? []) cards.push(cardText(c));
  const header = fitsHeaderBytes(cards);

  const body = new Uint8Array(paddedSize(rowBytes * nRows));
  const view = new DataView(body.buffer);
  let colOffset = 0;
  for (const { col, repeat, type, width } of layout) {
    const what = `column ${col.name}`;
    const expected = type === 'A' ? nRows : nRows * repeat;
    if (col.data.length !== expected) {
      throw new RangeError(`${what}: expected ${expected} values for ${nRows} rows of ${col.format}, got ${col.data.length}`);
    }
    for (let r = 0; r < nRows; r++) {
      const base = r * rowBytes + colOffset;
      if (type === 'A') {
        const s = String((col.data as readonly string[])[r]);
        if (!isPrintableAscii(s)) throw new RangeError(`${what}, row ${r + 1}: strings must be printable ASCII`);
        if (s.length > repeat) throw new RangeError(`${what}, row ${r + 1}: '${s}' is longer than ${repeat} characters`);
        asciiBytes(s.padEnd(repeat, ' '), body, base);
        continue;
      }
      for (let j = 0; j < repeat; j++) {
        const v = col.data[r * repeat + j] as number | bigint | boolean | null;
        const off = base + j * TYPE_BYTES[type];
        if (type === 'L') {
          body[off] = v === null ? 0 : v ? 0x54 : 0x46; // 'T' / 'F'; 0 = undefined
          continue;
        }
        let stored: number | bigint = typeof v === 'bigint' ? v : Number(v);
        if (typeof stored === 'number') {
          const isInt = type !== 'E' && type !== 'D';
          if (isInt && Number.isNaN(stored) && col.tnull !== undefined) stored = col.tnull;
          else if (col.tscal !== undefined || col.tzero !== undefined) {
            stored = (stored - (col.tzero ?? 0)) / (col.tscal ?? 1);
          }
        }
        putValue(view, off, TYPE_BITPIX[type]!, stored, `${what}, row ${r + 1}`);
      }
    }
    colOffset += width;
  }
  return concat([header, body]);
}

/** A primary HDU with no data (NAXIS = 0), for files whose content sits in extensions. */
export function writeEmptyPrimaryHdu(cards: readonly FitsCardInput[] = []): Uint8Array {
  const text = [
    fitsCard('SIMPLE', true, 'conforms to FITS standard'),
    fitsCard('BITPIX', 8, 'array data type'),
    fitsCard('NAXIS', 0, 'no data in the primary HDU'),
    fitsCard('EXTEND', true, 'extensions follow'),
    ...cards.map(cardText),
  ];
  return fitsHeaderBytes(text);
}

function startsWith(bytes: Uint8Array, s: string): boolean {
  if (bytes.length < s.length) return false;
  for (let i = 0; i < s.length; i++) if (bytes[i] !== s.charCodeAt(i)) return false;
  return true;
}

/**
 * Join HDUs into one file. When the first HDU is an extension (e.g. a binary
 * table), an empty primary HDU is put in front, as the standard requires.
 * Throws when a primary HDU appears anywhere but first.
 */
export function writeFitsFile(hdus: readonly Uint8Array[]): Uint8Array {
  if (hdus.length === 0) throw new RangeError('a FITS file needs at least one HDU');
  hdus.forEach((h, i) => {
    if (h.length === 0 || h.length % FITS_BLOCK_BYTES !== 0) throw new RangeError(`HDU ${i} is not a whole number of 2880-byte blocks`);
    if (i > 0 && startsWith(h, 'SIMPLE')) throw new RangeError(`HDU ${i} is a primary HDU; only the first may be (write it with primary: false)`);
  });
  const parts = startsWith(hdus[0], 'SIMPLE') ? [...hdus] : [writeEmptyPrimaryHdu(), ...hdus];
  return concat(parts);
}
