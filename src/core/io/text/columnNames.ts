/**
 * What a text column holds, read from its header name: role (wavelength, flux,
 * uncertainty, mask) and, for wavelength, unit, medium (air/vacuum) and scale
 * (linear or logarithmic). Names are split into lower-case word tokens, so
 * 'Wavelength [nm]', 'wavelength_air_nm', 'waveAir' and '"loglam"' all work.
 */

export type ColumnRole = 'wavelength' | 'flux' | 'ivar' | 'error' | 'variance' | 'mask';
export type WavelengthUnit = 'angstrom' | 'nm' | 'um';
export type Medium = 'air' | 'vacuum';
/** linear: the value is the wavelength; log10 / ln: the value is its logarithm. */
export type WavelengthScale = 'linear' | 'log10' | 'ln';

/** What the words of a header name or a comment say about the wavelength. */
export interface WavelengthWords {
  unit?: WavelengthUnit;
  medium?: Medium;
  scale?: WavelengthScale;
}

export interface ColumnName extends WavelengthWords {
  /** The name as written (quotes removed). */
  raw: string;
  role: ColumnRole | null;
  /** Text in brackets after the name, e.g. '1e-17 erg/s/cm2/A' from 'flux [1e-17 erg/s/cm2/A]'. */
  bracketUnit?: string;
  /** True for a mask column that is an AND mask (bad in every exposure), preferred over others. */
  andMask?: boolean;
}

const UNIT_WORDS: Record<string, WavelengthUnit> = {
  a: 'angstrom', aa: 'angstrom', ang: 'angstrom', angstrom: 'angstrom', angstroms: 'angstrom',
  nm: 'nm', nanometer: 'nm', nanometers: 'nm', nanometre: 'nm', nanometres: 'nm',
  um: 'um', micron: 'um', microns: 'um', micrometer: 'um', micrometers: 'um', micrometre: 'um', micrometres: 'um',
};
const MEDIUM_WORDS: Record<string, Medium> = { air: 'air', vac: 'vacuum', vacuum: 'vacuum', vacuo: 'vacuum' };
const LOG10_WORDS = new Set(['log', 'log10', 'loglam', 'loglambda', 'logwave', 'logwavelength', 'log10lam', 'log10lambda']);
const LN_WORDS = new Set(['ln', 'lnlam', 'lnlambda', 'lnwave', 'lnwavelength']);
const WAVE_WORDS = new Set(['wavelength', 'wavelengths', 'wave', 'wavelen', 'wav', 'lambda', 'lam', 'wl', ...LOG10_WORDS, ...LN_WORDS]);
const FLUX_WORDS = new Set(['flux', 'fluxes', 'f', 'flam', 'flambda', 'fnu', 'fluxdensity', 'intensity', 'counts', 'spec', 'spectrum', 'fl']);
const MASK_WORDS = new Set(['mask', 'andmask', 'ormask', 'pixmask', 'pixelmask', 'flag', 'flags', 'badpix', 'bad', 'quality']);
const IVAR_WORDS = new Set(['ivar', 'invvar', 'ivariance', 'inversevariance']);
const INVERSE_WORDS = new Set(['inv', 'inverse']);
const VAR_WORDS = new Set(['var', 'variance']);
const ERROR_WORDS = new Set([
  'err', 'error', 'errors', 'sigma', 'noise', 'uncertainty', 'uncertainties', 'unc', 'uncert',
  'stddev', 'stdev', 'std', 'eflux', 'fluxerr', 'dflux', 'ferr',
]);

/** Lower-case word tokens of a name: camelCase split, micro sign and Angstrom sign folded. */
export function nameTokens(name: string): string[] {
  const folded = name
    .replace(/([a-z])([A-Z])/g, '$1_$2')
    .toLowerCase()
    .replace(/[\u00b5\u03bc]/g, 'u') // micro sign, Greek mu
    .replace(/[\u00e5\u212b]/g, 'angstrom'); // a-ring (Å lower-cased), Angstrom sign
  return folded.split(/[^a-z0-9]+/).filter((t) => t.length > 0);
}

