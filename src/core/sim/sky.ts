/**
 * Night-sky lines and telluric bands as the simulator uses them (vacuum A).
 * Independent of the engine's own sky list in lines/catalogue.ts.
 */
import { createRng } from './prng';

export interface SkyLine {
  /** Vacuum wavelength, Angstrom. */
  vacA: number;
  /** Relative strength (the [O I] 5577 line = 1). */
  strength: number;
}

/**
 * Named sky lines (docs/reference.md sec. 7; values from memory there):
 * [O I] 5578.89, Na D 5891.58/5897.55, [O I] 6302.04/6365.54 (vacuum).
 */
const NAMED: SkyLine[] = [
  { vacA: 5578.89, strength: 1 },
  { vacA: 5891.58, strength: 0.35 },
  { vacA: 5897.55, strength: 0.25 },
  { vacA: 6302.04, strength: 0.45 },
  { vacA: 6365.54, strength: 0.15 },
];

/**
 * An OH-like forest redward of 6800 A: bands of lines (Meinel bands dominate the
 * red sky, Osterbrock et al. 1996, PASP 108, 277), here with invented but fixed
 * positions clustered in bands. Not a real line list.
 */
function ohLikeForest(): SkyLine[] {
  const r = createRng(0x5ca1ab1e);
  const bandCentres = [6880, 7300, 7780, 8000, 8400, 8850, 9150];
  const out: SkyLine[] = [];
  for (const c of bandCentres) {
    const m = 14 + r.int(0, 8);
    for (let k = 0; k < m; k++) {
      const vacA = c + r.uniform(-130, 130);
      if (vacA < 6800) continue;
      out.push({ vacA, strength: 0.1 + 1.4 * r.next() * r.next() * (vacA > 8000 ? 1.5 : 1) });
    }
  }
  return out.sort((a, b) => a.vacA - b.vacA);
}

export const SKY_LINES: readonly SkyLine[] = [...NAMED, ...ohLikeForest()].sort((a, b) => a.vacA - b.vacA);

/** Telluric absorption bands (vacuum A; docs/reference.md sec. 7, from memory) and a typical residual depth. */
export const TELLURIC_BANDS: readonly { label: string; fromA: number; toA: number; depth: number }[] = [
  { label: 'O2 B', fromA: 6862, toA: 6892, depth: 0.35 },
  { label: 'H2O', fromA: 7162, toA: 7342, depth: 0.15 },
  { label: 'O2 A', fromA: 7592, toA: 7702, depth: 0.6 },
  { label: 'H2O', fromA: 8132, toA: 8352, depth: 0.15 },
  { label: 'H2O', fromA: 8952, toA: 9800, depth: 0.25 },
];
