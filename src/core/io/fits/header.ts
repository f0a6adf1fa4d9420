/**
 * FITS header parsing: 80-character cards, value types, END, block counts.
 * FITS Standard 4.0 (IAU FITS Working Group, 2016), sec. 4; Pence et al. 2010,
 * A&A 524, A42 for version 3.0.
 */
import { SpectrumReadError } from '../../types';

export const BLOCK_BYTES = 2880;
export const CARD_CHARS = 80;
const CARDS_PER_BLOCK = BLOCK_BYTES / CARD_CHARS;
/** Headers longer than this (36000 cards, 2.88 MB) are refused rather than parsed card by card. */
export const MAX_HEADER_BLOCKS = 1000;

/**
 * A parsed value: string (quotes removed, '' unescaped, trailing spaces dropped),
 * logical, number (integer or float; D exponents accepted), bigint for integers
 * beyond 2^53, null for an undefined value. Complex values are kept as their text.
 */
export type FitsHeaderValue = string | number | boolean | bigint | null;

export interface FitsCard {
  /** Keyword, upper case, trailing spaces removed ('' for a blank keyword; HIERARCH cards give the full name). */
  key: string;
  /** undefined for commentary cards (no '= ' in columns 9-10). */
  value: FitsHeaderValue | undefined;
  comment: string;
  /** Value text that could not be parsed (the value is then null). */
  malformed?: string;
}

const INT_RE = /^[+-]?\d+$/;
// '\d+(?:\.\d*)?' rather than '\d+\.?\d*': the same numbers, but without the quadratic
// backtracking the latter shows on a long run of digits (a CONTINUE string of digits took seconds).
const FLOAT_RE = /^[+-]?(\d+(?:\.\d*)?|\.\d+)([EeDd][+-]?\d+)?$/;

/** Parse the value field (columns 11-80) of a card with a value indicator. */
function parseValueField(field: string): { value: FitsHeaderValue; comment: string; malformed?: string } {
  const t = field.trimStart();
  if (t.startsWith("'")) {
    // String: a quote ends it unless doubled.
    let s = '';
    let i = 1;
    for (; i < t.length; i++) {
      if (t[i] === "'") {
        if (t[i + 1] === "'") {
          s += "'";
          i++;
        } else break;
      } else s += t[i];
    }
    if (i >= t.length) return { value: null, comment: '', malformed: t.trimEnd() }; // no closing quote
    const rest = t.slice(i + 1);
    const slash = rest.indexOf('/');
    return { value: s.replace(/ +$/, ''), comment: slash >= 0 ? rest.slice(slash + 1).trim() : '' };
  }
  const slash = t.indexOf('/');
  const token = (slash >= 0 ? t.slice(0, slash) : t).trim();
  const comment = slash >= 0 ? t.slice(slash + 1).trim() : '';
  if (token === '') return { value: null, comment };
  if (token === 'T') return { value: true, comment };
  if (token === 'F') return { value: false, comment };
  if (INT_RE.test(token)) {
    const n = Number(token);
    return { value: Number.isSafeInteger(n) ? n : BigInt(token), comment };
  }
  if (FLOAT_RE.test(token)) return { value: Number(token.replace(/[Dd]/, 'E')), comment };
  if (/^\(.*\)$/.test(token)) return { value: token, comment }; // complex: keep the text
  return { value: null, comment, malformed: token };
}

/** Parse one 80-character card (shorter text is padded with spaces). */
export function parseCard(card: string): FitsCard {
  const c = card.padEnd(CARD_CHARS, ' ');
  if (c.startsWith('HIERARCH ')) {
    // ESO convention: HIERARCH A B C = value / comment
    const eq = c.indexOf('=');
    if (eq > 0) {
      const key = c.slice(9, eq).trim().replace(/\s+/g, ' ').toUpperCase();
      return { key, ...parseValueField(c.slice(eq + 1)) };
    }
  }
  const key = c.slice(0, 8).trimEnd().toUpperCase();
  const commentary = key === 'COMMENT' || key === 'HISTORY' || key === '';
  // The standard puts '= ' in columns 9-10; some writers omit the space, which we accept.
  if (!commentary && c[8] === '=') {
    return { key, ...parseValueField(c.slice(9)) };
  }
  if (key === 'CONTINUE') {
    const v = parseValueField(c.slice(8));
    return { key, value: v.value, comment: v.comment };
  }
  return { key, value: undefined, comment: c.slice(8).trimEnd() };
}

/** A parsed header: ordered cards plus keyword look-up (first occurrence wins). */
export class FitsHeader {
  readonly cards: readonly FitsCard[];
  private readonly index = new Map<string, FitsCard>();

  constructor(cards: readonly FitsCard[]) {
    this.cards = cards;
    for (const c of cards) {
      if (c.value !== undefined && !this.index.has(c.key)) this.index.set(c.key, c);
    }
  }

  has(key: string): boolean {
    return this.index.has(key.toUpperCase());
  }

  card(key: string): FitsCard | undefined {
    return this.index.get(key.toUpperCase());
  }

  /** The value, or undefined when the keyword is absent (null when present without a value). */
  get(key: string): FitsHeaderValue | undefined {
    return this.index.get(key.toUpperCase())?.value;
  }

  /** A string value (trimmed), or undefined when absent or not a string. */
  str(key: string): string | undefined {
    const v = this.get(key);
    return typeof v === 'string' ? v.trim() : undefined;
  }

