/** Engine version, written into every FitResult and export for provenance. */
export const ENGINE_VERSION = 'shiftmark-engine-0.2.1';

/** Identifies the template set in every result and export; bump it when src/core/templates changes (npm run templates). */
export const TEMPLATE_SET_ID = 'shiftmark-published-1';
