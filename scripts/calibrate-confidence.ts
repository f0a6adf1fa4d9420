/**
 * Calibrate the machine confidence (src/core/engine/confidence.ts) on
 * simulated spectra: fit every spectrum of a seeded batch, record the inputs
 * of the score and whether the redshift is right (|dz|/(1+z) <= 0.01), fit the
 * logistic coefficients by iteratively reweighted least squares, and report
 * the wrong-redshift rate of each grade for the thresholds in confidence.ts.
 *
 *   npx tsx scripts/calibrate-confidence.ts [n=600] [seed=7]
 */
import { simulateBatch } from '../src/core/sim';
import { fitSpectrumDetailed } from '../src/core/engine/fitSpectrum';
import { confidenceFeatures, gradeOf, scoreFromFeatures } from '../src/core/engine/confidence';

export interface CalibrationRow {
  x: number[];
  right: boolean;
  cls: string;
  trueClass: string;
}

export function collectRows(n: number, seed: number): CalibrationRow[] {
  const rows: CalibrationRow[] = [];
  for (const sim of simulateBatch(n, seed)) {
    const { result: r, featureSnrs } = fitSpectrumDetailed(sim.spectrum, { measureLines: false });
    if (r.status !== 'ok') continue;
    const right = Math.abs(r.z - sim.truth.z) / (1 + sim.truth.z) <= 0.01;
    const best = r.candidates[0];
    rows.push({
      x: confidenceFeatures({ cls: r.class, chi2Gap: r.chi2Gap, nFeatures: r.nFeatures, featureSnrs, atEdge: best?.atEdge ?? false }),
      right,
      cls: r.class,
      trueClass: sim.truth.class,
    });
  }
  return rows;
}

/** Logistic regression by IRLS (Newton's method), with a small ridge for stability. */
export function fitLogistic(rows: CalibrationRow[], iterations = 30): number[] {
  const d = rows[0].x.length + 1;
  const beta = new Array(d).fill(0);
  for (let it = 0; it < iterations; it++) {
    const H = Array.from({ length: d }, () => new Array(d).fill(0));
    const g = new Array(d).fill(0);
    for (const r of rows) {
      const v = [1, ...r.x];
      const t = v.reduce((s, x, k) => s + x * beta[k], 0);
      const p = 1 / (1 + Math.exp(-t));
      const y = r.right ? 1 : 0;
      for (let a = 0; a < d; a++) {
        g[a] += (y - p) * v[a];
        for (let b = 0; b < d; b++) H[a][b] += p * (1 - p) * v[a] * v[b];
      }
    }
    for (let a = 0; a < d; a++) H[a][a] += 1e-3;
    // solve H delta = g (Gaussian elimination)
    const A = H.map((row, a) => [...row, g[a]]);
    for (let c = 0; c < d; c++) {
      let piv = c;
      for (let r = c + 1; r < d; r++) if (Math.abs(A[r][c]) > Math.abs(A[piv][c])) piv = r;
      [A[c], A[piv]] = [A[piv], A[c]];
      for (let r = 0; r < d; r++) {
        if (r === c) continue;
        const f = A[r][c] / A[c][c];
        for (let k = c; k <= d; k++) A[r][k] -= f * A[c][k];
      }
    }
    for (let a = 0; a < d; a++) beta[a] += A[a][d] / A[a][a];
  }
  return beta;
}

function main() {
  const n = Number(process.argv[2] ?? 600);
  const seed = Number(process.argv[3] ?? 7);
  const rows = collectRows(n, seed);
  const usable = rows.filter((r) => r.cls !== 'unknown');
  console.log(`${rows.length} fitted, ${usable.length} with a class; right: ${usable.filter((r) => r.right).length}`);
  console.log('logistic coefficients [B0, B_GAP, B_FEAT, B_SNR]:', fitLogistic(usable).map((b) => b.toFixed(3)).join(', '));
  const byGrade: Record<string, [number, number]> = {};
  for (const r of rows) {
    const g = r.cls === 'unknown' ? 'none' : gradeOf(scoreFromFeatures(r.x), r.x);
    const e = (byGrade[g] ??= [0, 0]);
    e[0]++;
    if (!r.right) e[1]++;
  }
  for (const [g, [k, wrong]] of Object.entries(byGrade)) console.log(`${g}: ${k} spectra, ${wrong} wrong (${((100 * wrong) / k).toFixed(2)}%)`);
}

if (process.argv[1] && process.argv[1].endsWith('calibrate-confidence.ts')) main();
