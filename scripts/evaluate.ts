/**
 * npm run evaluate [-- --sim 1000 --held 400 --seed 7]: the engine on three
 * sources side by side (scripts/lib/sources.ts): the project's own
 * simulator (an upper bound: same hands as the engine), simulations from
 * published templates held out of the families, and the real survey spectra
 * in test/data/real-spectra. Per source: correct / catastrophic fractions by
 * class, class confusion, NMAD, the wrong rate of each grade, the
 * reliability of the score, and the error pulls.
 */
import { heldOutItems, realItems, simulatorItems, type EvalItem } from './lib/sources';
import { C_KMS, dzNorm, report, type Outcome } from './lib/metrics';

const arg = (name: string, dflt: number) => {
  const k = process.argv.indexOf(`--${name}`);
  return k > 0 ? Number(process.argv[k + 1]) : dflt;
};
const seed = arg('seed', 7);

const outcome = (it: EvalItem): Outcome => ({ trueClass: it.trueClass, trueZ: it.trueZ, snr: it.snr, fit: it.detail.result });

function reliability(items: EvalItem[]): string[] {
  const bins = [0, 0.2, 0.4, 0.6, 0.8, 0.9, 0.95, 1.0001];
  const out = ['score reliability (bin: mean score, fraction right |dz|/(1+z) < 0.003, n):'];
  for (let k = 0; k + 1 < bins.length; k++) {
    const b = items.filter((i) => i.detail.result.status === 'ok' && i.detail.result.score >= bins[k] && i.detail.result.score < bins[k + 1]);
    if (!b.length) continue;
    const ms = b.reduce((a, i) => a + i.detail.result.score, 0) / b.length;
    const fr = b.filter((i) => Math.abs(dzNorm(outcome(i))) < 0.003).length / b.length;
    out.push(`  ${bins[k].toFixed(2)}-${Math.min(1, bins[k + 1]).toFixed(2)}: ${ms.toFixed(2)} ${fr.toFixed(2)} n=${b.length}`);
  }
  return out;
}

function section(title: string, items: EvalItem[], secs: number, snrBins: [number, number][]): void {
  console.log(`\n== ${title}: ${items.length} spectra (${(items.length / secs).toFixed(1)} spectra/s single-threaded, making included) ==`);
  const os = items.map(outcome);
  for (const l of report(os, snrBins)) console.log(l);
  const hi = os.filter((o) => o.snr >= 3);
  if (snrBins.length && hi.length < os.length) {
    console.log('-- S/N >= 3 --');
    for (const l of report(hi, []).slice(0, 5)) console.log(l);
  }
  for (const l of reliability(items)) console.log(l);
  const misses = items.filter((i) => !(Math.abs(dzNorm(outcome(i))) < 0.003) || i.detail.result.class !== i.trueClass);
  if (misses.length <= 12) {
    console.log('disagreements:');
    for (const m of misses) {
      const r = m.detail.result;
      console.log(`  ${m.name} (${m.trueClass} z=${m.trueZ.toFixed(4)}): got ${r.class} z=${r.z.toFixed(4)} (${(dzNorm(outcome(m)) * C_KMS).toFixed(0)} km/s) grade ${r.confidence}`);
    }
  }
}

function timed(make: () => EvalItem[]): [EvalItem[], number] {
  const t0 = performance.now();
  const items = make();
  return [items, (performance.now() - t0) / 1000];
}

const [sim, tSim] = timed(() => simulatorItems(arg('sim', 1000), seed));
section(`Project simulator (seed ${seed}; S/N 1.5-30, quasars to z 5.5)`, sim, tSim, [[1.5, 3], [3, 5], [5, 10], [10, 31]]);
const [held, tHeld] = timed(() => heldOutItems(arg('held', 400), seed));
section(`Held-out published templates (seed ${seed}; S/N 3-30, four pixel layouts)`, held, tHeld, [[3, 5], [5, 10], [10, 31]]);
const [real, tReal] = timed(() => realItems());
section('Real survey spectra (test/data/real-spectra; survey redshifts as truth)', real, tReal, []);
