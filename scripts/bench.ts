/**
 * npm run bench: every benchmark, printed (never asserted).
 *   reader throughput (demo set, real set), engine speed, headless fitter
 *   throughput and peak memory (1,000 spectra; add --big for 10,000 streamed),
 *   the start-up of one fitter task,
 *   and the browser figures (needs Chromium).
 */
import { benchRead } from './bench-read';
import { benchCli } from './bench-cli';
import { benchStartup } from './bench-startup';
import { benchFit } from './bench-fit';

const big = process.argv.includes('--big');
console.log('== reader throughput ==');
benchRead({ minSeconds: 1 });
console.log('\n== engine, one thread (fitSpectrum on 1,000 simulated spectra) ==');
benchFit(1000, 1);
console.log('\n== headless fitter ==');
benchCli({ n: 1000, big });
await benchStartup();
try {
  // Computed specifier: the browser bench is optional (needs Chromium and a build).
  const mod = './bench-browser.ts';
  const { benchBrowser } = (await import(mod)) as { benchBrowser: () => Promise<void> };
  console.log('\n== browser ==');
  await benchBrowser();
} catch (e) {
  console.log(`\n(browser benchmark not run: ${(e as Error).message})`);
}
