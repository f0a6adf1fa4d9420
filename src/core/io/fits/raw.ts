import type { ReadErrorWhere } from '../../types';
import type { FitsHeader } from './header';

/** What the image and table readers hand back before air conversion and validation. */
export interface RawSpectrum {
  format: 'fits-image' | 'fits-table';
  /** Wavelengths in Angstrom as the file gives them (air when `air`). */
  wavelengthA: Float64Array;
  air: boolean;
  flux: Float64Array;
  /** Inverse variance, or null when the file has no uncertainty. */
  ivar: Float64Array | null;
  mask?: Uint8Array;
  /** Headers to take metadata from, most specific first. */
  headers: FitsHeader[];
  /** Flux unit from a table column (TUNITn), overriding BUNIT. */
  fluxUnit?: string;
  where: ReadErrorWhere;
  /** How the wavelengths were found, e.g. 'WAVE-LOG', "column 'loglam'". */
  wavelengthRule: string;
  /** Where the uncertainty came from ('' when none). */
  noiseFrom: string;
}
