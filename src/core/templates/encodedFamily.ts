import type { SpectrumClass } from '../types';
import type { EncodedVector } from './build/encode';

/** The stored form of a FamilyBasis (build/recipes.ts). */
export interface EncodedFamily {
  id: string;
  class: SpectrumClass;
  zMin: number;
  zMax: number;
  kStart: number;
  length: number;
  vectors: ({ id: string; nonNegative: boolean; eigen?: boolean } & EncodedVector)[];
  scan: { id: string; weights: Record<string, number> }[];
  sources: string[];
  heldFraction: number;
  polynomialFromA?: number;
  eigenDims?: number;
}
