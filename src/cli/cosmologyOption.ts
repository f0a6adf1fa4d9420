import { UsageError } from './args';
import { DEFAULT_COSMOLOGY } from '../core/cosmology';
import type { CosmologyParams } from '../core/types';

/** Parse `h0=70,om=0.3,ok=0,or=0` (any subset; the rest from the default). */
export function parseCosmologyOption(text: string | undefined): CosmologyParams {
  const c: CosmologyParams = { ...DEFAULT_COSMOLOGY };
  if (!text) return c;
  const keys: Record<string, keyof CosmologyParams> = { h0: 'h0', om: 'omegaM', ok: 'omegaK', or: 'omegaR' };
  for (const part of text.split(',')) {
    const [k, v] = part.split('=').map((s) => s.trim());
    const key = keys[k?.toLowerCase() ?? ''];
    const value = Number(v);
    if (!key) throw new UsageError(`unknown cosmology parameter "${k}": use h0, om, ok, or`);
    if (v === undefined || v === '' || !Number.isFinite(value)) throw new UsageError(`cosmology parameter ${k} needs a number`);
    c[key] = value;
  }
  if (!(c.h0 > 0)) throw new UsageError('h0 must be positive (km/s/Mpc)');
  if (c.omegaM < 0 || c.omegaR < 0) throw new UsageError('om and or must not be negative');
  return c;
}
