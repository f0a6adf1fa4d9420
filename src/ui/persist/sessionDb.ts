/**
 * The session in IndexedDB: raw file bytes, fit results, small result
 * summaries, review decisions and settings, all keyed by the stable file key.
 * Every write goes through `guard`, so a refused write (quota, private mode)
 * reaches the page as one error instead of vanishing.
 */
import { openDB, deleteDB, type DBSchema, type IDBPDatabase } from 'idb';
import type { FitResult, ReviewDecision } from '../../core/types';
import { summarise, type ResultSummary } from './resultSummary';

/** One file of the batch, without its bytes. */
export interface EntryRecord {
  key: string;
  /** File name or relative path as the user gave it. */
  file: string;
  /** Position in the batch (order of arrival). */
  order: number;
  sizeBytes: number;
  /** ISO 8601 time the file was added. */
  addedAt: string;
  /** False for entries imported from a session file without their bytes. */
  hasBytes: boolean;
  /**
   * One spectrum of a multi-object file: the key of the file's entry, which
   * holds the bytes (stored once for all its spectra). Absent for a file.
   */
  bytesKey?: string;
  /** Set on a multi-object file once split: how many spectra it gave (each an entry of its own; the file is no row). */
  spectra?: number;
}

interface SessionSchema extends DBSchema {
  entries: { key: string; value: EntryRecord };
  bytes: { key: string; value: Uint8Array };
  results: { key: string; value: FitResult };
  summaries: { key: string; value: ResultSummary };
  decisions: { key: string; value: ReviewDecision };
  settings: { key: string; value: unknown };
}

export const DEFAULT_DB_NAME = 'shiftmark-session';
const DB_VERSION = 1;

export type WriteErrorListener = (error: Error, what: string) => void;

/** Everything the page needs at start-up: small records only (no bytes, no curves). */
export interface LoadedSession {
  entries: EntryRecord[];
  summaries: Map<string, ResultSummary>;
  decisions: Map<string, ReviewDecision>;
}

export class SessionDb {
  private writeErrorListeners = new Set<WriteErrorListener>();

  private constructor(private readonly db: IDBPDatabase<SessionSchema>, readonly name: string) {}

  static async open(name = DEFAULT_DB_NAME): Promise<SessionDb> {
    const db = await openDB<SessionSchema>(name, DB_VERSION, {
      upgrade(d) {
        for (const store of ['entries', 'bytes', 'results', 'summaries', 'decisions', 'settings'] as const) {
          if (!d.objectStoreNames.contains(store)) d.createObjectStore(store);
        }
      },
    });
    return new SessionDb(db, name);
  }

  static async destroy(name = DEFAULT_DB_NAME): Promise<void> {
    await deleteDB(name);
  }

  onWriteError(listener: WriteErrorListener): () => void {
    this.writeErrorListeners.add(listener);
    return () => this.writeErrorListeners.delete(listener);
  }

  close(): void {
    this.db.close();
  }

  private async guard<T>(what: string, write: () => Promise<T>): Promise<T> {
    try {
      return await write();
    } catch (e) {
      const error = e instanceof Error ? e : new Error(String(e));
      for (const l of this.writeErrorListeners) l(error, what);
      throw error;
    }
  }

  /** Store new files with their bytes in one transaction. */
  async addFiles(files: { entry: EntryRecord; bytes: Uint8Array | null }[]): Promise<void> {
    await this.guard('saving files', async () => {
      const tx = this.db.transaction(['entries', 'bytes'], 'readwrite');
      const entries = tx.objectStore('entries');
      const bytes = tx.objectStore('bytes');
      for (const f of files) {
        void entries.put(f.entry, f.entry.key);
        if (f.bytes) void bytes.put(f.bytes, f.entry.key);
      }
      await tx.done;
    });
  }

  /** Attach bytes to an entry that had none (a file dropped again after an import). */
  async attachBytes(key: string, data: Uint8Array): Promise<void> {
    await this.guard('saving file bytes', async () => {
      const tx = this.db.transaction(['entries', 'bytes'], 'readwrite');
      const entry = await tx.objectStore('entries').get(key);
      if (entry) void tx.objectStore('entries').put({ ...entry, hasBytes: true }, key);
      void tx.objectStore('bytes').put(data, key);
      await tx.done;
    });
  }

