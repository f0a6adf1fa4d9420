/**
 * Cohen's kappa (Cohen 1960, Educational and Psychological Measurement 20,
 * 37): agreement of two raters on a nominal scale beyond what their own
 * class frequencies give by chance. kappa = (p_o - p_e) / (1 - p_e), with
 * p_o the share of items on the diagonal of the two raters' table and p_e
 * = sum_i (row_i / n)(column_i / n).
 */

export interface KappaResult {
  /** Items rated by both. */
  n: number;
  /** Observed agreement, 0..1. */
  observed: number;
  /** Agreement expected by chance from the margins, 0..1. */
  expected: number;
  /** NaN when undefined: no items, or both raters used one and the same class for everything (p_e = 1). */
  kappa: number;
}

/** kappa of a square table of counts: table[i][j] = items rater A put in class i and rater B in class j. */
export function cohenKappa(table: readonly (readonly number[])[]): KappaResult {
  const k = table.length;
  if (table.some((row) => row.length !== k)) throw new RangeError('the agreement table must be square');
  let n = 0;
  let diagonal = 0;
  const rows = new Array<number>(k).fill(0);
  const cols = new Array<number>(k).fill(0);
  for (let i = 0; i < k; i++)
    for (let j = 0; j < k; j++) {
      const c = table[i][j];
      if (!(Number.isFinite(c) && c >= 0)) throw new RangeError(`table cell [${i}][${j}] is not a count (${c})`);
      n += c;
      rows[i] += c;
      cols[j] += c;
      if (i === j) diagonal += c;
    }
  if (n === 0) return { n: 0, observed: NaN, expected: NaN, kappa: NaN };
  const observed = diagonal / n;
  let expected = 0;
  for (let i = 0; i < k; i++) expected += (rows[i] / n) * (cols[i] / n);
  const kappa = expected >= 1 ? NaN : (observed - expected) / (1 - expected);
  return { n, observed, expected, kappa };
}

/** The square table of two raters' labels (pairs in the same order), classes in the order given. */
export function confusionTable<C extends string>(pairs: readonly (readonly [C, C])[], classes: readonly C[]): number[][] {
  const at = new Map(classes.map((c, i) => [c, i]));
  const t = classes.map(() => classes.map(() => 0));
  for (const [a, b] of pairs) {
    const i = at.get(a);
    const j = at.get(b);
    if (i === undefined || j === undefined) throw new RangeError(`class ${i === undefined ? a : b} is not one of ${classes.join(', ')}`);
    t[i][j]++;
  }
  return t;
}
