/** Medians and robust scatter: the one implementation the project uses. */

/** Median of a[0..n) (reorders a): Hoare's selection (Hoare 1961, CACM 4, 321), the same value sorting gives. */
export function medianInPlace(a: Float64Array, n = a.length): number {
  if (n === 0) return NaN;
  const m = n >> 1;
  const hiVal = select(a, 0, n - 1, m);
  if (n % 2) return hiVal;
  // the lower middle is the largest value left of m after selection
  let loVal = -Infinity;
  for (let i = 0; i < m; i++) if (a[i] > loVal) loVal = a[i];
  return 0.5 * (loVal + hiVal);
}

/** Median of the finite values of a (a is not modified). */
export function median(a: ArrayLike<number>): number {
  const b = new Float64Array(a.length);
  let n = 0;
  for (let i = 0; i < a.length; i++) if (Number.isFinite(a[i])) b[n++] = a[i];
  return medianInPlace(b, n);
}

/** Normalised median absolute deviation, 1.4826 MAD (a Gaussian sigma; common practice). */
export function nmad(a: ArrayLike<number>): number {
  const m = median(a);
  const d = new Float64Array(a.length);
  let n = 0;
  for (let i = 0; i < a.length; i++) if (Number.isFinite(a[i])) d[n++] = Math.abs(a[i] - m);
  return 1.4826 * medianInPlace(d, n);
}

/** k-th smallest of a[l..r] (0-based k), leaving smaller values left of k and larger right. */
function select(a: Float64Array, l: number, r: number, k: number): number {
  while (r > l) {
    const mid = (l + r) >> 1;
    if (a[mid] < a[l]) swap(a, mid, l);
    if (a[r] < a[l]) swap(a, r, l);
    if (a[r] < a[mid]) swap(a, r, mid);
    const pivot = a[mid];
    let i = l;
    let j = r;
    while (i <= j) {
      while (a[i] < pivot) i++;
      while (a[j] > pivot) j--;
      if (i <= j) {
        swap(a, i, j);
        i++;
        j--;
      }
    }
    if (k <= j) r = j;
    else if (k >= i) l = i;
    else return a[k];
  }
  return a[k];
}

function swap(a: Float64Array, i: number, j: number): void {
  const t = a[i];
  a[i] = a[j];
  a[j] = t;
}
