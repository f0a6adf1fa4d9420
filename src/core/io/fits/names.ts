/**
 * What a column, extension or image row holds, judged from its name. Names are
 * compared case-insensitively with spaces, '_' and '-' removed, so 'AND_MASK',
 * 'and mask' and 'andmask' are the same. The lists are common practice in survey
 * and observatory data products.
 */

/**
 * 'mask': non-zero marks a bad pixel. 'bitmask': survey bit masks (AND masks, data
 * quality words) whose bits are often informational: in the SDSS spectra in
 * test/data, 4610 of 4622 pixels of one file carry and_mask bits, 4605 of them with
 * a positive inverse variance. Such masks are used only when the file has no
 * uncertainty; otherwise the pipeline's zero inverse variance marks bad pixels.
 * Exception: the and-mask row of an image whose rows EXTEN0 names (the 2-D
 * survey layout 'Flux Inverse ... Andmask Ormask'), which is applied (image.ts).
 */
export type Role = 'wave' | 'loglam' | 'wave-air' | 'flux' | 'ivar' | 'variance' | 'error' | 'mask' | 'bitmask';

const ROLE_NAMES: Record<Role, readonly string[]> = {
  wave: ['wavelength', 'wave', 'lambda', 'lam', 'wl', 'wavelengthvacuum', 'wavelengthvac', 'wavevac', 'vacwave', 'vacuumwavelength', 'lambdavac', 'wavevacuum'],
  loglam: ['loglam', 'loglambda', 'logwave', 'logwavelength', 'log10lam', 'log10lambda', 'loglamvac'],
  'wave-air': ['awav', 'wavelengthair', 'waveair', 'airwave', 'airwavelength', 'lambdaair', 'lamair'],
  flux: ['flux', 'flam', 'fluxdensity', 'spec', 'spectrum', 'specflux', 'counts', 'fluxlambda', 'sciflux'],
  ivar: ['ivar', 'invvar', 'inversevariance', 'invvariance', 'inversevar', 'inverse', 'weight', 'weights', 'wht', 'fluxivar'],
  variance: ['var', 'variance', 'fluxvar', 'fluxvariance'],
  error: [
    'err', 'error', 'errors', 'sigma', 'sig', 'stddev', 'stdev', 'std', 'noise', 'unc', 'uncert', 'uncertainty',
    'fluxerr', 'fluxerror', 'eflux', 'errflux', 'fluxsigma', 'fluxunc', 'fluxuncertainty', 'ferr', 'dflux',
  ],
  mask: ['mask', 'badpix', 'badpixel', 'badpixels', 'bpm', 'pixelmask', 'pixmask', 'badpixelmask', 'badmask'],
  bitmask: ['andmask', 'dq', 'dataquality'],
};

const LOOKUP = new Map<string, Role>();
for (const [role, names] of Object.entries(ROLE_NAMES) as [Role, readonly string[]][]) {
  for (const n of names) LOOKUP.set(n, role);
}

/** Lower case with spaces, '_', '-', '.' and brackets removed. */
export function normaliseName(name: string): string {
  return name.toLowerCase().replace(/[^a-z0-9]/g, '');
}

/** The role a name announces, or null when it is not one we know. */
export function roleOf(name: string): Role | null {
  return LOOKUP.get(normaliseName(name)) ?? null;
}

/** Roles that describe an uncertainty, and how to turn each into inverse variance. */
export function isUncertainty(role: Role | null): role is 'ivar' | 'variance' | 'error' {
  return role === 'ivar' || role === 'variance' || role === 'error';
}

/**
 * Turn uncertainty values into inverse variance in place: ivar as is, 1/variance,
 * 1/error^2. Zero, negative or non-finite uncertainties become 0 (no information).
 */
export function toInverseVariance(values: Float64Array, kind: 'ivar' | 'variance' | 'error'): Float64Array {
  for (let i = 0; i < values.length; i++) {
    const v = values[i];
    let w: number;
    if (kind === 'ivar') w = v;
    else if (kind === 'variance') w = v > 0 ? 1 / v : 0;
    else w = v > 0 ? 1 / (v * v) : 0;
    values[i] = Number.isFinite(w) && w > 0 ? w : 0;
  }
  return values;
}
