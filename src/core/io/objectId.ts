/**
 * Object ids built from survey numbers, shared by the FITS header reader and
 * the text comment reader.
 *
 * Fibre surveys name a spectrum by plate, MJD (modified Julian day of the
 * observation) and fibre. Our id writes those three numbers as digits joined
 * by '-', zero-padded to 4, 5 and 4 digits as the surveys pad them in their
 * file names (so spec-0266-51630-0168.fits gets 0266-51630-0168); wider
 * numbers keep all their digits.
 */

/** A plate, MJD or fibre number: a whole number >= 0 (as a number, bigint or digit string), else undefined. */
export function surveyNumber(v: unknown): bigint | undefined {
  if (typeof v === 'bigint') return v >= 0n ? v : undefined;
  if (typeof v === 'number') return Number.isSafeInteger(v) && v >= 0 ? BigInt(v) : undefined;
  if (typeof v === 'string' && /^\s*\+?\d{1,18}\s*$/.test(v)) return BigInt(v.trim().replace('+', ''));
  return undefined;
}

/** 'PPPP-MMMMM-FFFF' from plate, MJD and fibre, or undefined unless all three are whole numbers >= 0. */
export function plateMjdFibreId(plate: unknown, mjd: unknown, fibre: unknown): string | undefined {
  const p = surveyNumber(plate);
  const m = surveyNumber(mjd);
  const f = surveyNumber(fibre);
  if (p === undefined || m === undefined || f === undefined) return undefined;
  return `${String(p).padStart(4, '0')}-${String(m).padStart(5, '0')}-${String(f).padStart(4, '0')}`;
}