/** Unit, medium and scale stated by a list of words; conflicting words give 'conflict'. */
export function wavelengthWords(tokens: readonly string[]): WavelengthWords | 'conflict' {
  const out: WavelengthWords = {};
  for (const t of tokens) {
    const unit = UNIT_WORDS[t];
    const medium = MEDIUM_WORDS[t];
    const scale: WavelengthScale | undefined = LOG10_WORDS.has(t) ? 'log10' : LN_WORDS.has(t) ? 'ln' : undefined;
    if (unit) {
      if (out.unit && out.unit !== unit) return 'conflict';
      out.unit = unit;
    }
    if (medium) {
      if (out.medium && out.medium !== medium) return 'conflict';
      out.medium = medium;
    }
    if (scale) {
      if (out.scale && out.scale !== scale) return 'conflict';
      out.scale = scale;
    }
  }
  return out;
}

function roleOf(tokens: readonly string[]): ColumnRole | null {
  if (tokens.length === 0) return null;
  const has = (set: Set<string>) => tokens.some((t) => set.has(t));
  if (has(MASK_WORDS)) return 'mask';
  if (has(IVAR_WORDS) || (has(INVERSE_WORDS) && has(VAR_WORDS))) return 'ivar';
  if (has(VAR_WORDS)) return 'variance';
  // 'e_flux', 'e flux': a leading 'e' marks an uncertainty in many catalogues.
  if (has(ERROR_WORDS) || (tokens[0] === 'e' && tokens.length > 1)) return 'error';
  // The first word decides between 'f_lambda' (flux) and 'lambda_air' (wavelength).
  if (FLUX_WORDS.has(tokens[0])) return 'flux';
  if (WAVE_WORDS.has(tokens[0])) return 'wavelength';
  if (has(WAVE_WORDS)) return 'wavelength';
  if (has(FLUX_WORDS)) return 'flux';
  return null;
}

/** Read one header name. Conflicting unit or medium words make the role null (unrecognised). */
export function parseColumnName(written: string): ColumnName {
  const raw = stripQuotes(written.trim());
  const bracketUnit = trailingBracket(raw);
  const tokens = nameTokens(raw);
  const role = roleOf(tokens);
  const col: ColumnName = { raw, role };
  if (bracketUnit) col.bracketUnit = bracketUnit;
  if (role === 'wavelength') {
    const words = wavelengthWords(tokens);
    if (words === 'conflict') return { raw, role: null };
    Object.assign(col, words);
  }
  if (role === 'mask' && (tokens.includes('and') || tokens.includes('andmask'))) col.andMask = true;
  return col;
}

/**
 * Text inside a trailing '[...]' or '(...)' (what /[[(]([^\])]*)[\])]\s*$/ captures),
 * found in linear time: the regular expression backtracks quadratically on a
 * name of many opening brackets (seconds for a 65,000-character header field).
 */
export function trailingBracket(name: string): string | undefined {
  const t = name.trimEnd();
  const close = t.length - 1;
  if (close < 0 || (t[close] !== ']' && t[close] !== ')')) return undefined;
  let open = -1;
  for (let i = close - 1; i >= 0; i--) {
    const c = t[i];
    if (c === ']' || c === ')') break;
    if (c === '[' || c === '(') open = i; // keep the leftmost opening bracket after the last closing one
  }
  return open < 0 ? undefined : t.slice(open + 1, close).trim();
}

/** Remove one pair of surrounding double or single quotes. */
export function stripQuotes(s: string): string {
  if (s.length >= 2 && (s[0] === '"' || s[0] === "'") && s[s.length - 1] === s[0]) {
    return s.slice(1, -1).replace(s[0] === '"' ? /""/g : /''/g, s[0]);
  }
  return s;
}
