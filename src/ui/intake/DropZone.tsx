/**
 * Where files come in: drop files or whole folders, pick files, pick a
 * folder, or load the bundled demo set. Reading happens here; fitting is
 * the session's job.
 */
import { useRef, useState, type DragEvent } from 'react';
import { collectFromDataTransfer, collectFromFileList, type Collected } from './collectFiles';

export interface DropZoneProps {
  /** Called with each part of a large drop (partial: true) and once at the end; reading waits for it. */
  onCollected: (c: Collected) => Promise<void> | void;
  onDemo?: () => void;
  /** Large first-screen form, or a compact bar on the workbench. */
  compact?: boolean;
  busy?: boolean;
}

export function DropZone({ onCollected, onDemo, compact = false, busy = false }: DropZoneProps) {
  const [over, setOver] = useState(false);
  const filesInput = useRef<HTMLInputElement>(null);
  const folderInput = useRef<HTMLInputElement>(null);

  const onDrop = (e: DragEvent) => {
    e.preventDefault();
    setOver(false);
    // Entries must be taken inside the event; reading carries on afterwards.
    void collectFromDataTransfer(e.dataTransfer, onCollected).then(onCollected);
  };

  return (
    <section
      className={`drop-zone${compact ? ' compact' : ''}${over ? ' over' : ''}`}
      aria-label="Add spectra"
      data-testid="drop-zone"
      onDragOver={(e) => {
        e.preventDefault();
        e.dataTransfer.dropEffect = 'copy';
        setOver(true);
      }}
      onDragLeave={() => setOver(false)}
      onDrop={onDrop}
    >
      {!compact && (
        <p className="drop-hint">
          Drop spectrum files or whole folders here: FITS images or tables (also <code>.fits.gz</code>), CSV, TSV or plain text columns.
          Files stay on this computer.
        </p>
      )}
      <div className="drop-buttons">
        <button type="button" onClick={() => filesInput.current?.click()} disabled={busy}>
          Choose files…
        </button>
        <button type="button" onClick={() => folderInput.current?.click()} disabled={busy}>
          Choose a folder…
        </button>
        {onDemo && (
          <button type="button" className="primary" onClick={onDemo} disabled={busy} data-testid="load-demo">
            Load the demo set
          </button>
        )}
      </div>
      <input
        ref={filesInput}
        type="file"
        multiple
        hidden
        aria-label="Spectrum files"
        data-testid="file-input"
        onChange={(e) => {
          const list = e.currentTarget.files;
          if (list && list.length) void collectFromFileList(list, onCollected).then(onCollected);
          e.currentTarget.value = '';
        }}
      />
      <input
        ref={(el) => {
          folderInput.current = el;
          // Not in React's typings: ask for a folder picker.
          if (el) el.setAttribute('webkitdirectory', '');
        }}
        type="file"
        multiple
        hidden
        aria-label="Spectrum folder"
        onChange={(e) => {
          const list = e.currentTarget.files;
          if (list && list.length) void collectFromFileList(list, onCollected).then(onCollected);
          e.currentTarget.value = '';
        }}
      />
    </section>
  );
}
