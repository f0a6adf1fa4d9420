/**
 * Eigenspectra of a set of spectra on one grid: the principal components of
 * the (uncentred) set, through the eigenvectors of its Gram matrix (the
 * "snapshot" form of PCA, Sirovich 1987, Q. Appl. Math. 45, 561; eigenspectra
 * for redshifts as in Glazebrook, Offer & Deeley 1998, ApJ 492, 98). A
 * non-negative mix of the inputs lies in their span, so K components that
 * hold almost all the variance stand in for the whole library at a fraction
 * of the cost.
 */
import { symmetricEigen } from '../../numeric/symmetricEigen';

export interface Eigenspectra {
  vectors: Float64Array[];
  /** Fraction of the total sum of squares each vector holds. */
  fractions: number[];
}

/** spectra: equal-length arrays (finite). Returns the first K unit-norm eigenspectra. */
export function eigenspectra(spectra: Float64Array[], K: number): Eigenspectra {
  const m = spectra.length;
  const n = spectra[0].length;
  const gram = new Float64Array(m * m);
  for (let i = 0; i < m; i++) {
    for (let j = 0; j <= i; j++) {
      let s = 0;
      const a = spectra[i];
      const b = spectra[j];
      for (let k = 0; k < n; k++) s += a[k] * b[k];
      gram[i * m + j] = s;
      gram[j * m + i] = s;
    }
  }
  const eig = symmetricEigen(gram, m);
  let total = 0;
  for (const v of eig.values) total += Math.max(0, v);
  const vectors: Float64Array[] = [];
  const fractions: number[] = [];
  for (let c = 0; c < Math.min(K, m); c++) {
    const coef = eig.vectors[c];
    const v = new Float64Array(n);
    for (let i = 0; i < m; i++) {
      const a = spectra[i];
      const w = coef[i];
      for (let k = 0; k < n; k++) v[k] += w * a[k];
    }
    let norm = 0;
    for (let k = 0; k < n; k++) norm += v[k] * v[k];
    norm = Math.sqrt(norm);
    // sign convention: positive mean, so the first vector looks like a spectrum
    let mean = 0;
    for (let k = 0; k < n; k++) mean += v[k];
    const s = (mean < 0 ? -1 : 1) / norm;
    for (let k = 0; k < n; k++) v[k] *= s;
    vectors.push(v);
    fractions.push(Math.max(0, eig.values[c]) / total);
  }
  return { vectors, fractions };
}
