/**
 * Spectrum metadata from FITS headers: object id, position, date, exposure,
 * instrument, flux unit. Headers are searched in the order given (the data HDU
 * first, then the primary HDU); the first usable value wins.
 */
import type { SpectrumMeta } from '../../types';
import { plateMjdFibreId } from '../objectId';
import type { FitsHeader, FitsHeaderValue } from './header';

function firstString(hs: readonly FitsHeader[], keys: readonly string[]): string | undefined {
  for (const h of hs) {
    for (const k of keys) {
      const v = h.get(k);
      if (typeof v === 'string' && v.trim() !== '') return v.trim();
      if (typeof v === 'number' || typeof v === 'bigint') return String(v);
    }
  }
  return undefined;
}

function firstNumber(hs: readonly FitsHeader[], keys: readonly string[]): number | undefined {
  for (const h of hs) {
    for (const k of keys) {
      const v = h.get(k);
      if (typeof v === 'number' && Number.isFinite(v)) return v;
      if (typeof v === 'string' && /^[+-]?(\d+(?:\.\d*)?|\.\d+)([eEdD][+-]?\d+)?$/.test(v.trim())) return Number(v.trim().replace(/[dD]/, 'e'));
    }
  }
  return undefined;
}

/**
 * Parse a sexagesimal angle 'dd:mm:ss.s', 'dd mm ss.s' or 'ddhmmmss.ss' into
 * units of its first field (hours or degrees), or a plain decimal string.
 * Returns undefined for anything else.
 */
export function parseSexagesimal(text: string): number | undefined {
  const t = text.trim();
  // Not '\d+\.?\d*', which backtracks quadratically on a long run of digits (CONTINUE strings).
  if (/^[+-]?(\d+(?:\.\d*)?|\.\d+)$/.test(t)) return Number(t);
  const m = /^([+-])?\s*(\d+)[\s:hHdD]+(\d+)[\s:mM']+(\d+(?:\.\d*)?)\s*[sS"]?$/.exec(t) ?? /^([+-])?\s*(\d+)[\s:hHdD]+(\d+(?:\.\d*)?)[mM']?$/.exec(t);
  if (!m) return undefined;
  const a = Number(m[2]);
  const b = Number(m[3]);
  const c = m[4] !== undefined ? Number(m[4]) : 0;
  if (b >= 60 || c >= 60) return undefined;
  const v = a + b / 60 + c / 3600;
  return m[1] === '-' ? -v : v;
}

/** Right ascension in degrees: numbers are degrees; sexagesimal strings are hours. */
function raDeg(hs: readonly FitsHeader[]): number | undefined {
  // PLUG_RA is the object position in fibre-fed survey files, where RA can be the telescope pointing.
  for (const h of hs) {
    for (const k of ['PLUG_RA', 'RA_OBJ', 'OBJRA', 'RA_TARG', 'RA']) {
      const v = h.get(k);
      if (typeof v === 'number' && Number.isFinite(v)) return v;
      if (typeof v === 'string') {
        const isSexa = /[:\shH]/.test(v.trim());
        const x = parseSexagesimal(v);
        if (x !== undefined) return isSexa ? x * 15 : x;
      }
    }
  }
  return undefined;
}

function decDeg(hs: readonly FitsHeader[]): number | undefined {
  for (const h of hs) {
    for (const k of ['PLUG_DEC', 'DEC_OBJ', 'OBJDEC', 'DEC_TARG', 'DEC']) {
      const v = h.get(k);
      if (typeof v === 'number' && Number.isFinite(v)) return v;
      if (typeof v === 'string') {
        const x = parseSexagesimal(v);
        if (x !== undefined) return x;
      }
    }
  }
  return undefined;
}

/**
 * Keywords that name the object, most telling first: an observer's OBJECT; a
 * survey designation (LAMOST writes DESIG = 'LAMOST Jhhmmss.ss+ddmmss.s', its
 * published name, beside OBJNAME, a number from its input catalogue); other
 * object and target names; an object number (OBJID). DESIGNATION and
 * TARGETNAME are longer than 8 characters, so they can only come as HIERARCH cards.
 */
export const OBJECT_NAME_KEYS = ['OBJECT', 'DESIG', 'DESIGNATION', 'OBJNAME', 'TARGNAME', 'TARGETNAME', 'TARGET', 'OBJID'] as const;

function firstValue(hs: readonly FitsHeader[], keys: readonly string[]): FitsHeaderValue | undefined {
  for (const h of hs) {
    for (const k of keys) {
      const v = h.get(k);
      if (v !== undefined && v !== null && !(typeof v === 'string' && v.trim() === '')) return v;
    }
  }
  return undefined;
}

/**
 * The object id: a name keyword (OBJECT_NAME_KEYS); else plate-MJD-fibre from
 * PLATEID (or PLATE), MJD and FIBERID (or FIBER), as fibre surveys of the
 * SDSS kind write them (src/core/io/objectId.ts); else an observation id (OBSID).
 */
export function objectIdFromHeaders(hs: readonly FitsHeader[]): string | undefined {
  const named = firstString(hs, OBJECT_NAME_KEYS);
  if (named !== undefined) return named;
  const built = plateMjdFibreId(firstValue(hs, ['PLATEID', 'PLATE']), firstValue(hs, ['MJD']), firstValue(hs, ['FIBERID', 'FIBER']));
  if (built !== undefined) return built;
  return firstString(hs, ['OBSID']);
}

/** Metadata from the headers, most specific first. `fluxUnit` overrides BUNIT (e.g. a table column's TUNIT). */
export function metaFromHeaders(hs: readonly FitsHeader[], fluxUnit?: string): SpectrumMeta {
  const meta: SpectrumMeta = {};
  const objectId = objectIdFromHeaders(hs);
  if (objectId !== undefined) meta.objectId = objectId;
  const ra = raDeg(hs);
  if (ra !== undefined) meta.raDeg = ra;
  const dec = decDeg(hs);
  if (dec !== undefined) meta.decDeg = dec;
  const date = firstString(hs, ['DATE-OBS', 'DATE_OBS']);
  if (date !== undefined) meta.dateObs = date;
  const exp = firstNumber(hs, ['EXPTIME', 'EXPOSURE', 'EXP_TIME', 'TEXPTIME']);
  if (exp !== undefined) meta.exposureS = exp;
  const instrument = firstString(hs, ['INSTRUME']) ?? firstString(hs, ['TELESCOP']);
  if (instrument !== undefined) meta.instrument = instrument;
  const unit = fluxUnit !== undefined && fluxUnit.trim() !== '' ? fluxUnit.trim() : firstString(hs, ['BUNIT']);
  if (unit !== undefined) meta.fluxUnit = unit;
  return meta;
}
