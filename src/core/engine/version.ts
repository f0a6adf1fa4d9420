/** Engine version, written into every FitResult and export for provenance. */
export const ENGINE_VERSION = 'shiftmark-engine-0.1.0';