  /**
   * A numeric value, or undefined when absent or undefined-valued. Throws
   * SpectrumReadError when present but not a number (e.g. 'abc' or a quoted string
   * that is not a number).
   */
  num(key: string, file: string, hdu: number): number | undefined {
    const c = this.card(key);
    if (!c || (c.value === null && !c.malformed)) return undefined;
    const v = c.value;
    if (typeof v === 'number') return v;
    if (typeof v === 'bigint') return Number(v);
    if (typeof v === 'string' && FLOAT_RE.test(v.trim())) return Number(v.trim().replace(/[Dd]/, 'E'));
    const shown = c.malformed ?? (typeof v === 'string' ? `'${v}'` : String(v));
    throw new SpectrumReadError(file, `value ${shown} is not a number`, { hdu, keyword: key.toUpperCase() });
  }

  /** A required non-negative integer (NAXISn, BITPIX, ...). Throws SpectrumReadError naming the keyword. */
  int(key: string, file: string, hdu: number, required = true): number | undefined {
    const c = this.card(key);
    if (!c || c.value === null) {
      if (!required) return undefined;
      throw new SpectrumReadError(file, `required keyword ${key.toUpperCase()} is missing`, { hdu, keyword: key.toUpperCase() });
    }
    const v = typeof c.value === 'bigint' ? Number(c.value) : c.value;
    if (typeof v !== 'number' || !Number.isInteger(v)) {
      const shown = typeof v === 'string' ? `'${v}'` : String(v);
      throw new SpectrumReadError(file, `value ${shown} is not an integer`, { hdu, keyword: key.toUpperCase() });
    }
    return v;
  }

  /** A logical value, or undefined when absent or not logical. */
  bool(key: string): boolean | undefined {
    const v = this.get(key);
    return typeof v === 'boolean' ? v : undefined;
  }
}

export interface ParsedHeader {
  header: FitsHeader;
  /** Byte offset of the first data byte (header start + whole header blocks). */
  dataOffset: number;
  /** Number of 2880-byte blocks the header occupies. */
  blocks: number;
}

/** Card text at `offset` (80 bytes), non-printable bytes shown as '?'. */
function cardAt(bytes: Uint8Array, offset: number): string {
  let s = '';
  for (let i = 0; i < CARD_CHARS; i++) {
    const b = bytes[offset + i];
    s += b >= 32 && b <= 126 ? String.fromCharCode(b) : '?';
  }
  return s;
}

/**
 * Read the header that starts at `offset`: cards up to END, joined CONTINUE
 * long strings, whole blocks. Throws SpectrumReadError (naming file and HDU) when
 * the file ends inside the header or no END card is found.
 */
export function readHeader(bytes: Uint8Array, offset: number, file: string, hdu: number): ParsedHeader {
  const cards: FitsCard[] = [];
  let pos = offset;
  for (;;) {
    if (pos + BLOCK_BYTES > bytes.length) {
      const got = bytes.length - offset;
      if (cards.length === 0 && got < BLOCK_BYTES) {
        throw new SpectrumReadError(file, `truncated header: only ${got} bytes where a 2880-byte header block should start`, { hdu });
      }
      throw new SpectrumReadError(
        file,
        `no END card: the header runs to the end of the file after ${cards.length} cards${got % BLOCK_BYTES ? ' (truncated block)' : ''}`,
        { hdu, keyword: 'END' },
      );
    }
    if (pos - offset >= MAX_HEADER_BLOCKS * BLOCK_BYTES) {
      throw new SpectrumReadError(file, `no END card within the first ${MAX_HEADER_BLOCKS * CARDS_PER_BLOCK} cards`, { hdu, keyword: 'END' });
    }
    for (let k = 0; k < CARDS_PER_BLOCK; k++) {
      const text = cardAt(bytes, pos + k * CARD_CHARS);
      if (/^END {5}/.test(text)) {
        const blocks = (pos - offset) / BLOCK_BYTES + 1;
        return { header: new FitsHeader(joinContinue(cards)), dataOffset: pos + BLOCK_BYTES, blocks };
      }
      cards.push(parseCard(text));
    }
    pos += BLOCK_BYTES;
  }
}

/**
 * Join the CONTINUE long-string convention (FITS 4.0, sec. 4.2.1.2): 'abc&' + CONTINUE 'def'.
 * Pieces are collected and joined once: joining card by card copied the growing
 * string each time, which took a minute for a 35,000-card chain.
 */
function joinContinue(cards: FitsCard[]): FitsCard[] {
  const out: FitsCard[] = [];
  let parts: string[] = []; // the string value of the last card in `out`, piece by piece
  let comment = '';
  const close = () => {
    if (parts.length > 1) out[out.length - 1] = { ...out[out.length - 1], value: parts.join(''), comment };
  };
  for (const c of cards) {
    const open = parts.length > 0 && parts[parts.length - 1].endsWith('&');
    if (c.key === 'CONTINUE' && open && typeof c.value === 'string') {
      parts[parts.length - 1] = parts[parts.length - 1].slice(0, -1);
      parts.push(c.value);
      comment = c.comment || comment;
      continue;
    }
    close();
    out.push(c);
    parts = typeof c.value === 'string' ? [c.value] : [];
    comment = c.comment;
  }
  close();
  return out;
}

/** Size of `n` bytes rounded up to whole 2880-byte blocks. */
export function blockAligned(n: number): number {
  return Math.ceil(n / BLOCK_BYTES) * BLOCK_BYTES;
}
