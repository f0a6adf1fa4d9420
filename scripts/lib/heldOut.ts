/**
 * Simulations from published templates held out of the fit: each simulated
 * spectrum comes from one published rest-frame spectrum, and is fitted with
 * families rebuilt without that spectrum (so the engine never saw it).
 * Quasar composites not used by the families at all (Harris, Glikman,
 * Banados) are held out by construction.
 */
import { buildAllFamilies } from '../../src/core/templates/build/buildAll';
import { KC_OFFSETS_A } from '../../src/core/templates/build/recipes';
import type { TemplateTable } from '../../src/core/templates/build/readTemplateCsv';
import { familyFromBasis, type Family } from '../../src/core/engine/family';
import { HELD_OUT_LAYOUTS, observeTemplate } from '../../src/core/sim/fromTemplate';
import { createRng, mixSeed } from '../../src/core/sim/prng';
import type { Spectrum, SpectrumClass } from '../../src/core/types';
import { readPublished } from './readPublished';

export interface HeldOutCase {
  source: string;
  trueClass: SpectrumClass;
  z: number;
  snr: number;
  spectrum: Spectrum;
  families: Family[];
}

/** Redshift ranges per source where the table covers most of an optical spectrum. */
function zRange(name: string): [number, number] {
  if (name.startsWith('harris')) return [2.1, 3.4];
  if (name.startsWith('glikman')) return [0.3, 1.0];
  if (name.startsWith('banados')) return [5.6, 6.2];
  if (name.startsWith('vandenberk')) return [0.4, 3.2];
  if (name.startsWith('selsing')) return [0.2, 2.5];
  if (name.startsWith('pickles')) return [-0.001, 0.001];
  return [0.02, 0.9];
}

export function heldOutCases(n: number, seed: number): HeldOutCase[] {
  const tables = readPublished();
  const qso = tables.filter((t) => /^(harris|glikman|banados|vandenberk|selsing)/.test(t.name));
  // BC03 at age 0 is a bare hot-star continuum with no feature to measure: not a galaxy one could redshift.
  const gal = tables.filter((t) => /^(kc96|bc03)/.test(t.name) && !t.name.includes('_0yr'));
  const star = tables.filter((t) => t.name.startsWith('pickles'));
  const cache = new Map<string, Family[]>();
  const familiesWithout = (t: TemplateTable) => {
    let f = cache.get(t.name);
    if (!f) {
      f = buildAllFamilies(tables, new Set([t.name])).map(familyFromBasis);
      cache.set(t.name, f);
    }
    return f;
  };
  const out: HeldOutCase[] = [];
  for (let i = 0; i < n; i++) {
    const rng = createRng(mixSeed(seed, i));
    const u = rng.next();
    const [cls, pool]: [SpectrumClass, TemplateTable[]] = u < 0.36 ? ['qso', qso] : u < 0.7 ? ['galaxy', gal] : ['star', star];
    const t = rng.pick(pool);
    const [z0, z1] = zRange(t.name);
    const z = rng.uniform(z0, z1);
    const snr = rng.logUniform(3, 30);
    const layout = rng.pick(HELD_OUT_LAYOUTS);
    const spectrum = observeTemplate({ restWavelengthA: t.wavelengthA, restFlux: t.flux, z, snr, layout, file: `heldout-${i}-${t.name}` }, rng);
    // Kinney-Calzetti tables carry their own zero points (KC_OFFSETS_A): the redshift their features show is the truth
    const off = KC_OFFSETS_A[t.name] ?? 0;
    const zTrue = (1 + z) * (1 + off / 5000) - 1;
    out.push({ source: t.name, trueClass: cls, z: zTrue, snr, spectrum, families: familiesWithout(t) });
  }
  return out;
}
