/**
 * A file's flux unit string -> the factor to erg s^-1 cm^-2 A^-1, or the
 * reason there is none. Only absolute f_lambda units are accepted: a
 * luminosity needs a calibrated flux, and a scale is never guessed.
 *
 * Spellings read: an optional leading factor ('1E-17', '1e-17', '10^-17',
 * '10**-17'), then energy (erg, J; W = J/s), time (s), area (cm2, cm^2, m2,
 * cm-2 ...) and wavelength (A, Ang, Angstrom, nm, um) joined by '/', '.', '*'
 * or spaces, with powers written 2, ^2, **2, -2 or ^-2 (FITS 4.0 sec. 4.3 and
 * the spellings surveys write in BUNIT / TUNIT).
 */

export type FluxScale = { ok: true; ergPerSCm2A: number } | { ok: false; reason: string };

/** Words that mark a relative or uncalibrated flux. */
const RELATIVE = /(relative|arbitrary|normali[sz]ed|counts?|adu|electrons?|dn\b|uncalibrated)/i;

const ENERGY: Record<string, number> = { erg: 1, j: 1e7 };
const LENGTH_CM: Record<string, number> = { cm: 1, m: 100, mm: 0.1 };
const WAVE_A: Record<string, number> = { a: 1, ang: 1, angstrom: 1, angstroms: 1, aa: 1, '\u00e5': 1, nm: 10, um: 1e4, micron: 1e4 };

interface Factor {
  name: string;
  power: number;
}

/** Leading numeric factor and the rest of the string. */
function splitScale(s: string): { scale: number; rest: string } {
  const m = /^\s*(?:10\s*(?:\^|\*\*)\s*\(?\s*([+-]?\d+)\s*\)?|(\d+(?:\.\d*)?(?:e[+-]?\d+)?))\s*(?:[*x\u00d7]\s*)?/i.exec(s);
  if (!m || m[0].trim() === '') return { scale: 1, rest: s };
  const scale = m[1] !== undefined ? 10 ** Number(m[1]) : Number(m[2]);
  return { scale, rest: s.slice(m[0].length) };
}

function factorsOf(rest: string): Factor[] | null {
  const out: Factor[] = [];
  // Tokens with their separator: a '/' inverts only the token after it (left to right, as surveys write 'erg/s/cm2/A').
  const re = /(\/?)\s*([a-z\u00e5]+)\s*(?:\^|\*\*)?\s*\(?\s*([+-]?\d+)?\s*\)?/gi;
  let m: RegExpExecArray | null;
  while ((m = re.exec(rest)) !== null) {
    if (m[0] === '') break;
    const sign = m[1] === '/' ? -1 : 1;
    const p = m[3] !== undefined ? Number(m[3]) : 1;
    out.push({ name: m[2].toLowerCase(), power: sign * p });
  }
  const leftover = rest.replace(re, '').replace(/[\s.*()/]/g, '');
  return leftover === '' && out.length > 0 ? out : null;
}

/**
 * The factor that turns one unit of the file's flux into erg s^-1 cm^-2 A^-1,
 * or why that cannot be done (no unit, a relative flux, f_nu, or a spelling
 * not understood).
 */
export function fluxScaleOf(unit: string | undefined): FluxScale {
  if (unit === undefined || unit.trim() === '') return { ok: false, reason: 'the file states no flux unit, so the flux scale is unknown' };
  if (RELATIVE.test(unit)) return { ok: false, reason: `flux unit '${unit}' is relative, not absolutely calibrated` };
  if (/jy|hz/i.test(unit)) return { ok: false, reason: `flux unit '${unit}' is per frequency (f_nu); only f_lambda units are read` };
  const { scale, rest } = splitScale(unit.trim());
  const factors = factorsOf(rest);
  if (!factors || !(scale > 0)) return { ok: false, reason: `flux unit '${unit}' is not understood` };
  let energyPow = 0;
  let timePow = 0;
  let factor = scale;
  const lengths: Factor[] = [];
  for (const f of factors) {
    if (f.name in ENERGY) {
      energyPow += f.power;
      factor *= ENERGY[f.name] ** f.power;
    } else if (f.name === 'w') {
      energyPow += f.power; // W = J/s
      timePow -= f.power;
      factor *= 1e7 ** f.power;
    } else if (f.name === 's' || f.name === 'sec') {
      timePow += f.power;
    } else if (f.name in LENGTH_CM || f.name in WAVE_A) {
      lengths.push(f);
    } else {
      return { ok: false, reason: `flux unit '${unit}' has a part '${f.name}' that is not understood` };
    }
  }
  // One area (power -2) and one wavelength (power -1); 'm' may be either, so take the area first.
  const area = lengths.find((f) => f.power === -2 && f.name in LENGTH_CM);
  const wave = lengths.find((f) => f !== area && f.power === -1 && (f.name in WAVE_A || f.name in LENGTH_CM));
  if (energyPow !== 1 || timePow !== -1 || !area || !wave || lengths.length !== 2) {
    return { ok: false, reason: `flux unit '${unit}' is not a flux density per unit wavelength` };
  }
  factor /= LENGTH_CM[area.name] ** 2;
  factor /= wave.name in WAVE_A ? WAVE_A[wave.name] : LENGTH_CM[wave.name] * 1e8;
  return { ok: true, ergPerSCm2A: factor };
}
