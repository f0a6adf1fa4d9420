/** Public face of the redshift engine. */
export { fitSpectrum, fitSpectrumDetailed, refitNear, engineFamilies, type FitOptions, DEFAULT_POLY_TERMS, CURVE_MAX_POINTS, REFIT_HALF_WIDTH_KMS } from './fitSpectrum';
export { SCAN_BINNING } from './prepare';
export { FitWorkspace } from './workspace';
export { TEMPLATE_SET_ID, ENGINE_VERSION } from './version';
export { DLOG10, KMS_PER_PIXEL, C_KMS, zOfShift, shiftOfZ, velocitySeparationKms } from './logGrid';
export { resampleToLogGrid, type LogSpectrum } from './resample';
export { confidenceScore, gradeOf } from './confidence';
export { measureLines } from './measureLines';
export { locateFeature, suggestLines } from './identify';
export { solutionModel, FORMER_FAMILY_IDS } from './solutionModel';

/** Family ids in a stable order. */
export const FAMILY_IDS = ['qso', 'galaxy', 'star'] as const;
