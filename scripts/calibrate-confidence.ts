/**
 * Calibrate the machine confidence (src/core/engine/confidence.ts) on the
 * three sources of scripts/lib/sources.ts: fit every spectrum, record the
 * score's inputs and whether z is right (|dz|/(1+z) < 0.003), fit the
 * logistic coefficients by iteratively reweighted least squares, and check
 * them by 5-fold cross-validation: out-of-fold reliability per source, and
 * the rate of wrong (> 0.01) 'high' grades per source for candidate
 * thresholds. Prints the coefficients to copy into confidence.ts.
 *
 *   npx tsx scripts/calibrate-confidence.ts [--sim 600] [--held 400] [--seed 11]
 */
import { writeFileSync, mkdirSync } from 'node:fs';
import { confidenceFeatures, confidenceInputOf, FEATURE_NAMES } from '../src/core/engine/confidence';
import { choleskySolve } from '../src/core/numeric/cholesky';
import { heldOutItems, realItems, simulatorItems, type EvalItem, type SourceId } from './lib/sources';

const arg = (name: string, dflt: number) => {
  const k = process.argv.indexOf(`--${name}`);
  return k > 0 ? Number(process.argv[k + 1]) : dflt;
};
const seed = arg('seed', 11);

interface Row {
  source: SourceId;
  x: number[];
  right: boolean;
  wrong: boolean;
  usable: boolean;
  cls: string;
  /** |dz| and z_err in km/s ((1+z) c units). */
  dzKms: number;
  errKms: number;
}

function rowOf(it: EvalItem): Row {
  const r = it.detail.result;
  const d = Math.abs(r.z - it.trueZ) / (1 + it.trueZ);
  const inp = confidenceInputOf(r, it.detail.featureSnrs);
  const c = 299792.458 / (1 + it.trueZ);
  return {
    source: it.source, x: confidenceFeatures(inp), right: r.status === 'ok' && d < 0.003, wrong: !(d <= 0.01), usable: r.status === 'ok' && r.class !== 'unknown',
    cls: r.class === it.trueClass ? r.class : 'mixed', dzKms: Math.abs(r.z - it.trueZ) * c, errKms: r.zErr * c,
  };
}

const t0 = performance.now();
const items = [...simulatorItems(arg('sim', 600), seed, { measureLines: true }), ...heldOutItems(arg('held', 400), seed), ...realItems()];
console.log(`fitted ${items.length} spectra in ${((performance.now() - t0) / 1000).toFixed(0)} s`);
const rows = items.map(rowOf).filter((r) => r.usable);
mkdirSync('test-artifacts', { recursive: true });
writeFileSync('test-artifacts/calibration-rows.json', JSON.stringify(rows));

/** Logistic regression by IRLS with a small ridge (intercept unpenalised). */
function fitLogistic(rs: Row[], ridge = 1e-2): number[] {
  const p = rs[0].x.length + 1;
  let b = new Array(p).fill(0);
  for (let it = 0; it < 50; it++) {
    const H = Array.from({ length: p }, () => new Array(p).fill(0));
    const g = new Array(p).fill(0);
    for (const r of rs) {
      const xi = [1, ...r.x];
      const eta = xi.reduce((s, v, k) => s + v * b[k], 0);
      const mu = 1 / (1 + Math.exp(-eta));
      const w = Math.max(1e-9, mu * (1 - mu));
      for (let a = 0; a < p; a++) {
        g[a] += xi[a] * ((r.right ? 1 : 0) - mu);
        for (let c = 0; c < p; c++) H[a][c] += w * xi[a] * xi[c];
      }
    }
    for (let a = 1; a < p; a++) {
      H[a][a] += ridge;
      g[a] -= ridge * b[a];
    }
    const step = solve(H, g);
    b = b.map((v, k) => v + step[k]);
    if (Math.max(...step.map(Math.abs)) < 1e-8) break;
  }
  return b;
}

