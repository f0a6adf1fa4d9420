/**
 * The one rule for "a detected feature", shared by the grade, the line
 * table a reviewer sees and line naming's support count (identify.ts): a
 * line of the line table (measureLines.ts) marked detected (S/N >= 3 with a
 * physical width), lines closer than
 * DISTINCT_FEATURE_KMS counted once (a doublet or blend is one feature).
 */
import type { LineMeasurement } from '../types';
import { C_KMS } from './logGrid';

export const DISTINCT_FEATURE_KMS = 1500;

export function countFeatures(lines: readonly LineMeasurement[]): { n: number; snrs: number[]; lines: LineMeasurement[] } {
  const det = lines.filter((l) => l.detected && Number.isFinite(l.observedA)).sort((a, b) => b.snr - a.snr);
  const kept: LineMeasurement[] = [];
  for (const d of det) {
    if (kept.every((k) => Math.abs(C_KMS * Math.log(d.observedA / k.observedA)) > DISTINCT_FEATURE_KMS)) kept.push(d);
  }
  return { n: kept.length, snrs: kept.map((k) => k.snr), lines: kept };
}
