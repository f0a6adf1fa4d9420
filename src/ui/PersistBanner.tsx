/** Shown when the browser refused a write: the work is at risk until exported. */
export function PersistBanner({ message, onExport, onDismiss }: { message: string; onExport: () => void; onDismiss: () => void }) {
  return (
    <div className="banner banner-error" role="alert" data-testid="persist-banner">
      <span>{message}</span>
      <button type="button" className="primary" onClick={onExport}>
        Export session now
      </button>
      <button type="button" onClick={onDismiss}>
        Dismiss
      </button>
    </div>
  );
}
