/** Engine version, written into every FitResult and export for provenance. */
export const ENGINE_VERSION = 'shiftmark-engine-0.1.0';

/** Identifies the template set in every result and export; bump it when templates.ts changes. */
export const TEMPLATE_SET_ID = 'shiftmark-templates-2';
