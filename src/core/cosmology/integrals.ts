/**
 * The two dimensionless integrals every distance and time comes from
 * (Hogg 1999, astro-ph/9905116, eqs. 14, 15, 30). Callers check the inputs.
 */
import type { CosmologyParams } from '../types';
import { integrate } from './integrate';
import { omegaLambda } from './params';

/** E(z) = H(z)/H0 = sqrt(Or (1+z)^4 + Om (1+z)^3 + Ok (1+z)^2 + OL) (Hogg 1999 eq. 14). */
export function hubbleRatio(z: number, p: CosmologyParams): number {
  const x = 1 + z;
  const x2 = x * x;
  return Math.sqrt(p.omegaR * x2 * x2 + p.omegaM * x2 * x + p.omegaK * x2 + omegaLambda(p));
}

/** D_C / D_H = Int_0^z dz' / E(z') (Hogg 1999 eq. 15). */
export function comovingIntegral(z: number, p: CosmologyParams): number {
  if (z === 0) return 0;
  return integrate((zz) => 1 / hubbleRatio(zz, p), 0, z);
}

/**
 * Time since the big bang over t_H up to scale factor a: Int_0^a da' / (a' E(a')).
 * With a' = s^2 the integrand 2 s^3 / sqrt(Or + Om s^2 + Ok s^4 + OL s^8) is smooth
 * at s = 0 even without radiation, where da/(aE) ~ sqrt(a) has an infinite slope.
 */
export function ageIntegral(aFrom: number, aTo: number, p: CosmologyParams): number {
  const oL = omegaLambda(p);
  const f = (s: number): number => {
    if (s === 0) return 0; // every physical model has integrand -> 0 as s -> 0
    const q = s * s;
    return (2 * q * s) / Math.sqrt(p.omegaR + q * (p.omegaM + q * (p.omegaK + oL * q * q)));
  };
  const sFrom = Math.sqrt(aFrom);
  const sTo = Math.sqrt(aTo);
  return integrate(f, sFrom, sTo, undefined, halvingBreaks(sFrom, sTo));
}

/** Halvings towards `from`: the last panel is 2^-20 (1e-6) of the range, where the age integrand (< s^2) adds < 1e-18. */
const MAX_HALVINGS = 20;

/**
 * Break points from + (to - from) 2^-k, k = 1, 2, ...: panels that halve in width
 * towards the lower limit, so that a change of scale near it (the
 * radiation-matter transition at s = sqrt(Or / Om), at any Omega_r) falls in a
 * panel of its own size and is sampled, not stepped over.
 */
function halvingBreaks(from: number, to: number): number[] {
  const out: number[] = [];
  for (let k = 1; k <= MAX_HALVINGS; k++) out.push(from + (to - from) * 2 ** -k);
  return out;
}
