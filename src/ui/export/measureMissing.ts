/**
 * Quasar physics for export rows nobody measured at their final z: a typed z
 * accepted before the review box finished, a bulk accept, a fit from before
 * quasar physics existed. They are measured at export time in the worker (the
 * page stays responsive), a few at a time with progress, and the measurement
 * is kept with the decision so the next export does not measure again. Where
 * measuring is impossible (file bytes not stored, a file the reader refuses)
 * the row keeps its empty cells and the note that says why; a measurement that
 * lacks a part (uncalibrated flux, no line in range) gives its own note.
 */
import type { FitResult, ReviewDecision } from '../../core/types';
import type { QuasarMeasurement } from '../../core/physics/types';
import { decisionWithPhysics, withDecisionPhysics } from '../../core/physics/rowValues';
import type { ReviewApi } from '../state/reviewApi';
import type { Session } from '../state/session';

/** Measures quasar physics of a row at z; null when it cannot (the row keeps its note). */
export type QuasarMeasurer = (key: string, z: number) => Promise<QuasarMeasurement | null>;

/** Requests in flight at once: the worker answers them in turn; the cap bounds the file bytes held on the way. */
export const MEASURE_BATCH = 8;

/** A quasar decision with a kept z: it wants physics cells there. */
function wantsPhysics(d: ReviewDecision | undefined): d is ReviewDecision & { z: number } {
  return !!d && (d.state === 'accepted' || d.state === 'changed') && d.class === 'qso' && d.z !== null && d.z > 0;
}

/** True when the export row of this fit and decision would carry physics measured at the decision's z. */
export function hasPhysicsAtDecision(result: FitResult, decision: ReviewDecision): boolean {
  const m = withDecisionPhysics(result, decision).quasar;
  // decisionWithPhysics holds the one "same z" rule: it attaches m only when m was made at the decision's z.
  return !!m && decisionWithPhysics(decision, m).quasar === m;
}

export interface MissingPhysics {
  /** New measurements by row key, each at its decision's z. */
  measured: Map<string, QuasarMeasurement>;
  /** Rows that wanted one and could not get it. */
  failed: number;
}

/**
 * Measure every decided quasar row of `rows` whose physics is missing at its
 * final z. Results are read one at a time (only for quasar decisions without
 * their own measurement), as the export does.
 */
export async function measureMissingPhysics(
  rows: readonly { key: string; decision?: ReviewDecision }[],
  getResult: (key: string) => Promise<FitResult | undefined>,
  measure: QuasarMeasurer,
  onProgress?: (done: number, total: number) => void,
): Promise<MissingPhysics> {
  const wanted: { key: string; z: number }[] = [];
  for (const r of rows) {
    const d = r.decision;
    if (!wantsPhysics(d) || (d.quasar && decisionWithPhysics(d, d.quasar).quasar === d.quasar)) continue;
    const result = await getResult(r.key);
    if (result?.status === 'ok' && !hasPhysicsAtDecision(result, d)) wanted.push({ key: r.key, z: d.z });
  }
  const measured = new Map<string, QuasarMeasurement>();
  let failed = 0;
  for (let i = 0; i < wanted.length; i += MEASURE_BATCH) {
    const batch = wanted.slice(i, i + MEASURE_BATCH);
    const got = await Promise.all(batch.map((w) => measure(w.key, w.z).catch(() => null)));
    batch.forEach((w, k) => {
      const m = got[k];
      if (m) measured.set(w.key, m);
      else failed++;
    });
    onProgress?.(i + batch.length, wanted.length);
  }
  return { measured, failed };
}

/**
 * The measurer the export panel uses: the worker measures the spectrum if it
 * holds it open, else reads it from the stored bytes; the answer is kept with
 * the row's decision.
 */
export function workerMeasurer(
  session: Pick<Session, 'row' | 'getBytes' | 'keepQuasarMeasurement'>,
  review: Pick<ReviewApi, 'measureQuasar' | 'measureQuasarFile'>,
): QuasarMeasurer {
  return async (key, z) => {
    let m = await review.measureQuasar(key, z);
    if (!m) {
      const row = session.row(key);
      const bytes = row ? await session.getBytes(key) : undefined;
      if (!row || !bytes) return null;
      const ans = await review.measureQuasarFile(bytes, row.file, z);
      if ('error' in ans) return null;
      m = ans;
    }
    // A refused write (the banner says so) does not take the measurement from this export.
    await session.keepQuasarMeasurement(key, m).catch(() => undefined);
    return m;
  };
}
