/**
 * Facts carried in comment lines of a text spectrum, written as `key: value`
 * or `key = value` (e.g. `# object: X`, `# ra: 150.1`, `# wavelength: air, nm`,
 * `# columns: wavelength flux ivar`). Without an object name, plate, MJD and
 * fibre numbers (`# plateid: 266`, `# mjd: 51630`, `# fiberid: 168`) make the
 * object id as in FITS headers (../objectId.ts).
 */
import type { SpectrumMeta } from '../../types';
import { nameTokens, wavelengthWords, stripQuotes, type WavelengthWords } from './columnNames';
import { plateMjdFibreId } from '../objectId';

export interface CommentLine {
  /** 1-based line number. */
  line: number;
  /** Text after the comment character, trimmed. */
  body: string;
}

/** A wavelength statement and the line it came from. */
export interface StatedWavelength extends WavelengthWords {
  line: number;
}

export interface CommentFacts {
  meta: SpectrumMeta;
  wavelength: StatedWavelength[];
  /** A `columns: ...` line: column names given in a comment. */
  columns?: { line: number; names: string };
}

/** A problem in a comment, for the reader to raise with its file name. */
export class CommentError extends Error {
  constructor(
    readonly line: number,
    readonly key: string,
    readonly reason: string,
  ) {
    super(reason);
  }
}

type MetaKey = 'objectId' | 'raDeg' | 'decDeg' | 'exposureS' | 'dateObs' | 'instrument' | 'fluxUnit';

const META_KEYS: Record<string, MetaKey> = {
  object: 'objectId', objid: 'objectId', obj_id: 'objectId', object_id: 'objectId', objname: 'objectId',
  object_name: 'objectId', name: 'objectId', target: 'objectId', target_id: 'objectId', targetid: 'objectId', id: 'objectId',
  desig: 'objectId', designation: 'objectId', target_name: 'objectId', targetname: 'objectId', targname: 'objectId',
  ra: 'raDeg', ra_deg: 'raDeg', raj2000: 'raDeg', ra_j2000: 'raDeg', right_ascension: 'raDeg',
  dec: 'decDeg', dec_deg: 'decDeg', dej2000: 'decDeg', decj2000: 'decDeg', dec_j2000: 'decDeg', declination: 'decDeg',
  exptime: 'exposureS', exposure: 'exposureS', exp_time: 'exposureS', exposure_time: 'exposureS', exposure_s: 'exposureS', texp: 'exposureS',
  date_obs: 'dateObs', dateobs: 'dateObs', date: 'dateObs', obs_date: 'dateObs', observation_date: 'dateObs',
  instrument: 'instrument', instrume: 'instrument', spectrograph: 'instrument',
  flux_unit: 'fluxUnit', flux_units: 'fluxUnit', fluxunit: 'fluxUnit', bunit: 'fluxUnit', funit: 'fluxUnit',
};

/** Keys whose value states the wavelength unit, medium or scale. */
const WAVELENGTH_KEYS = new Set([
  'wavelength', 'wavelengths', 'wave', 'lambda', 'wavelength_unit', 'wavelength_units', 'wave_unit', 'wunit',
  'lambda_unit', 'waveunit', 'wavelength_medium', 'medium', 'air_vacuum', 'air_or_vacuum', 'vacuum_or_air', 'airorvac',
  'wavelength_scale', 'wavelength_frame',
]);
const COLUMN_KEYS = new Set(['columns', 'column_names', 'cols', 'fields']);
/** Survey numbers that make an object id when no name is given (src/core/io/objectId.ts). */
const SURVEY_KEYS: Record<string, 'plate' | 'mjd' | 'fibre'> = {
  plate: 'plate', plateid: 'plate', plate_id: 'plate', mjd: 'mjd', fiber: 'fibre', fiberid: 'fibre', fiber_id: 'fibre', fibre: 'fibre', fibreid: 'fibre', fibre_id: 'fibre',
};
/** Values that mean "not known": the key is skipped, not an error. */
const UNKNOWN = /^(?:|n\/?a|none|unknown|-+|\?)$/i;

/**
 * Longest angle or exposure value read, characters. Real ones are under 30; the
 * cap keeps the regular expressions below (whose blank runs can be split many
 * ways) from taking seconds on a 65,000-character comment.
 */
const MAX_FACT_CHARS = 64;

const KEY_VALUE = /^([A-Za-z][A-Za-z0-9_ .\-]{0,40}?)\s*[:=]\s*(.*)$/;

