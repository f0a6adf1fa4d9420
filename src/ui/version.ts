/** Software name and version written into every export (one source: src/core/version.ts). */
import { SOFTWARE_NAME, SOFTWARE_VERSION } from '../core/version';

export { SOFTWARE_VERSION };
export const SOFTWARE_NAME_VERSION = `${SOFTWARE_NAME} ${SOFTWARE_VERSION}`;
