/**
 * Rest-frame vacuum wavelengths (Angstrom) of the lines used for redshifts.
 * Sources: VdB = Vanden Berk et al. 2001, AJ 122, 549, Table 2;
 * SDSS = the SDSS spectral line table (vacuum); NIST = NIST Atomic Spectra Database.
 * Blends are gf-weighted means of doublets, as VdB gives them.
 */

export type LineKind = 'emission' | 'absorption';

/** Which template families use a line: quasar broad, narrow nebular, stellar/galaxy absorption. */
export type LineRole = 'qso-broad' | 'narrow' | 'absorption';

export interface CatalogueLine {
  /** Stable id used in tables and code. */
  id: string;
  /** Label as astronomers write it. */
  label: string;
  /** Vacuum rest wavelength, Angstrom. */
  restA: number;
  kind: LineKind;
  roles: LineRole[];
  /** Relative strength within its role, for the templates and for ranking (1 = strongest). */
  strength: number;
  source: string;
}

export const LINES: readonly CatalogueLine[] = [
  { id: 'LyB', label: 'Ly\u03b2', restA: 1025.72, kind: 'emission', roles: ['qso-broad'], strength: 0.1, source: 'VdB (via Finke 2016 Table 5)' },
  { id: 'OVI', label: 'O VI', restA: 1033.82, kind: 'emission', roles: ['qso-broad'], strength: 0.1, source: 'blend of 1031.93/1037.62, from memory' },
  { id: 'LyA', label: 'Ly\u03b1', restA: 1215.67, kind: 'emission', roles: ['qso-broad'], strength: 1.0, source: 'VdB' },
  { id: 'NV', label: 'N V', restA: 1240.14, kind: 'emission', roles: ['qso-broad'], strength: 0.15, source: 'VdB blend, from memory; 2:1 mean 1240.15' },
  { id: 'SiII_1262', label: 'Si II', restA: 1262.59, kind: 'emission', roles: ['qso-broad'], strength: 0.01, source: 'VdB, from memory' },
  { id: 'OI_1304', label: 'O I', restA: 1304.35, kind: 'emission', roles: ['qso-broad'], strength: 0.02, source: 'VdB' },
  { id: 'CII_1335', label: 'C II', restA: 1335.3, kind: 'emission', roles: ['qso-broad'], strength: 0.01, source: 'VdB, from memory' },
  { id: 'SiIV', label: 'Si IV+O IV]', restA: 1396.76, kind: 'emission', roles: ['qso-broad'], strength: 0.08, source: 'VdB' },
  { id: 'CIV', label: 'C IV', restA: 1549.06, kind: 'emission', roles: ['qso-broad'], strength: 0.25, source: 'VdB' },
  { id: 'HeII_1640', label: 'He II', restA: 1640.42, kind: 'emission', roles: ['qso-broad'], strength: 0.02, source: 'VdB / SDSS' },
  { id: 'CIII', label: 'C III]', restA: 1908.73, kind: 'emission', roles: ['qso-broad'], strength: 0.16, source: 'VdB; SDSS 1908.734' },
  { id: 'MgII', label: 'Mg II', restA: 2798.75, kind: 'emission', roles: ['qso-broad'], strength: 0.14, source: 'VdB' },
  { id: 'NeV', label: '[Ne V]', restA: 3426.85, kind: 'emission', roles: ['narrow'], strength: 0.05, source: 'SDSS 3426.85' },
  { id: 'OII', label: '[O II]', restA: 3728.48, kind: 'emission', roles: ['narrow'], strength: 0.8, source: 'mean of SDSS 3727.092/3729.875 (VdB blend 3728.48, from memory)' },
  { id: 'NeIII', label: '[Ne III]', restA: 3869.86, kind: 'emission', roles: ['narrow'], strength: 0.1, source: 'SDSS 3869.857' },
  { id: 'CaK', label: 'Ca II K', restA: 3934.78, kind: 'absorption', roles: ['absorption'], strength: 1.0, source: 'SDSS 3934.777' },
  { id: 'CaH', label: 'Ca II H', restA: 3969.59, kind: 'absorption', roles: ['absorption'], strength: 0.9, source: 'SDSS 3969.588' },
  { id: 'Heps', label: 'H\u03b5', restA: 3971.2, kind: 'emission', roles: ['narrow'], strength: 0.05, source: 'SDSS 3971.195' },
  { id: 'Hdel', label: 'H\u03b4', restA: 4102.89, kind: 'emission', roles: ['narrow', 'qso-broad'], strength: 0.08, source: 'SDSS 4102.892; VdB 4102.89' },
  { id: 'Gband', label: 'G band', restA: 4305.61, kind: 'absorption', roles: ['absorption'], strength: 0.5, source: 'SDSS 4305.61 (a band, +-5 A)' },
  { id: 'Hgam', label: 'H\u03b3', restA: 4341.68, kind: 'emission', roles: ['narrow', 'qso-broad'], strength: 0.15, source: 'SDSS 4341.684; VdB' },
  { id: 'OIII_4364', label: '[O III]', restA: 4364.44, kind: 'emission', roles: ['narrow'], strength: 0.02, source: 'SDSS 4364.436' },
  { id: 'Hbeta', label: 'H\u03b2', restA: 4862.68, kind: 'emission', roles: ['narrow', 'qso-broad'], strength: 0.35, source: 'SDSS 4862.683; VdB 4862.68' },
  { id: 'OIII_4960', label: '[O III]', restA: 4960.3, kind: 'emission', roles: ['narrow'], strength: 0.33, source: 'SDSS 4960.295' },
  { id: 'OIII_5008', label: '[O III]', restA: 5008.24, kind: 'emission', roles: ['narrow'], strength: 1.0, source: 'SDSS 5008.240' },
  { id: 'Mgb', label: 'Mg b', restA: 5176.7, kind: 'absorption', roles: ['absorption'], strength: 0.6, source: 'SDSS blend 5176.7' },
  { id: 'NaD', label: 'Na D', restA: 5895.6, kind: 'absorption', roles: ['absorption'], strength: 0.5, source: 'SDSS blend 5895.6' },
  { id: 'HeI_5877', label: 'He I', restA: 5877.25, kind: 'emission', roles: ['narrow'], strength: 0.03, source: 'brief value; VdB 5877.29' },
  { id: 'OI_6302', label: '[O I]', restA: 6302.05, kind: 'emission', roles: ['narrow'], strength: 0.05, source: 'SDSS 6302.046' },
  { id: 'NII_6550', label: '[N II]', restA: 6549.86, kind: 'emission', roles: ['narrow'], strength: 0.1, source: 'SDSS 6549.86' },
  { id: 'Halpha', label: 'H\u03b1', restA: 6564.61, kind: 'emission', roles: ['narrow', 'qso-broad'], strength: 1.0, source: 'SDSS / VdB 6564.61' },
  { id: 'NII_6585', label: '[N II]', restA: 6585.27, kind: 'emission', roles: ['narrow'], strength: 0.3, source: 'SDSS 6585.27' },
  { id: 'SII_6718', label: '[S II]', restA: 6718.29, kind: 'emission', roles: ['narrow'], strength: 0.15, source: 'SDSS 6718.29' },
  { id: 'SII_6733', label: '[S II]', restA: 6732.67, kind: 'emission', roles: ['narrow'], strength: 0.11, source: 'SDSS 6732.67' },
];