  /**
   * A multi-object file becomes its spectra, in one transaction: the spectra's
   * entries are stored (an entry already there keeps its result and decision),
   * the file's entry says how many it gave, and whatever was stored for the
   * file as one spectrum (a failed result, a decision) is dropped.
   */
  async splitFile(fileKey: string, spectra: EntryRecord[]): Promise<void> {
    await this.guard('saving the spectra of a file', async () => {
      const tx = this.db.transaction(['entries', 'results', 'summaries', 'decisions'], 'readwrite');
      const entries = tx.objectStore('entries');
      const file = await entries.get(fileKey);
      if (file) void entries.put({ ...file, spectra: spectra.length }, fileKey);
      for (const e of spectra) void entries.put(e, e.key);
      for (const st of ['results', 'summaries', 'decisions'] as const) void tx.objectStore(st).delete(fileKey);
      await tx.done;
    });
  }

  async getBytes(key: string): Promise<Uint8Array | undefined> {
    return this.db.get('bytes', key);
  }

  async putResult(key: string, result: FitResult): Promise<ResultSummary> {
    const summary = summarise(result);
    await this.guard('saving a fit result', async () => {
      const tx = this.db.transaction(['results', 'summaries'], 'readwrite');
      void tx.objectStore('results').put(result, key);
      void tx.objectStore('summaries').put(summary, key);
      await tx.done;
    });
    return summary;
  }

  async getResult(key: string): Promise<FitResult | undefined> {
    return this.db.get('results', key);
  }

  async putDecision(key: string, decision: ReviewDecision): Promise<void> {
    await this.guard('saving a decision', () => this.db.put('decisions', decision, key));
  }

  async deleteDecision(key: string): Promise<void> {
    await this.guard('clearing a decision', () => this.db.delete('decisions', key));
  }

  async getSetting<T>(name: string): Promise<T | undefined> {
    return (await this.db.get('settings', name)) as T | undefined;
  }

  async putSetting(name: string, value: unknown): Promise<void> {
    await this.guard('saving a setting', () => this.db.put('settings', value, name));
  }

  async loadSession(): Promise<LoadedSession> {
    const tx = this.db.transaction(['entries', 'summaries', 'decisions'], 'readonly');
    const entries = await tx.objectStore('entries').getAll();
    const summaries = new Map<string, ResultSummary>();
    for (let c = await tx.objectStore('summaries').openCursor(); c; c = await c.continue()) summaries.set(c.key, c.value);
    const decisions = new Map<string, ReviewDecision>();
    for (let c = await tx.objectStore('decisions').openCursor(); c; c = await c.continue()) decisions.set(c.key, c.value);
    await tx.done;
    entries.sort((a, b) => a.order - b.order);
    return { entries, summaries, decisions };
  }

  /** Visit every stored result in batch order, one at a time (for exports of large batches). */
  async forEachResult(keys: readonly string[], visit: (key: string, result: FitResult | undefined) => void): Promise<void> {
    for (const key of keys) visit(key, await this.db.get('results', key));
  }

  /** Forget some files: their entries, bytes, results, summaries and decisions. */
  async removeFiles(keys: readonly string[]): Promise<void> {
    await this.guard('removing files', async () => {
      const stores = ['entries', 'bytes', 'results', 'summaries', 'decisions'] as const;
      const tx = this.db.transaction([...stores], 'readwrite');
      for (const k of keys) for (const st of stores) void tx.objectStore(st).delete(k);
      await tx.done;
    });
  }

  /** Forget the whole batch (settings such as reviewer name and cosmology stay). */
  async clearBatch(): Promise<void> {
    await this.guard('clearing the batch', async () => {
      const tx = this.db.transaction(['entries', 'bytes', 'results', 'summaries', 'decisions'], 'readwrite');
      await Promise.all([
        tx.objectStore('entries').clear(),
        tx.objectStore('bytes').clear(),
        tx.objectStore('results').clear(),
        tx.objectStore('summaries').clear(),
        tx.objectStore('decisions').clear(),
      ]);
      await tx.done;
    });
  }
}
