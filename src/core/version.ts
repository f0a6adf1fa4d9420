/** Software version written into every export; test/core/version.test.ts keeps it equal to package.json. */
export const SOFTWARE_VERSION = '0.1.0';
export const SOFTWARE_NAME = 'Shiftmark';
