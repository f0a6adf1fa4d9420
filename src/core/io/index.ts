/** The public face of the readers: file bytes in, a validated Spectrum or a SpectrumReadError out. */
export { readSpectrum, tryReadSpectrum, binaryKind, type ReadOutcome } from './readSpectrum';
export { readSpectra, spectrumId, type ReadItem } from './readSpectra';
export { MAX_SPECTRA_PER_FILE } from './fits/multi';
export { readTextSpectrum, MAX_TEXT_BYTES, MAX_LINE_CHARS } from './text';
export { readFits, isFits } from './fits/readFits';
export { airToVacuumA, vacuumToAirA } from './airVacuum';
export { assembleSpectrum, checkPixelCount, MAX_PIXELS, type SpectrumParts } from './assemble';
export { gunzipChecked, isGzip, MAX_GUNZIP_BYTES } from './gzip';
