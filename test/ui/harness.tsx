/**
 * Test doubles for the app's services: a real Session over fake-indexeddb,
 * an instant fitter and a scripted review worker. No engine, no Worker.
 */
import 'fake-indexeddb/auto';
import { vi } from 'vitest';
import { Session, type Fitter } from '../../src/ui/state/session';
import { SessionDb } from '../../src/ui/persist/sessionDb';
import type { ReviewApi } from '../../src/ui/state/reviewApi';
import type { FitJob, PoolOutcome } from '../../src/worker/pool';
import type { FitResult } from '../../src/core/types';
import { makeResult, makeSpectrum } from './fixtures';

let n = 0;
export const freshDbName = () => `ui-test-${Date.now()}-${++n}`;

/** Fits instantly with a scripted result per file name (default: makeResult). */
export class ScriptedFitter implements Fitter {
  constructor(private readonly script: (file: string, bytes: Uint8Array) => FitResult = (f) => makeResult(f)) {}
  async fit(job: FitJob): Promise<PoolOutcome> {
    const bytes = await job.loadBytes();
    return { kind: 'result', result: this.script(job.file, bytes) };
  }
}

export function fakeReview(over: Partial<ReviewApi> = {}): ReviewApi {
  return {
    fitFile: vi.fn(async (_b: Uint8Array, file: string) => makeResult(file)),
    fitOrSplit: vi.fn(async (_b: Uint8Array, file: string) => ({ kind: 'fitted' as const, result: makeResult(file) })),
    openSpectrum: vi.fn(async (_key: string, file: string) => ({ kind: 'spectrum' as const, spectrum: makeSpectrum(file) })),
    refitNear: vi.fn(async (_key: string, z: number) => makeResult('refit', { z: z + 0.0001, zErr: 0.0002, class: 'galaxy' })),
    nameFeature: vi.fn(async () => ({ feature: null, suggestions: [] })),
    measureLines: vi.fn(async () => []),
    solutionModel: vi.fn(async () => null),
    measureQuasar: vi.fn(async () => null),
    measureQuasarFile: vi.fn(async () => ({ error: 'not scripted in this test' })),
    refitMasked: vi.fn(async () => null),
    ...over,
  };
}

export async function makeSession(name = freshDbName(), fitter: Fitter = new ScriptedFitter()): Promise<{ session: Session; db: SessionDb; name: string }> {
  const db = await SessionDb.open(name);
  const session = new Session(db, fitter);
  await session.restore();
  return { session, db, name };
}

export async function waitUntil(cond: () => boolean, what = 'condition'): Promise<void> {
  for (let i = 0; i < 400 && !cond(); i++) await new Promise((r) => setTimeout(r, 5));
  if (!cond()) throw new Error(`timed out waiting for ${what}`);
}
