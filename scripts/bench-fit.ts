/**
 * Fitting speed, single-threaded: simulated spectra (src/core/sim, default
 * grid ~4,080 pixels; or n pixels when given) fitted one after another with
 * every family over its full redshift range.
 *
 *   npx tsx scripts/bench-fit.ts [count=1000] [seed=1]
 */
import { simulateBatch } from '../src/core/sim';
import { fitSpectrum, type FitOptions } from '../src/core/engine';

export interface BenchFitResult {
  count: number;
  seconds: number;
  spectraPerSecond: number;
  /** Process CPU time per spectrum, ms (includes garbage collection on helper threads; less sensitive than wall time to other load on a shared machine). */
  cpuMsPerSpectrum: number;
  peakRssMB: number;
  meanPixels: number;
}

/** Simulate `count` spectra, then time fitSpectrum over all of them (simulation not timed). */
export function benchFit(count = 1000, seed = 1, options: FitOptions = {}): BenchFitResult {
  const sims = simulateBatch(count, seed, { grid: { kind: 'log10', startA: 3600, endA: 10400, dLog10: 1e-4 } });
  let pixels = 0;
  for (const s of sims) pixels += s.spectrum.flux.length;
  // warm up the JIT and the template caches on a few spectra
  for (let i = 0; i < Math.min(5, sims.length); i++) fitSpectrum(sims[i].spectrum, options);
  let peak = process.memoryUsage().rss;
  const cpu0 = process.cpuUsage();
  const t0 = performance.now();
  for (let i = 0; i < sims.length; i++) {
    fitSpectrum(sims[i].spectrum, options);
    if (i % 50 === 0) peak = Math.max(peak, process.memoryUsage().rss);
  }
  const seconds = (performance.now() - t0) / 1000;
  const cpu = process.cpuUsage(cpu0);
  peak = Math.max(peak, process.memoryUsage().rss);
  const out = {
    count, seconds, spectraPerSecond: count / seconds, cpuMsPerSpectrum: (cpu.user + cpu.system) / 1000 / count, peakRssMB: peak / 2 ** 20, meanPixels: pixels / count,
  };
  console.log(
    `${count} spectra of ~${Math.round(out.meanPixels)} pixels in ${seconds.toFixed(2)} s: ` +
      `${out.spectraPerSecond.toFixed(1)} spectra/s single-threaded, ${out.cpuMsPerSpectrum.toFixed(1)} ms CPU each; peak RSS ${out.peakRssMB.toFixed(0)} MB`,
  );
  return out;
}

if (process.argv[1] && process.argv[1].endsWith('bench-fit.ts')) {
  benchFit(Number(process.argv[2] ?? 1000), Number(process.argv[3] ?? 1));
}
