/**
 * A template family as the engine uses it: vectors on the fine log grid, the
 * scan's few combinations of them, and which amplitudes must stay >= 0.
 * Built from the published-template bases (src/core/templates).
 */
import type { SpectrumClass } from '../types';
import type { FamilyBasis } from '../templates';

export interface Family {
  id: string;
  class: SpectrumClass;
  zMin: number;
  zMax: number;
  /** Absolute fine-grid pixel of element 0 of every vector. */
  kStart: number;
  vectorIds: string[];
  vectors: Float64Array[];
  nonNegative: boolean[];
  /** The fast scan's vectors (combinations of `vectors`). */
  scanVectors: Float64Array[];
  scanNonNegative: boolean[];
  /** The continuum polynomial of the full model acts only at rest wavelengths >= this, Angstrom (none: everywhere). */
  polynomialFromA?: number;
  /** Which vectors are eigenspectra, and the library's effective dimension (classify.ts). */
  eigen: boolean[];
  eigenDims: number;
}

export function familyFromBasis(b: FamilyBasis): Family {
  const n = b.vectors[0].values.length;
  const byId = new Map(b.vectors.map((v) => [v.id, v]));
  const scanVectors = b.scan.map((s) => {
    const out = new Float64Array(n);
    for (const [id, w] of Object.entries(s.weights)) {
      const v = byId.get(id);
      if (!v) throw new Error(`family ${b.id}: scan vector ${s.id} names unknown vector ${id}`);
      for (let j = 0; j < n; j++) out[j] += w * v.values[j];
    }
    return out;
  });
  return {
    id: b.id,
    class: b.class,
    zMin: b.zMin,
    zMax: b.zMax,
    kStart: b.kStart,
    vectorIds: b.vectors.map((v) => v.id),
    vectors: b.vectors.map((v) => v.values),
    nonNegative: b.vectors.map((v) => v.nonNegative),
    scanVectors,
    scanNonNegative: b.scan.map((s) => Object.keys(s.weights).every((id) => byId.get(id)!.nonNegative)),
    polynomialFromA: b.polynomialFromA,
    eigen: b.vectors.map((v) => v.eigen === true),
    eigenDims: b.eigenDims ?? 0,
  };
}

/** Vectors averaged over `factor` fine pixels on absolute indices (binned pixel K = fine pixels factor*K .. factor*K + factor - 1, as binLogSpectrum). */
export function binVectors(vectors: Float64Array[], kStart: number, factor: number): { kStart: number; vectors: Float64Array[] } {
  if (factor === 1) return { kStart, vectors };
  const K0 = Math.floor(kStart / factor);
  const K1 = Math.floor((kStart + vectors[0].length - 1) / factor);
  return {
    kStart: K0,
    vectors: vectors.map((v) => {
      const out = new Float64Array(K1 - K0 + 1);
      for (let j = 0; j < v.length; j++) out[Math.floor((kStart + j) / factor) - K0] += v[j] / factor;
      return out;
    }),
  };
}
