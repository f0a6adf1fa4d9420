/** Physical constants the project uses, each defined once. */

/** Speed of light in vacuum, km/s (exact by the SI definition of the metre). */
export const C_KMS = 299792.458;
