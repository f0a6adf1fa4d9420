/** Save text or bytes as a file through a Blob and an <a download>; nothing leaves the machine. */
export function downloadBlob(data: BlobPart, fileName: string, mime: string): void {
  const url = URL.createObjectURL(new Blob([data], { type: mime }));
  const a = document.createElement('a');
  a.href = url;
  a.download = fileName;
  a.rel = 'noopener';
  a.style.display = 'none';
  document.body.appendChild(a);
  a.click();
  a.remove();
  // Give the browser time to start the download before the URL goes.
  setTimeout(() => URL.revokeObjectURL(url), 10_000);
}

/** File-name-safe time stamp, e.g. 2026-01-02T10-00-00. */
export function stamp(d = new Date()): string {
  return d.toISOString().slice(0, 19).replace(/:/g, '-');
}
