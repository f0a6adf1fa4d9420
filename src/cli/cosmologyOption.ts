import { UsageError } from './args';
import { checkCosmology, DEFAULT_COSMOLOGY } from '../core/cosmology';
import type { CosmologyParams } from '../core/types';

/**
 * Parse the value of --cosmology, `h0=70,om=0.3,ok=0,or=0` (any subset; the
 * rest from the default), and check that the model has a finite age
 * (checkCosmology), so that a bad model stops the run before any file is fitted.
 */
export function parseCosmologyOption(text: string | undefined): CosmologyParams {
  const c: CosmologyParams = { ...DEFAULT_COSMOLOGY };
  if (text === undefined) return c;
  const keys: Record<string, keyof CosmologyParams> = { h0: 'h0', om: 'omegaM', ok: 'omegaK', or: 'omegaR' };
  if (text.trim() === '') throw new UsageError('--cosmology needs parameters, e.g. h0=70,om=0.3,ok=0,or=0');
  for (const part of text.split(',')) {
    const eq = part.indexOf('=');
    const k = (eq < 0 ? part : part.slice(0, eq)).trim();
    const v = eq < 0 ? undefined : part.slice(eq + 1).trim();
    const key = keys[k.toLowerCase()];
    if (!key) throw new UsageError(`--cosmology: unknown parameter '${k}': use h0, om, ok, or (e.g. h0=70,om=0.3)`);
    const value = v === undefined || v === '' ? NaN : Number(v);
    if (!Number.isFinite(value)) throw new UsageError(`--cosmology: ${k} needs a number, as in ${k}=${k.toLowerCase() === 'h0' ? '70' : '0.3'} (got '${part.trim()}')`);
    c[key] = value;
  }
  try {
    checkCosmology(c);
  } catch (e) {
    throw new UsageError(`--cosmology: ${(e as Error).message}`);
  }
  return c;
}