/** Collect metadata and wavelength statements; throws CommentError on a value that cannot be read. */
export function readCommentFacts(comments: readonly CommentLine[]): CommentFacts {
  const facts: CommentFacts = { meta: {}, wavelength: [] };
  const survey: Partial<Record<'plate' | 'mjd' | 'fibre', string>> = {};
  for (const c of comments) {
    const m = KEY_VALUE.exec(c.body);
    if (!m) continue;
    const key = m[1].trim().toLowerCase().replace(/[^a-z0-9]+/g, '_');
    // FITS-style `KEY = 'value' / comment`: drop the trailing comment, then the quotes.
    let value = m[2].trim();
    // Found by index, not by /^'.*'\s*\/.*$/ and /\s*\/[^']*$/, which backtrack quadratically on long lines.
    const lastQuote = value.lastIndexOf("'");
    if (value.startsWith("'") && lastQuote > 0 && /^\s*\//.test(value.slice(lastQuote + 1))) value = value.slice(0, lastQuote + 1);
    value = stripQuotes(value.trim()).trim();
    if (WAVELENGTH_KEYS.has(key)) {
      const words = wavelengthWords(nameTokens(value));
      if (words === 'conflict') throw new CommentError(c.line, key, `wavelength statement '${value}' contradicts itself`);
      if (words.unit || words.medium || words.scale) facts.wavelength.push({ line: c.line, ...words });
      continue;
    }
    if (COLUMN_KEYS.has(key)) {
      facts.columns = { line: c.line, names: value };
      continue;
    }
    const number = SURVEY_KEYS[key];
    if (number) {
      // FITS-style `FIBERID = 168 / Fiber ID`: the number is what comes before the comment.
      const slash = value.indexOf('/');
      survey[number] ??= (slash >= 0 ? value.slice(0, slash) : value).trim();
      continue;
    }
    const target = META_KEYS[key];
    if (!target || UNKNOWN.test(value)) continue;
    if (facts.meta[target] !== undefined) continue; // the first statement wins
    setMeta(facts.meta, target, value, c.line, key);
  }
  if (facts.meta.objectId === undefined) {
    const built = plateMjdFibreId(survey.plate, survey.mjd, survey.fibre);
    if (built !== undefined) facts.meta.objectId = built;
  }
  return facts;
}

function setMeta(meta: SpectrumMeta, target: MetaKey, value: string, line: number, key: string): void {
  switch (target) {
    case 'raDeg':
    case 'decDeg': {
      const deg = parseAngleDeg(value, target === 'raDeg');
      // A header fact that cannot be read is left out: the spectrum itself is still good.
      if (deg !== undefined) meta[target] = deg;
      return;
    }
    case 'exposureS': {
      if (value.length > MAX_FACT_CHARS) return;
      const m = /^([+]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?)\s*(?:s|sec|secs|seconds?)?$/.exec(value);
      if (m) meta.exposureS = Number(m[1]);
      return;
    }
    default:
      meta[target] = value;
  }
}

/**
 * An angle in degrees from decimal degrees ('150.1', '150.1 deg') or sexagesimal
 * ('10:00:24.0', '10 00 24', '10h00m24s' for right ascension in hours;
 * '-02:12:00', '-2d12m00s' for declination). Out-of-range values give undefined.
 */
export function parseAngleDeg(value: string, isRa: boolean): number | undefined {
  const v = value.trim().toLowerCase();
  if (v.length > MAX_FACT_CHARS) return undefined;
  const decimal = /^([+-]?(?:\d+(?:\.\d*)?|\.\d+))\s*(?:d|deg|degrees?)?$/.exec(v);
  let deg: number;
  if (decimal) deg = Number(decimal[1]);
  else {
    const sexa = /^([+-]?)(\d{1,3})\s*[:hd ]\s*(\d{1,2})\s*[:m' ]\s*(\d{1,2}(?:\.\d*)?)\s*(?:s|")?$/.exec(v);
    if (!sexa) return undefined;
    const [, sign, a, b, c] = sexa;
    const mm = Number(b);
    const ss = Number(c);
    if (mm >= 60 || ss >= 60) return undefined;
    const x = Number(a) + mm / 60 + ss / 3600;
    deg = (sign === '-' ? -1 : 1) * (isRa ? 15 * x : x);
  }
  if (!Number.isFinite(deg)) return undefined;
  if (isRa ? deg < 0 || deg >= 360 : deg < -90 || deg > 90) return undefined;
  return deg;
}
