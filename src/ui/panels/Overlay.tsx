/** A modal panel: labelled dialog, focus moved inside, Escape or the close button shuts it. */
import { useEffect, useRef, type ReactNode } from 'react';

export function Overlay({ title, onClose, children, testId }: { title: string; onClose: () => void; children: ReactNode; testId?: string }) {
  const box = useRef<HTMLDivElement>(null);
  useEffect(() => {
    const el = box.current;
    const first = el?.querySelector<HTMLElement>('input, select, textarea, button:not(.overlay-close)');
    (first ?? el)?.focus();
  }, []);
  return (
    <div className="overlay-backdrop" onMouseDown={(e) => e.target === e.currentTarget && onClose()}>
      <div
        className="overlay"
        role="dialog"
        aria-modal="true"
        aria-label={title}
        tabIndex={-1}
        ref={box}
        data-testid={testId}
        onKeyDown={(e) => {
          if (e.key === 'Escape') {
            e.stopPropagation();
            onClose();
          }
        }}
      >
        <header className="overlay-head">
          <h2>{title}</h2>
          <button type="button" className="overlay-close" aria-label="Close" onClick={onClose}>
            ×
          </button>
        </header>
        {children}
      </div>
    </div>
  );
}
