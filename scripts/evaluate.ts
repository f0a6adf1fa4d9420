/**
 * npm run evaluate [-- --n 1000 --seed 7]: the engine on (a) spectra from the
 * project's own simulator and (b) the real survey spectra in
 * test/data/real-spectra/, with correct / catastrophic fractions by class and
 * S/N, NMAD, class confusion, catastrophic rate per grade and error pulls.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { simulateBatchItem } from '../src/core/sim';
import { fitSpectrum } from '../src/core/engine';
import { readSpectrum } from '../src/core/io';
import type { SpectrumClass } from '../src/core/types';
import { C_KMS, dzNorm, report, type Outcome } from './lib/metrics';

const arg = (name: string, dflt: number) => {
  const k = process.argv.indexOf(`--${name}`);
  return k > 0 ? Number(process.argv[k + 1]) : dflt;
};
const n = arg('n', 1000);
const seed = arg('seed', 7);

const simClass = (c: string): SpectrumClass => (c === 'qso' ? 'qso' : c === 'star' ? 'star' : 'galaxy');

console.log(`Simulated set: ${n} spectra, seed ${seed}, S/N 1.5-30, all classes (quasars to z 5.5)`);
const t0 = performance.now();
const sim: Outcome[] = [];
for (let i = 0; i < n; i++) {
  // One at a time so memory stays small; object i is the same whatever n is.
  const s = simulateBatchItem(i, seed);
  sim.push({ trueClass: simClass(s.truth.class), trueZ: s.truth.z, snr: s.truth.snr, fit: fitSpectrum(s.spectrum) });
}
const secs = (performance.now() - t0) / 1000;
console.log(`(fitted in ${secs.toFixed(1)} s, ${(n / secs).toFixed(1)} spectra/s single-threaded, simulation included)`);
const bins: [number, number][] = [[1.5, 3], [3, 5], [5, 10], [10, 31]];
console.log('\n-- all S/N --');
for (const l of report(sim, bins)) console.log(l);
console.log('\n-- S/N >= 3 --');
for (const l of report(sim.filter((o) => o.snr >= 3), [])) console.log(l);

const dir = join(import.meta.dirname, '..', 'test', 'data', 'real-spectra');
const manifest = readFileSync(join(dir, 'MANIFEST.tsv'), 'utf8').trim().split(/\r?\n/).slice(1).map((l) => l.split('\t'));
const real: Outcome[] = [];
const misses: string[] = [];
for (const [name, survey, cls, zTrue] of manifest) {
  const file = join(dir, 'csv', `${name}.csv`);
  const fit = fitSpectrum(readSpectrum(new Uint8Array(readFileSync(file)), `${name}.csv`));
  const o: Outcome = { trueClass: cls as SpectrumClass, trueZ: Number(zTrue), snr: NaN, fit };
  real.push(o);
  const d = dzNorm(o);
  if (!(Math.abs(d) < 0.003) || fit.class !== cls) {
    misses.push(`  ${name} (${survey}, ${cls} z=${zTrue}): got ${fit.class} z=${fit.z.toFixed(4)} (${(d * C_KMS).toFixed(0)} km/s) grade ${fit.confidence}`);
  }
}
console.log(`\nReal set: ${real.length} survey spectra (test/data/real-spectra; survey redshifts as truth)`);
for (const l of report(real, [])) console.log(l);
console.log('disagreements (|dz|/(1+z) >= 0.003 or class differs):');
for (const m of misses) console.log(m);
