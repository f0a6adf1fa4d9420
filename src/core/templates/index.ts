/**
 * The template families the engine fits, decoded once from the generated
 * basisData.ts (built by scripts/build-templates.ts from the published
 * spectra in ./published). Immutable after the first call.
 */
import { ENCODED_FAMILIES } from './basisData';
import { decodeVector } from './build/encode';
import type { FamilyBasis } from './build/recipes';
import type { EncodedFamily } from './encodedFamily';

export type { FamilyBasis, BasisVectorData } from './build/recipes';
export { STAR_VMAX_KMS, GALAXY_Z_MIN } from './build/recipes';

export function decodeFamily(e: EncodedFamily): FamilyBasis {
  return {
    id: e.id,
    class: e.class,
    zMin: e.zMin,
    zMax: e.zMax,
    kStart: e.kStart,
    vectors: e.vectors.map((v) => ({ id: v.id, nonNegative: v.nonNegative, eigen: v.eigen, values: decodeVector(v, e.length) })),
    scan: e.scan,
    sources: e.sources,
    heldFraction: e.heldFraction,
    polynomialFromA: e.polynomialFromA,
    eigenDims: e.eigenDims,
  };
}

let decoded: readonly FamilyBasis[] | null = null;

/** The published-template families (qso, galaxy, star). */
export function publishedFamilies(): readonly FamilyBasis[] {
  decoded ??= ENCODED_FAMILIES.map(decodeFamily);
  return decoded;
}
