/**
 * Where each broad line and continuum luminosity is measured, in rest
 * Angstrom: continuum windows, the line-fitting range and the narrow lines
 * fitted beside the broad one. Windows and ranges follow Shen et al. (2011,
 * ApJS 194, 45, sec. 3.2; from memory); rest wavelengths come from the line
 * catalogue.
 */
import { restWavelengthA } from '../lines/catalogue';

export type BroadLineId = 'CIV' | 'MgII' | 'Hbeta' | 'Halpha';
export type ContinuumRefA = 1350 | 3000 | 5100;

export interface NarrowLine {
  id: string;
  /** Ratio to a partner's amplitude (fixed doublet ratio), or free when absent. */
  tiedTo?: { id: string; ratio: number };
}

export interface RegionDef {
  id: 'uv' | 'mgii' | 'hbeta' | 'halpha';
  windowsA: readonly (readonly [number, number])[];
  refA: number;
  /** The standard luminosity measured here, if any. */
  luminosityA?: ContinuumRefA;
  withFe: boolean;
  line: BroadLineId;
  lineRangeA: readonly [number, number];
  /** Limits of the broad components' shift, km/s. */
  broadShiftKms: readonly [number, number];
  narrow: readonly NarrowLine[];
}

export const REGIONS: readonly RegionDef[] = [
  {
    id: 'uv',
    windowsA: [[1275, 1290], [1350, 1360], [1445, 1465], [1690, 1705]],
    refA: 1350,
    luminosityA: 1350,
    withFe: false,
    line: 'CIV',
    lineRangeA: [1500, 1600],
    // C IV peaks are blueshifted by up to several thousand km/s (Richards et al. 2002, AJ 124, 1).
    broadShiftKms: [-5000, 2000],
    narrow: [],
  },
  {
    id: 'mgii',
    windowsA: [[2200, 2700], [2900, 3090]],
    refA: 3000,
    luminosityA: 3000,
    withFe: true,
    line: 'MgII',
    lineRangeA: [2700, 2900],
    broadShiftKms: [-3000, 3000],
    narrow: [],
  },
  {
    id: 'hbeta',
    windowsA: [[4435, 4700], [5100, 5535]],
    refA: 5100,
    luminosityA: 5100,
    withFe: true,
    line: 'Hbeta',
    lineRangeA: [4700, 5100],
    broadShiftKms: [-3000, 3000],
    // [O III] 4960/5008 = 1/2.98 (Storey & Zeippen 2000, MNRAS 312, 813; from memory).
    narrow: [{ id: 'Hbeta' }, { id: 'OIII_5008' }, { id: 'OIII_4960', tiedTo: { id: 'OIII_5008', ratio: 1 / 2.98 } }],
  },
  {
    id: 'halpha',
    windowsA: [[6000, 6250], [6800, 7000]],
    refA: 6200,
    withFe: false,
    line: 'Halpha',
    lineRangeA: [6400, 6800],
    broadShiftKms: [-3000, 3000],
    // [N II] 6550/6585 = 1/2.96 (Osterbrock & Ferland 2006; from memory).
    narrow: [{ id: 'Halpha' }, { id: 'NII_6585' }, { id: 'NII_6550', tiedTo: { id: 'NII_6585', ratio: 1 / 2.96 } }, { id: 'SII_6718' }, { id: 'SII_6733' }],
  },
];

/** Rest wavelength of a broad line, Angstrom (the catalogue's). */
export function broadLineRestA(id: BroadLineId): number {
  return restWavelengthA(id);
}

/** Broad components: FWHM above 1200 km/s, below 20,000 km/s; narrow below 1200 (Shen et al. 2011 sec. 3.2; from memory). */
export const BROAD_MIN_FWHM_KMS = 1200;
export const BROAD_MAX_FWHM_KMS = 20000;