/** The Newton step H x = g (H is the logistic Hessian plus ridge: symmetric positive definite) with the project's Cholesky. */
function solve(A: number[][], y: number[]): number[] {
  const n = y.length;
  const x = new Float64Array(n);
  choleskySolve(Float64Array.from(A.flat()), Float64Array.from(y), n, x, new Float64Array(n * n), new Int32Array(n));
  return Array.from(x);
}

const score = (b: number[], x: number[]) => 1 / (1 + Math.exp(-(b[0] + x.reduce((s, v, k) => s + v * b[k + 1], 0))));

// 5-fold cross-validation, folds interleaved within each source
const oof = new Array(rows.length).fill(NaN);
for (let f = 0; f < 5; f++) {
  const train = rows.filter((_, i) => i % 5 !== f);
  const b = fitLogistic(train);
  rows.forEach((r, i) => {
    if (i % 5 === f) oof[i] = score(b, r.x);
  });
}
const sources: SourceId[] = ['simulator', 'held-out', 'real'];
console.log('\nout-of-fold reliability (score bin: mean score / fraction right, n)');
for (const s of sources) {
  const idx = rows.map((r, i) => i).filter((i) => rows[i].source === s);
  const bins = [0, 0.2, 0.4, 0.6, 0.8, 0.9, 0.95, 1.0001];
  const parts: string[] = [];
  for (let k = 0; k + 1 < bins.length; k++) {
    const inBin = idx.filter((i) => oof[i] >= bins[k] && oof[i] < bins[k + 1]);
    if (!inBin.length) continue;
    const ms = inBin.reduce((a, i) => a + oof[i], 0) / inBin.length;
    const fr = inBin.filter((i) => rows[i].right).length / inBin.length;
    parts.push(`[${bins[k]}-${Math.min(1, bins[k + 1])}] ${ms.toFixed(2)}/${fr.toFixed(2)} n=${inBin.length}`);
  }
  console.log(`  ${s.padEnd(10)} ${parts.join('  ')}`);
}
console.log('\nout-of-fold wrong (> 0.01) rate of a high grade at threshold t (needs 2 features):');
for (const t of [0.9, 0.93, 0.95, 0.97, 0.98, 0.99]) {
  const parts = sources.map((s) => {
    const hi = rows.map((r, i) => i).filter((i) => rows[i].source === s && oof[i] >= t && rows[i].x[1] >= 2);
    const w = hi.filter((i) => rows[i].wrong).length;
    return `${s} ${w}/${hi.length} (${((100 * w) / Math.max(1, hi.length)).toFixed(1)}%)`;
  });
  console.log(`  t=${t}: ${parts.join('   ')}`);
}
const b = fitLogistic(rows);
console.log(`\ncoefficients on all ${rows.length} rows [intercept, ${FEATURE_NAMES.join(', ')}]:`);
console.log(`  [${b.map((v) => v.toFixed(3)).join(', ')}]`);

// z-error floors: per class, the velocity added in quadrature that brings the pooled median
// of |dz| / z_err to 0.674 (Gaussian) over right-class, correct redshifts; then per source
const med = (a: number[]) => [...a].sort((p, q) => p - q)[a.length >> 1];
console.log('\nz error floors (km/s) for a median |dz|/z_err of 0.674, and the medians per source after:');
for (const cls of ['qso', 'galaxy', 'star']) {
  const rs = rows.filter((r) => r.cls === cls && r.right && r.errKms > 0);
  let lo = 0;
  let hi = 2000;
  for (let it = 0; it < 60; it++) {
    const f = (lo + hi) / 2;
    if (med(rs.map((r) => r.dzKms / Math.hypot(r.errKms, f))) > 0.674) lo = f;
    else hi = f;
  }
  const f = (lo + hi) / 2;
  const per = sources.map((src) => {
    const q = rs.filter((r) => r.source === src);
    return `${src} ${q.length ? med(q.map((r) => r.dzKms / r.errKms)).toFixed(2) : '-'} -> ${q.length ? med(q.map((r) => r.dzKms / Math.hypot(r.errKms, f))).toFixed(2) : '-'}`;
  });
  console.log(`  ${cls}: floor ${f.toFixed(1)} km/s (n=${rs.length}); ${per.join('; ')}`);
}
