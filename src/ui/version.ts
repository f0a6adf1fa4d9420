/** Software name and version written into every export (kept in step with package.json by hand). */
export const SOFTWARE_VERSION = '0.1.0';
export const SOFTWARE_NAME_VERSION = `Shiftmark ${SOFTWARE_VERSION}`;
