import type { CosmologyParams } from '../types';

/**
 * Default model: flat, H0 = 70 km/s/Mpc, Omega_m = 0.3, Omega_Lambda = 0.7, no
 * radiation. A round-number convention common in extragalactic papers, not a
 * measurement; every export states the model it used.
 */
export const DEFAULT_COSMOLOGY: Readonly<CosmologyParams> = Object.freeze({ h0: 70, omegaM: 0.3, omegaK: 0, omegaR: 0 });

/** Dark-energy density today: Omega_Lambda = 1 - Omega_m - Omega_k - Omega_r. */
export function omegaLambda(p: CosmologyParams): number {
  return 1 - p.omegaM - p.omegaK - p.omegaR;
}

/**
 * (a^2 E)^2 as a polynomial in the scale factor a = 1/(1+z):
 * Or + Om a + Ok a^2 + OL a^4 (Hogg 1999, astro-ph/9905116, eq. 14, times a^4).
 * It equals 1 at a = 1 by construction and must stay positive on (0, 1].
 */
export function expansionPolynomial(p: CosmologyParams, a: number): number {
  const a2 = a * a;
  return p.omegaR + p.omegaM * a + p.omegaK * a2 + omegaLambda(p) * a2 * a2;
}

/**
 * Throw a RangeError unless the model is physical for every z >= 0: H0 > 0,
 * Omega_m >= 0, Omega_r >= 0, E(z)^2 > 0 for all z >= 0 (no bounce in the past)
 * and a finite age (a big bang). Checked once per call of each public function.
 */
export function checkCosmology(p: CosmologyParams): void {
  const { h0, omegaM, omegaK, omegaR } = p;
  if (!Number.isFinite(h0) || h0 <= 0) throw new RangeError(`H0 must be a positive number of km/s/Mpc, got ${h0}`);
  if (!Number.isFinite(omegaM) || omegaM < 0) throw new RangeError(`Omega_m must be a finite number >= 0, got ${omegaM}`);
  if (!Number.isFinite(omegaR) || omegaR < 0) throw new RangeError(`Omega_r must be a finite number >= 0, got ${omegaR}`);
  if (!Number.isFinite(omegaK)) throw new RangeError(`Omega_k must be a finite number, got ${omegaK}`);
  const oL = omegaLambda(p);
  // Near a = 0 the lowest-order term of the polynomial decides whether the
  // expansion started from a = 0 in finite time.
  if (omegaR === 0 && omegaM === 0 && omegaK <= 0) {
    throw new RangeError(`no big bang: with Omega_m = Omega_r = 0 and Omega_k = ${omegaK} <= 0 the model has no finite age`);
  }
  if (omegaK >= 0 && oL >= 0) return; // every term non-negative and the leading one positive
  const aBad = firstNonPositive(p);
  if (aBad !== null) {
    const z = 1 / aBad - 1;
    throw new RangeError(
      `no big bang: E(z)^2 <= 0 near z = ${z.toPrecision(4)} for Omega_m = ${omegaM}, Omega_k = ${omegaK}, ` +
        `Omega_r = ${omegaR}, Omega_Lambda = ${fmt(oL)} (the expansion would turn around in the past)`,
    );
  }
}

const GRID = 4096;

/** Scale factor in (0, 1] where the expansion polynomial is <= 0, or null. */
function firstNonPositive(p: CosmologyParams): number | null {
  let prev = expansionPolynomial(p, 1 / GRID);
  if (!(prev > 0)) return 1 / GRID;
  let prevPrev = Infinity;
  for (let i = 2; i <= GRID; i++) {
    const a = i / GRID;
    const v = expansionPolynomial(p, a);
    if (!(v > 0)) return a;
    // A local minimum between grid points could dip below zero unseen: refine it.
    if (prev < prevPrev && prev <= v) {
      const aMin = goldenMinimum(p, (i - 2) / GRID, a);
      if (!(expansionPolynomial(p, aMin) > 0)) return aMin;
    }
    prevPrev = prev;
    prev = v;
  }
  return null;
}

function goldenMinimum(p: CosmologyParams, lo: number, hi: number): number {
  const g = (Math.sqrt(5) - 1) / 2;
  let a = lo;
  let b = hi;
  for (let k = 0; k < 60; k++) {
    const c = b - g * (b - a);
    const d = a + g * (b - a);
    if (expansionPolynomial(p, c) < expansionPolynomial(p, d)) b = d;
    else a = c;
  }
  return (a + b) / 2;
}

/** A number written with at most 10 significant digits and no trailing zeros. */
function fmt(x: number): string {
  return String(Number(x.toPrecision(10)));
}

/** One line naming the model, for export headers and the UI. */
export function describeCosmology(p: CosmologyParams): string {
  const oL = omegaLambda(p);
  const geometry = p.omegaK === 0 ? 'flat' : p.omegaK > 0 ? 'open' : 'closed';
  return (
    `${geometry} Lambda-CDM: H0 = ${fmt(p.h0)} km/s/Mpc, Omega_m = ${fmt(p.omegaM)}, ` +
    `Omega_Lambda = ${fmt(oL)}, Omega_k = ${fmt(p.omegaK)}, Omega_r = ${fmt(p.omegaR)}`
  );
}
