/**
 * The review loop's view of the worker: every call of FitWorkerApi, answered
 * asynchronously. A comlink Remote<FitWorkerApi> satisfies it; tests pass a
 * plain object of async functions.
 */
import type { FitWorkerApi } from '../../worker/fitWorkerApi';

export type ReviewApi = {
  [K in keyof FitWorkerApi]: (...args: Parameters<FitWorkerApi[K]>) => Promise<ReturnType<FitWorkerApi[K]>>;
};
