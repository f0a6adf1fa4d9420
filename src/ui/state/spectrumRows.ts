/**
 * The rows a multi-object file becomes once a worker has looked at it: one
 * per spectrum id (`file#n`, core/pipeline.ts), keyed by the file's key plus
 * the same `#n`, so a key names one spectrum for good (results and decisions
 * attach to it again when the file is dropped again). They take the file's
 * place in the batch order. Pure, so it is tested without a database.
 */
import type { EntryRecord } from '../persist/sessionDb';

/** The key of spectrum `id` of the file stored under `fileKey` and named `file`. */
export function spectrumKey(fileKey: string, file: string, id: string): string {
  if (!id.startsWith(`${file}#`)) throw new Error(`spectrum id ${id} is not of file ${file}`);
  return fileKey + id.slice(file.length);
}

/**
 * Entries of the spectra of one file. Orders fall between the file's own and
 * the next whole number, so the spectra list where the file was.
 */
export function spectrumEntries(file: EntryRecord, ids: readonly string[], addedAt: string): EntryRecord[] {
  return ids.map((id, i) => ({
    key: spectrumKey(file.key, file.file, id),
    file: id,
    order: file.order + (i + 1) / (ids.length + 1),
    sizeBytes: file.sizeBytes,
    addedAt,
    hasBytes: file.hasBytes,
    bytesKey: file.key,
  }));
}

/**
 * True for the key of one spectrum of a multi-object file (a file key, which
 * ends in its content hash, then `#n`). Such a row is fitted as that spectrum,
 * never looked at as a whole file again.
 */
export function isSpectrumKey(key: string): boolean {
  return /\|[0-9a-f]{8}#[1-9]\d*$/.test(key);
}
