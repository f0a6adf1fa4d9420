/**
 * Browser entry: open the session database, start the worker pool and the
 * review worker, and render the app.
 */
import { createRoot } from 'react-dom/client';
import { App } from './App';
import { Session } from './state/session';
import { SessionDb } from './persist/sessionDb';
import { FitPool, defaultPoolSize, DEFAULT_TIME_LIMIT_MS } from '../worker/pool';
import { createFitWorker, createPoolWorker } from '../worker/createFitWorker';
import type { ReviewApi } from './state/reviewApi';
import { wantsDemo } from './demo/loadDemo';
import './styles.css';

async function start(): Promise<void> {
  const root = createRoot(document.getElementById('root')!);
  let db: SessionDb;
  try {
    db = await SessionDb.open();
  } catch (e) {
    root.render(
      <p className="banner banner-error" role="alert">
        This browser would not open its local storage (IndexedDB): {(e as Error)?.message ?? String(e)}. Shiftmark needs it to keep your work; a
        private window may block it.
      </p>,
    );
    return;
  }
  const pool = new FitPool({ size: defaultPoolSize(navigator.hardwareConcurrency), createWorker: createPoolWorker, timeLimitMs: DEFAULT_TIME_LIMIT_MS });
  // A separate worker for the review loop, so a running batch never delays it.
  const review = createFitWorker().api as unknown as ReviewApi;
  const session = new Session(db, pool);
  root.render(<App services={{ session, review }} autoDemo={wantsDemo(location.search)} />);
}

void start();
