/** Public face of the redshift engine. */
export { fitSpectrum, refitNear, type FitOptions, DEFAULT_POLY_TERMS, SCAN_BINNING, QSO_SCAN_BINNING, CURVE_MAX_POINTS, REFIT_HALF_WIDTH_KMS } from './fitSpectrum';
export { TEMPLATE_SET_ID, FAMILY_IDS, templateFamilies, type TemplateFamily } from './templates';
export { ENGINE_VERSION } from './version';
export { DLOG10, KMS_PER_PIXEL, C_KMS, zOfShift, shiftOfZ, velocitySeparationKms } from './logGrid';
export { resampleToLogGrid, type LogSpectrum } from './resample';
export { confidenceScore, gradeOf } from './confidence';
export { measureLines } from './measureLines';
export { locateFeature, suggestLines } from './identify';
export { solutionModel } from './solutionModel';
