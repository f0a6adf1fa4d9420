/**
 * Turn what the user dropped or picked into named byte arrays. Folders are
 * walked through the entry API (webkitGetAsEntry), so a whole night's
 * folder can be dropped at once; paths inside it are kept.
 */
import type { IncomingFile } from '../state/session';

/** Largest single file taken, bytes: anything bigger is no reduced 1-D spectrum. */
export const MAX_FILE_BYTES = 256 * 1024 * 1024;

/** Names skipped inside folders: hidden files and obvious non-spectra. */
const SKIP_NAME = /^\.|^(thumbs\.db|desktop\.ini)$/i;

export interface Collected {
  files: IncomingFile[];
  /** One line per file left out, with the reason. */
  skipped: string[];
  /** True for a part handed over while reading goes on; the last call has it false or absent. */
  partial?: boolean;
}

/**
 * Hands over files in parts of about this many bytes while a large drop is
 * still being read, so the page never holds a whole night's data at once.
 */
export const PART_BYTES = 32 * 1024 * 1024;

/** Receives each part; reading waits for it (so storage keeps pace with reading). */
export type PartSink = (part: Collected) => Promise<void> | void;

interface Reading extends Collected {
  bufferedBytes: number;
  sink?: PartSink;
}

async function readFile(file: File, path: string, out: Reading): Promise<void> {
  if (file.size > MAX_FILE_BYTES) {
    out.skipped.push(`${path}: larger than ${MAX_FILE_BYTES / 1024 / 1024} MB, not read`);
    return;
  }
  try {
    const bytes = new Uint8Array(await file.arrayBuffer());
    out.files.push({ path, bytes });
    out.bufferedBytes += bytes.length;
  } catch (e) {
    out.skipped.push(`${path}: could not be read (${(e as Error)?.message ?? e})`);
  }
  if (out.sink && out.bufferedBytes >= PART_BYTES) {
    const files = out.files.splice(0);
    out.bufferedBytes = 0;
    await out.sink({ files, skipped: [], partial: true });
  }
}

function reading(sink?: PartSink): Reading {
  return { files: [], skipped: [], bufferedBytes: 0, sink };
}

function finished(out: Reading): Collected {
  return { files: out.files, skipped: out.skipped };
}

/** Files from an <input type=file> (with or without webkitdirectory); large picks arrive in parts through `sink`. */
export async function collectFromFileList(list: FileList | readonly File[], sink?: PartSink): Promise<Collected> {
  const out = reading(sink);
  for (const file of Array.from(list)) {
    const path = file.webkitRelativePath || file.name;
    if (SKIP_NAME.test(file.name)) continue;
    await readFile(file, path, out);
  }
  return finished(out);
}

function fileOf(entry: FileSystemFileEntry): Promise<File> {
  return new Promise((resolve, reject) => entry.file(resolve, reject));
}

function readAllEntries(dir: FileSystemDirectoryEntry): Promise<FileSystemEntry[]> {
  const reader = dir.createReader();
  const all: FileSystemEntry[] = [];
  return new Promise((resolve, reject) => {
    // readEntries answers in batches; an empty batch means the end.
    const next = () =>
      reader.readEntries((batch) => {
        if (batch.length === 0) resolve(all);
        else {
          all.push(...batch);
          next();
        }
      }, reject);
    next();
  });
}

async function walk(entry: FileSystemEntry, out: Reading): Promise<void> {
  if (SKIP_NAME.test(entry.name)) return;
  const path = entry.fullPath.replace(/^\//, '') || entry.name;
  if (entry.isFile) {
    try {
      await readFile(await fileOf(entry as FileSystemFileEntry), path, out);
    } catch (e) {
      out.skipped.push(`${path}: could not be read (${(e as Error)?.message ?? e})`);
    }
  } else if (entry.isDirectory) {
    const children = await readAllEntries(entry as FileSystemDirectoryEntry);
    children.sort((a, b) => a.name.localeCompare(b.name));
    for (const c of children) await walk(c, out);
  }
}

/**
 * Files and folders from a drop. The entries must be taken during the drop
 * event itself (the DataTransfer empties afterwards), so call this
 * synchronously from the handler; the reading happens later.
 */
export function collectFromDataTransfer(dt: DataTransfer, sink?: PartSink): Promise<Collected> {
  const entries: FileSystemEntry[] = [];
  const plainFiles: File[] = [];
  const items = dt.items ? Array.from(dt.items) : [];
  for (const item of items) {
    if (item.kind !== 'file') continue;
    const entry = typeof item.webkitGetAsEntry === 'function' ? item.webkitGetAsEntry() : null;
    if (entry) entries.push(entry);
    else {
      const f = item.getAsFile();
      if (f) plainFiles.push(f);
    }
  }
  if (!items.length && dt.files) plainFiles.push(...Array.from(dt.files));
  return (async () => {
    const out = reading(sink);
    for (const e of entries) await walk(e, out);
    for (const f of plainFiles) await readFile(f, f.name, out);
    return finished(out);
  })();
}
