/**
 * The page: restores the stored session, then shows the first screen (add
 * spectra) or, once there is a batch, the review workbench. Services (the
 * session with its database and worker pool, and the review worker) are
 * passed in, so tests render the app with fakes.
 */
import { useCallback, useEffect, useRef, useState } from 'react';
import { ServicesContext, useServices, useSessionSnapshot, type Services } from './state/SessionContext';
import { DropZone } from './intake/DropZone';
import { ProgressPanel } from './intake/ProgressPanel';
import { PersistBanner } from './PersistBanner';
import { Workbench } from './workbench/Workbench';
import { SessionLoader } from './panels/SessionLoader';
import type { Collected } from './intake/collectFiles';
import { loadDemo } from './demo/loadDemo';
import { downloadBlob, stamp } from './download';
import { screenAgainstPacket } from './team/screenFiles';
import { TeamView } from './team/TeamView';

export interface AppProps {
  services: Services;
  /** Load the demo set at once (the page was opened with ?demo). */
  autoDemo?: boolean;
  /** Injected in tests. */
  fetchFn?: typeof fetch;
}

export function App({ services, autoDemo = false, fetchFn }: AppProps) {
  return (
    <ServicesContext.Provider value={services}>
      <Shell autoDemo={autoDemo} fetchFn={fetchFn} />
    </ServicesContext.Provider>
  );
}

function Shell({ autoDemo, fetchFn }: { autoDemo: boolean; fetchFn?: typeof fetch }) {
  const { session } = useServices();
  const snap = useSessionSnapshot();
  const [notices, setNotices] = useState<string[]>([]);
  const [demoState, setDemoState] = useState<string | null>(null);
  const [teamOpen, setTeamOpen] = useState(false);
  const demoAsked = useRef(false);

  useEffect(() => {
    if (!snap.restored) {
      session.restore().catch((e: unknown) => setNotices((n) => [...n, `Could not read the stored session: ${(e as Error)?.message ?? e}`]));
    }
    // restore once per session object
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [session]);

  // Files of one drop handed over so far (a large drop arrives in parts).
  const droppedSoFar = useRef(0);
  const addCollected = useCallback(
    async (c: Collected) => {
      const store = async () => {
        if (!c.files.length) return;
        droppedSoFar.current += c.files.length;
        // A batch opened from a packet refuses, by name, a file named like one of its spectra with other contents.
        const screened = await screenAgainstPacket(session.teamTag(), c.files);
        if (screened.refused.length) setNotices((n) => [...n, ...screened.refused]);
        await session
          .addFilesReport(screened.files)
          .then(({ duplicates }) => {
            if (duplicates.length) setNotices((n) => [...n, duplicateNotice(duplicates)]);
          })
          .catch((e: unknown) => setNotices((n) => [...n, `Could not store the files: ${(e as Error)?.message ?? e}`]));
      };
      if (c.partial) return store();
      const total = droppedSoFar.current + c.files.length;
      droppedSoFar.current = 0;
      setNotices(c.skipped.length ? c.skipped.map((s) => `Skipped ${s}`) : total === 0 ? ['No files found in what was dropped.'] : []);
      await store();
      droppedSoFar.current = 0;
    },
    [session],
  );

  // quiet: the page was opened with ?demo again (a reload) and the set is already there; that needs no notice.
  const loadDemoSet = useCallback(async (quiet = false) => {
    setDemoState('Loading the demo set…');
    try {
      const files = await loadDemo(fetchFn ?? fetch.bind(globalThis), (done, total) => setDemoState(`Loading the demo set… ${done} of ${total}`));
      const { duplicates } = await session.addFilesReport(files);
      setDemoState(null);
      if (duplicates.length && !quiet) setNotices((n) => [...n, duplicateNotice(duplicates)]);
    } catch (e) {
      setDemoState(`The demo set could not be loaded: ${(e as Error)?.message ?? e}`);
    }
  }, [fetchFn, session]);

  useEffect(() => {
    if (autoDemo && snap.restored && !demoAsked.current) {
      demoAsked.current = true;
      void loadDemoSet(true);
    }
  }, [autoDemo, snap.restored, loadDemoSet]);

  const exportSessionNow = useCallback(async () => {
    const text = await session.exportSession(false);
    downloadBlob(text, `shiftmark-session-${stamp()}.json`, 'application/json');
  }, [session]);

  const unfitted = snap.rows.filter((r) => r.status === 'cancelled' && r.hasBytes).length;
  const hasBatch = snap.rows.length > 0;

  return (
    <div className={`app${hasBatch ? ' with-batch' : ''}`}>
      <header className="app-header">
        <h1>Shiftmark</h1>
        <span className="tagline">redshift review workbench</span>
        <button type="button" className="team-toggle" onClick={() => setTeamOpen((o) => !o)} data-testid="team-toggle">
          {teamOpen ? 'Back to reviewing' : 'Team review'}
        </button>
      </header>
      {snap.persistError && <PersistBanner message={snap.persistError} onExport={() => void exportSessionNow()} onDismiss={() => session.dismissPersistError()} />}
      {notices.length > 0 && (
        <div className="banner banner-note" role="status" data-testid="intake-notices">
          <ul>
            {notices.map((n, i) => (
              <li key={i}>{n}</li>
            ))}
          </ul>
          <button type="button" onClick={() => setNotices([])}>
            Dismiss
          </button>
        </div>
      )}
      {demoState && (
        <div className="banner banner-note" role="status" data-testid="demo-status">
          {demoState}
        </div>
      )}
      <ProgressPanel progress={snap.progress} unfitted={unfitted} onCancel={() => session.cancel()} onResume={() => void session.resume()} />
      {!snap.restored ? (
        <p className="loading">Opening the stored session…</p>
      ) : teamOpen ? (
        <TeamView />
      ) : hasBatch ? (
        <Workbench onCollected={addCollected} onDemo={() => void loadDemoSet()} onExportSession={() => void exportSessionNow()} />
      ) : (
        <main className="first-screen">
          <h2>Add spectra</h2>
          <p>
            Shiftmark fits every spectrum you add, then lets you review each redshift by eye and export a catalogue. Nothing is uploaded: the
            files are read and fitted in this browser.
          </p>
          <DropZone onCollected={addCollected} onDemo={() => void loadDemoSet()} busy={demoState !== null && demoState.startsWith('Loading')} />
          <h3>Or go on with saved work</h3>
          <SessionLoader />
        </main>
      )}
    </div>
  );
}

/** Says which files were not added because the batch has them already (same name and content). */
export function duplicateNotice(paths: readonly string[]): string {
  const shown = paths.slice(0, 3).join(', ');
  const more = paths.length > 3 ? ` and ${paths.length - 3} more` : '';
  return `Already in the batch, not added again (same name and content): ${shown}${more}.`;
}