/**
 * Components of blends the catalogue lists as one line, for templates that
 * need them apart (the [O II] doublet ratio varies with density); not shown as
 * markers or measured on their own.
 */
export const LINE_COMPONENTS: readonly { id: string; blendOf: string; restA: number; source: string }[] = [
  { id: 'OII_3727', blendOf: 'OII', restA: 3727.09, source: 'SDSS 3727.092' },
  { id: 'OII_3730', blendOf: 'OII', restA: 3729.88, source: 'SDSS 3729.875' },
];

/** Rest wavelength of a catalogue line or blend component by id, Angstrom (throws on an unknown id: a typo in code). */
export function restWavelengthA(id: string): number {
  const hit = LINES.find((l) => l.id === id) ?? LINE_COMPONENTS.find((l) => l.id === id);
  if (!hit) throw new Error(`line ${id} is not in the catalogue`);
  return hit.restA;
}

/** Lyman limit, Angstrom (from memory: 911.75). Flux blueward is absorbed at high z. */
export const LYMAN_LIMIT_A = 911.75;

/** Night-sky emission lines and telluric bands, vacuum Angstrom (docs/reference.md sec. 7; mostly from memory). */
export const SKY_REGIONS_A: readonly { label: string; fromA: number; toA: number }[] = [
  { label: '[O I] sky', fromA: 5572, toA: 5586 },
  { label: 'Na D sky', fromA: 5886, toA: 5903 },
  { label: '[O I] sky', fromA: 6296, toA: 6308 },
  { label: '[O I] sky', fromA: 6360, toA: 6371 },
  { label: 'O2 B band', fromA: 6862, toA: 6892 },
  { label: 'O2 A band', fromA: 7592, toA: 7702 },
];

export function lineById(id: string): CatalogueLine | undefined {
  return LINES.find((l) => l.id === id);
}
