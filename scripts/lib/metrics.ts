/** Summary statistics for the engine evaluation (npm run evaluate). */
import type { FitResult, Grade, SpectrumClass } from '../../src/core/types';

export const C_KMS = 299792.458;
/** |dz|/(1+z) below this counts as correct, above CATASTROPHIC as a catastrophic failure (issue targets). */
export const CORRECT = 0.003;
export const CATASTROPHIC = 0.01;

export interface Outcome {
  trueClass: SpectrumClass;
  trueZ: number;
  snr: number;
  fit: FitResult;
}

export function dzNorm(o: Outcome): number {
  return (o.fit.z - o.trueZ) / (1 + o.trueZ);
}

import { median } from '../../src/core/numeric/median';

export { median };

/** Normalised median absolute deviation: 1.4826 median|x - median x| (equals sigma for a Gaussian; common practice). */
export function nmad(xs: readonly number[]): number {
  const m = median(xs);
  return 1.4826 * median(xs.map((x) => Math.abs(x - m)));
}

export interface Tally {
  n: number;
  correct: number;
  catastrophic: number;
  classRight: number;
}

export function tally(os: readonly Outcome[]): Tally {
  let correct = 0;
  let catastrophic = 0;
  let classRight = 0;
  for (const o of os) {
    const d = Math.abs(dzNorm(o));
    if (o.fit.status === 'ok' && d < CORRECT) correct++;
    if (o.fit.status !== 'ok' || !(d <= CATASTROPHIC)) catastrophic++;
    if (o.fit.class === o.trueClass) classRight++;
  }
  return { n: os.length, correct, catastrophic, classRight };
}

export function pct(a: number, n: number): string {
  return n ? `${((100 * a) / n).toFixed(1)}%` : '-';
}

export function formatTally(label: string, t: Tally): string {
  return `${label.padEnd(22)} n=${String(t.n).padStart(5)}  correct ${pct(t.correct, t.n).padStart(6)}  catastrophic ${pct(t.catastrophic, t.n).padStart(6)}  class right ${pct(t.classRight, t.n).padStart(6)}`;
}

export const GRADES: readonly Grade[] = ['high', 'medium', 'low', 'none'];
export const CLASSES: readonly SpectrumClass[] = ['qso', 'galaxy', 'star', 'unknown'];

/** Lines of a report for one set of outcomes. */
export function report(os: readonly Outcome[], snrBins: readonly [number, number][]): string[] {
  const lines: string[] = [];
  lines.push(formatTally('all', tally(os)));
  for (const c of CLASSES) {
    const sub = os.filter((o) => o.trueClass === c);
    if (sub.length) lines.push(formatTally(`class ${c}`, tally(sub)));
  }
  for (const [lo, hi] of snrBins) {
    const sub = os.filter((o) => o.snr >= lo && o.snr < hi);
    if (sub.length) lines.push(formatTally(`S/N ${lo}-${hi}`, tally(sub)));
  }
  lines.push('NMAD of dz/(1+z), non-catastrophic, km/s:');
  for (const c of CLASSES) {
    const d = os.filter((o) => o.trueClass === c && o.fit.status === 'ok' && Math.abs(dzNorm(o)) <= CATASTROPHIC).map(dzNorm);
    if (d.length) lines.push(`  ${c.padEnd(8)} ${(nmad(d) * C_KMS).toFixed(1)} km/s (n=${d.length}), median offset ${(median(d) * C_KMS).toFixed(1)} km/s`);
  }
  lines.push('class confusion (rows: truth, columns: fitted):');
  lines.push(`  ${''.padEnd(8)}${CLASSES.map((c) => c.padStart(9)).join('')}`);
  for (const t of CLASSES) {
    const sub = os.filter((o) => o.trueClass === t);
    if (sub.length) lines.push(`  ${t.padEnd(8)}${CLASSES.map((c) => String(sub.filter((o) => o.fit.class === c).length).padStart(9)).join('')}`);
  }
  lines.push('catastrophic rate per machine grade:');
  for (const g of GRADES) {
    const sub = os.filter((o) => o.fit.confidence === g);
    lines.push(`  ${g.padEnd(7)} ${pct(tally(sub).catastrophic, sub.length).padStart(6)} of ${sub.length}`);
  }
  const pulls = os
    .filter((o) => o.fit.status === 'ok' && Math.abs(dzNorm(o)) <= CATASTROPHIC && o.fit.zErr > 0)
    .map((o) => Math.abs(o.fit.z - o.trueZ) / o.fit.zErr);
  lines.push(`median |dz|/z_err (non-catastrophic): ${median(pulls).toFixed(3)} (Gaussian errors give 0.674)`);
  return lines;
}
