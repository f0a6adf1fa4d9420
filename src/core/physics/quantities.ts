/**
 * Measurement + cosmology -> luminosities, masses, bolometric luminosity and
 * Eddington ratio. Cheap, so exports and the review panel compute it for the
 * cosmology in force.
 *
 * lambda L_lambda at rest wavelength lambda_r = 4 pi D_L^2 lambda_obs f_lambda(lambda_obs),
 * lambda_obs = (1 + z) lambda_r (Hogg 1999, astro-ph/9905116, eq. 22 with the
 * per-wavelength K-correction folded in). Not corrected for Galactic or
 * intrinsic extinction, nor for host-galaxy starlight.
 */
import type { CosmologyParams } from '../types';
import { luminosityDistanceMpc } from '../cosmology';
import {
  BOLOMETRIC_CORRECTION,
  EDDINGTON_ERG_S_PER_MSUN,
  MASS_CALIBRATIONS,
  MASS_SYSTEMATIC_DEX,
  logVirialMass,
  logVirialMassErr,
  preferredOrder,
} from './calibrations';
import type { ContinuumRefA } from './regions';
import type { QuasarMeasurement } from './types';

/** One megaparsec in cm (IAU 2015 parsec; src/core/cosmology/constants.ts holds it in km). */
export const MPC_CM = 3.085677581491367e24;

export interface Valued {
  value: number;
  err: number;
}

export interface MassEstimate {
  id: string;
  line: string;
  /** log10(M / M_sun). */
  logM: number;
  /** Statistical error from the FWHM and luminosity, dex. */
  logMErr: number;
  /** Systematic uncertainty of single-epoch masses, dex (MASS_SYSTEMATIC_DEX). */
  sysDex: number;
  source: string;
}

export interface QuasarQuantities {
  /** log10 lambda L_lambda, erg/s, per rest wavelength; or the reason it is missing. */
  logLambdaL: Record<ContinuumRefA, Valued | { reason: string }>;
  masses: MassEstimate[];
  /** Why no mass at all (when masses is empty). */
  massReason?: string;
  preferred?: MassEstimate & { rule: string };
  /** log10 L_bol, erg/s, from the preferred mass's luminosity. */
  logLbol?: Valued & { bc: number; fromA: ContinuumRefA };
  /** log10 (L_bol / L_Edd) with the preferred mass; its error carries the mass's statistical error only. */
  logEddRatio?: Valued;
}

const REFS: readonly ContinuumRefA[] = [1350, 3000, 5100];

/** log10 lambda L_lambda (erg/s) at a standard wavelength, or why not. */
function luminosityAt(m: QuasarMeasurement, refA: ContinuumRefA, cosmo: CosmologyParams): Valued | { reason: string } {
  if (!m.fluxScale.ok) return { reason: m.fluxScale.reason };
  const c = m.continua.find((p) => p.restA === refA);
  if (!c || !c.ok || c.flux === undefined) return { reason: c?.reason ?? `${refA} A not covered` };
  if (!(c.flux > 0)) return { reason: `continuum at ${refA} A is not positive` };
  if (!(m.z > 0)) return { reason: 'no luminosity distance at z <= 0' };
  const dl = luminosityDistanceMpc(m.z, cosmo) * MPC_CM;
  const f = c.flux * m.fluxScale.ergPerSCm2A;
  const lam = 4 * Math.PI * dl * dl * (1 + m.z) * refA * f;
  return { value: Math.log10(lam), err: (c.fluxErr ?? 0) / c.flux / Math.LN10 };
}

export function quasarQuantities(m: QuasarMeasurement, cosmo: CosmologyParams): QuasarQuantities {
  const logLambdaL = Object.fromEntries(REFS.map((r) => [r, luminosityAt(m, r, cosmo)])) as QuasarQuantities['logLambdaL'];
  const masses: MassEstimate[] = [];
  const missing: string[] = [];
  for (const cal of MASS_CALIBRATIONS) {
    const line = m.lines.find((l) => l.id === cal.line);
    const L = logLambdaL[cal.luminosityA];
    if (!line?.ok || line.fwhmKms === undefined) {
      missing.push(`${cal.line}: ${line?.reason ?? 'not measured'}`);
      continue;
    }
    if (!('value' in L)) {
      missing.push(`${cal.luminosityA} A: ${L.reason}`);
      continue;
    }
    const lin = 10 ** L.value;
    masses.push({
      id: cal.id,
      line: cal.line,
      logM: logVirialMass(cal, line.fwhmKms, lin),
      logMErr: logVirialMassErr(cal, line.fwhmKms, line.fwhmErrKms ?? 0, lin, lin * L.err * Math.LN10),
      sysDex: MASS_SYSTEMATIC_DEX,
      source: cal.source,
    });
  }
  const out: QuasarQuantities = { logLambdaL, masses };
  if (masses.length === 0) {
    out.massReason = [...new Set(missing)].join('; ') || 'no broad line measured';
    return out;
  }
  const id = preferredOrder(m.z).find((k) => masses.some((e) => e.id === k))!;
  const pref = masses.find((e) => e.id === id)!;
  out.preferred = { ...pref, rule: 'Shen et al. 2011: H-beta below z = 0.7, Mg II (S11) to 1.9, C IV above; else the first available' };
  const cal = MASS_CALIBRATIONS.find((c) => c.id === id)!;
  const L = logLambdaL[cal.luminosityA] as Valued;
  const bc = BOLOMETRIC_CORRECTION[cal.luminosityA];
  out.logLbol = { value: L.value + Math.log10(bc), err: L.err, bc, fromA: cal.luminosityA };
  const logEdd = Math.log10(EDDINGTON_ERG_S_PER_MSUN) + pref.logM;
  out.logEddRatio = { value: out.logLbol.value - logEdd, err: Math.hypot(L.err, pref.logMErr) };
  return out;
}
