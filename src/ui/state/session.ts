/**
 * The page's session: the batch (one row per spectrum: a file, or one
 * spectrum of a multi-object file, see spectrumRows.ts), fitting progress, review
 * decisions and settings. IndexedDB is the truth: every change is written
 * there first and then shown. Components read it through useSession
 * (useSyncExternalStore); the worker pool and the database are injected, so
 * tests run it with fakes.
 * Over 300 lines: every change goes through the one write-first path to
 * IndexedDB kept here; the row bookkeeping and persistence helpers live in
 * spectrumRows.ts and ../persist/.
 */
import type { CosmologyParams, FitResult, ReviewDecision } from '../../core/types';
import { DEFAULT_COSMOLOGY, checkCosmology } from '../../core/cosmology';
import type { FitJob, PoolOutcome } from '../../worker/pool';
import type { SessionDb, EntryRecord } from '../persist/sessionDb';
import type { ResultSummary } from '../persist/resultSummary';
import { summarise } from '../persist/resultSummary';
import { fileKey } from '../persist/fileKey';
import { encodeSession, parseSession, SESSION_FORMAT, SESSION_VERSION, type SessionFile } from '../persist/sessionFile';
import { planImport, type ImportPlan } from '../persist/planImport';
import { SOFTWARE_NAME_VERSION } from '../version';
import { teamTagProblems, type TeamTag } from '../../core/team/teamTag';
import { isSpectrumKey, spectrumEntries } from './spectrumRows';
import type { QuasarMeasurement } from '../../core/physics/types';
import { decisionWithPhysics } from '../../core/physics/rowValues';

export type RowStatus = 'waiting' | 'fitting' | 'ok' | 'failed' | 'timeout' | 'cancelled';

/** One spectrum of the batch as the list shows it: a file, or one spectrum (`file#n`) of a multi-object file. */
export interface Row {
  key: string;
  file: string;
  /** For one spectrum of a multi-object file: the key its file's bytes are stored under. */
  bytesKey?: string;
  order: number;
  hasBytes: boolean;
  status: RowStatus;
  summary?: ResultSummary;
  decision?: ReviewDecision;
}

export interface Progress {
  /** Files in the current fitting run. */
  total: number;
  /** Fitted successfully in this run. */
  done: number;
  /** Failed to read or fit (including time-outs) in this run. */
  failed: number;
  /** Not yet started (queued or being fitted). */
  waiting: number;
  /** True while a run is going. */
  active: boolean;
  /** Files left unfitted by a cancel. */
  cancelled: number;
}

export interface SessionSnapshot {
  rows: readonly Row[];
  progress: Progress;
  reviewer: string | null;
  cosmology: CosmologyParams;
  /** Set when a write to the browser's storage failed; work is at risk until exported. */
  persistError: string | null;
  /** True once the stored session has been read. */
  restored: boolean;
}

/** What the session needs from the worker pool. */
export interface Fitter {
  fit(job: FitJob, signal?: AbortSignal): Promise<PoolOutcome>;
}

export interface IncomingFile {
  /** Name or relative path (for files inside a dropped folder). */
  path: string;
  bytes: Uint8Array;
}

/** Where the reviewer was: list filter, order, the open spectrum and the list's width. Kept over a reload. */
export interface SavedView {
  filter?: string;
  sort?: string;
  currentKey?: string | null;
  listWidthPx?: number;
}

/**
 * What the reviewer staged on the open spectrum and has not saved yet (a
 * picked candidate, a named line, a typed z, grade, note, flags). One at a
 * time: it belongs to `key` and is dropped when another spectrum is opened.
 * The shape is the review panel's; the session only keeps it.
 */
export interface StagedDraft {
  key: string;
}

const NOTIFY_INTERVAL_MS = 50;

const EMPTY_PROGRESS: Progress = { total: 0, done: 0, failed: 0, waiting: 0, active: false, cancelled: 0 };

export class Session {
  private rowsByKey = new Map<string, Row>();
  private order: string[] = [];
  private snapshot: SessionSnapshot;
  private listeners = new Set<() => void>();
  private timer: ReturnType<typeof setTimeout> | null = null;
  private abort: AbortController | null = null;
  private progress: Progress = EMPTY_PROGRESS;
  private reviewer: string | null = null;
  private cosmology: CosmologyParams = { ...DEFAULT_COSMOLOGY };
  private persistError: string | null = null;
  private restored = false;
  private nextOrder = 0;
  private view: SavedView | null = null;
  private draft: StagedDraft | null = null;
  /** The team block when this batch came from a review packet (saved with every session file). */
  private team: TeamTag | null = null;
  /** Multi-object files already split into their spectra, by file key: they hold the bytes but are no row. */
  private splitFiles = new Map<string, EntryRecord>();
  /** The review box's latest quasar measurement per row; a decision at its z takes it along (exports then carry the physics at a reviewed z). */
  private quasarSeen = new Map<string, QuasarMeasurement>();

  constructor(
    readonly db: SessionDb,
    private readonly fitter: Fitter,
  ) {
    this.snapshot = this.build();
    db.onWriteError((error, what) => {
      const quota = error.name === 'QuotaExceededError' || /quota/i.test(error.message);
      this.persistError = quota
        ? `The browser refused to store more (${what}): its storage quota is full. Export the session now to keep your work.`
        : `Saving failed (${what}): ${error.message}. Export the session now to keep your work.`;
      this.flush();
    });
  }

  // ---- reading -------------------------------------------------------

  subscribe = (listener: () => void): (() => void) => {
    this.listeners.add(listener);
    return () => this.listeners.delete(listener);
  };

  getSnapshot = (): SessionSnapshot => this.snapshot;

  row(key: string): Row | undefined {
    return this.rowsByKey.get(key);
  }

  private build(): SessionSnapshot {
    return {
      rows: this.order.map((k) => this.rowsByKey.get(k)!),
      progress: this.progress,
      reviewer: this.reviewer,
      cosmology: this.cosmology,
      persistError: this.persistError,
      restored: this.restored,
    };
  }

  /** Publish now (user actions). */
  private flush(): void {
    if (this.timer) {
      clearTimeout(this.timer);
      this.timer = null;
    }
    this.snapshot = this.build();
    for (const l of this.listeners) l();
  }

  /** Publish soon, coalescing a burst of fit results into one render. */
  private notifySoon(): void {
    if (this.timer) return;
    this.timer = setTimeout(() => {
      this.timer = null;
      this.flush();
    }, NOTIFY_INTERVAL_MS);
  }

  private setRow(row: Row): void {
    if (!this.rowsByKey.has(row.key)) this.order.push(row.key);
    this.rowsByKey.set(row.key, row);
  }

  // ---- start-up ------------------------------------------------------

  /** Read the stored batch, decisions and settings; re-queue files a closed tab left unfitted. */
  async restore(): Promise<void> {
    const [loaded, reviewer, cosmology, view, draft, team] = await Promise.all([
      this.db.loadSession(),
      this.db.getSetting<string>('reviewer'),
      this.db.getSetting<CosmologyParams>('cosmology'),
      this.db.getSetting<SavedView>('view'),
      this.db.getSetting<StagedDraft>('draft'),
      this.db.getSetting<TeamTag>('team'),
    ]);
    if (team && teamTagProblems(team).length === 0) this.team = team;
    if (typeof reviewer === 'string' && reviewer.trim()) this.reviewer = reviewer;
    if (view && typeof view === 'object') this.view = view;
    if (draft && typeof draft === 'object' && typeof draft.key === 'string') this.draft = draft;
    if (cosmology && isValidCosmology(cosmology)) this.cosmology = cosmology;
    const unfitted: string[] = [];
    for (const e of loaded.entries) {
      if (e.spectra !== undefined) {
        this.splitFiles.set(e.key, e);
        this.nextOrder = Math.max(this.nextOrder, Math.floor(e.order) + 1);
        continue;
      }
      const summary = loaded.summaries.get(e.key);
      const decision = loaded.decisions.get(e.key);
      const status: RowStatus = summary ? statusOf(summary) : e.hasBytes ? 'waiting' : 'cancelled';
      this.setRow({ key: e.key, file: e.file, order: e.order, hasBytes: e.hasBytes, status, summary, decision, ...(e.bytesKey ? { bytesKey: e.bytesKey } : {}) });
      this.nextOrder = Math.max(this.nextOrder, Math.floor(e.order) + 1);
      if (!summary && e.hasBytes) unfitted.push(e.key);
    }
    this.restored = true;
    this.flush();
    if (unfitted.length) void this.fitKeys(unfitted);
  }

  // ---- intake and fitting -------------------------------------------

  /**
   * Add files to the batch (stored first), then fit the new ones. A file
   * already in the batch is not added twice; if it had lost its bytes
   * (imported without spectra) they are attached.
   * Returns the keys of the files in the order given.
   */
  async addFiles(files: IncomingFile[]): Promise<string[]> {
    return (await this.addFilesReport(files)).keys;
  }

  /** As addFiles, and also says which files were already in the batch (by path, in the order given). */
  async addFilesReport(files: IncomingFile[]): Promise<{ keys: string[]; duplicates: string[] }> {
    const keys: string[] = [];
    const duplicates: string[] = [];
    const fresh: { entry: EntryRecord; bytes: Uint8Array }[] = [];
    const seen = new Set<string>();
    for (const f of files) {
      const key = fileKey(f.path, f.bytes);
      keys.push(key);
      if (seen.has(key)) continue;
      seen.add(key);
      if (this.splitFiles.has(key)) {
        duplicates.push(f.path); // a multi-object file whose spectra are in the batch already
        continue;
      }
      const existing = this.rowsByKey.get(key);
      if (existing) {
        if (existing.hasBytes) duplicates.push(f.path);
        if (!existing.hasBytes) {
          await this.db.attachBytes(key, f.bytes);
          this.setRow({ ...existing, hasBytes: true });
        }
        continue;
      }
      const entry: EntryRecord = {
        key,
        file: f.path,
        order: this.nextOrder++,
        sizeBytes: f.bytes.length,
        addedAt: new Date().toISOString(),
        hasBytes: true,
      };
      fresh.push({ entry, bytes: f.bytes });
    }
    if (fresh.length) {
      await this.db.addFiles(fresh);
      for (const { entry } of fresh) this.setRow({ key: entry.key, file: entry.file, order: entry.order, hasBytes: true, status: 'waiting' });
    }
    this.flush();
    if (fresh.length) void this.fitKeys(fresh.map((f) => f.entry.key));
    return { keys, duplicates };
  }

  /** Fit (or fit again) the given files; joins a running batch when one is going. */
  async fitKeys(keys: string[]): Promise<void> {
    if (!this.abort || this.abort.signal.aborted || !this.progress.active) {
      this.abort = new AbortController();
      this.progress = { ...EMPTY_PROGRESS, active: true };
    }
    const signal = this.abort.signal;
    this.progress = { ...this.progress, total: this.progress.total + keys.length, waiting: this.progress.waiting + keys.length };
    for (const k of keys) {
      const row = this.rowsByKey.get(k);
      if (row) this.setRow({ ...row, status: 'waiting' });
    }
    this.flush();
    await Promise.all(
      keys.map(async (key) => {
        const row = this.rowsByKey.get(key);
        if (!row) return;
        const job: FitJob = {
          key,
          file: row.file,
          firstLook: !isSpectrumKey(key),
          loadBytes: async () => {
            const bytes = await this.db.getBytes(row.bytesKey ?? key);
            if (!bytes) throw new Error('the file is no longer stored');
            const r = this.rowsByKey.get(key);
            if (r) this.setRow({ ...r, status: 'fitting' });
            this.notifySoon();
            return bytes;
          },
        };
        const outcome = await this.fitter.fit(job, signal);
        await this.takeOutcome(key, outcome, signal);
      }),
    );
    if (signal === this.abort?.signal && this.progress.waiting === 0) {
      this.progress = { ...this.progress, active: false };
      this.flush();
    }
  }

  private async takeOutcome(key: string, outcome: PoolOutcome, signal: AbortSignal): Promise<void> {
    const row = this.rowsByKey.get(key);
    const p = this.progress;
    if (outcome.kind === 'cancelled') {
      this.progress = { ...p, waiting: p.waiting - 1, cancelled: p.cancelled + 1 };
      if (row) this.setRow({ ...row, status: 'cancelled' });
      this.notifySoon();
      return;
    }
    if (outcome.kind === 'split') {
      // The look at the file is no spectrum: its spectra are counted as they are queued.
      this.progress = { ...p, waiting: p.waiting - 1, total: p.total - 1 };
      if (row) await this.splitRow(row, outcome.ids, signal);
      return;
    }
    const result = outcome.result;
    let summary: ResultSummary;
    try {
      summary = await this.db.putResult(key, result);
    } catch {
      summary = summarise(result); // shown, though not stored; the banner says so
    }
    const failed = result.status !== 'ok';
    this.progress = { ...this.progress, waiting: this.progress.waiting - 1, done: this.progress.done + (failed ? 0 : 1), failed: this.progress.failed + (failed ? 1 : 0) };
    const now = this.rowsByKey.get(key);
    if (now) this.setRow({ ...now, status: statusOf(summary), summary });
    this.notifySoon();
  }

  /**
   * A multi-object file becomes one row per spectrum, in its place (stored in
   * one step first), and each spectrum is fitted as its own job. A spectrum
   * already in the batch (the file dropped again after an import) keeps its
   * result and decision and gets the bytes. After a cancel the new rows wait.
   */
  private async splitRow(file: Row, ids: readonly string[], signal: AbortSignal): Promise<void> {
    const fileEntry: EntryRecord = { key: file.key, file: file.file, order: file.order, sizeBytes: 0, addedAt: new Date().toISOString(), hasBytes: file.hasBytes };
    const entries = spectrumEntries(fileEntry, ids, fileEntry.addedAt).map((e) => {
      const had = this.rowsByKey.get(e.key);
      return had ? { ...e, order: had.order } : e;
    });
    try {
      await this.db.splitFile(file.key, entries);
    } catch {
      // Shown all the same; the banner says the batch is not stored.
    }
    this.splitFiles.set(file.key, { ...fileEntry, spectra: entries.length });
    const at = this.order.indexOf(file.key);
    const fresh = entries.filter((e) => !this.rowsByKey.get(e.key)?.summary).map((e) => e.key);
    const newKeys = entries.map((e) => e.key).filter((k) => !this.rowsByKey.has(k));
    for (const e of entries) {
      const had = this.rowsByKey.get(e.key);
      const status: RowStatus = had?.summary ? had.status : signal.aborted ? 'cancelled' : 'waiting';
      this.rowsByKey.set(e.key, { ...had, key: e.key, file: e.file, order: e.order, hasBytes: true, bytesKey: file.key, status });
    }
    this.rowsByKey.delete(file.key);
    this.order.splice(at < 0 ? this.order.length : at, at < 0 ? 0 : 1, ...newKeys);
    if (this.draft?.key === file.key) this.draft = null;
    if (signal.aborted) {
      this.progress = { ...this.progress, cancelled: this.progress.cancelled + fresh.length };
      this.notifySoon();
      return;
    }
    this.notifySoon();
    if (fresh.length) await this.fitKeys(fresh);
  }

  /** Stop the run: queued files stay in the list as not fitted. */
  cancel(): void {
    this.abort?.abort();
    this.progress = { ...this.progress, active: false };
    this.flush();
  }

  /** Files a cancel left unfitted, fitted now. */
  resume(): Promise<void> {
    const keys = this.order.filter((k) => {
      const r = this.rowsByKey.get(k)!;
      return r.status === 'cancelled' && r.hasBytes;
    });
    return this.fitKeys(keys);
  }

  /** Full fit result of one file (for the review panel). */
  getResult(key: string): Promise<FitResult | undefined> {
    return this.db.getResult(key);
  }

  /** The bytes of the file a row comes from (for a spectrum of a multi-object file, the whole file). */
  getBytes(key: string): Promise<Uint8Array | undefined> {
    return this.db.getBytes(this.rowsByKey.get(key)?.bytesKey ?? key);
  }

  // ---- decisions and settings ---------------------------------------

  /** The review box measured quasar physics for a row at m.z (kept in memory for the row's next decision). */
  noteQuasarMeasurement(key: string, m: QuasarMeasurement): void {
    this.quasarSeen.set(key, m);
  }

  /**
   * An export measured quasar physics for a decided row at its z: keep it with
   * the decision (same decidedAt, so a bulk undo still recognises it) so the
   * next export need not measure again. A decision at another z is left alone.
   */
  async keepQuasarMeasurement(key: string, m: QuasarMeasurement): Promise<void> {
    const before = this.rowsByKey.get(key)?.decision;
    if (!before) return;
    const decision = decisionWithPhysics(before, m);
    if (decision.quasar !== m) return;
    try {
      await this.db.putDecision(key, decision);
    } finally {
      const row = this.rowsByKey.get(key);
      // Unless the reviewer decided again meanwhile.
      if (row && row.decision === before) {
        this.setRow({ ...row, decision });
        this.notifySoon(); // an export keeps many in a burst
      }
    }
  }

  /** Store a decision at once; the list shows it when the write has landed (or failed, with the banner). */
  async decide(key: string, given: ReviewDecision): Promise<void> {
    const row = this.rowsByKey.get(key);
    if (!row) throw new Error(`unknown file key: ${key}`);
    const decision = decisionWithPhysics(given, this.quasarSeen.get(key));
    try {
      await this.db.putDecision(key, decision);
    } finally {
      // Kept in memory even when the write failed, so an export still carries it.
      this.setRow({ ...this.rowsByKey.get(key)!, decision });
      this.flush();
    }
  }

  /** Store many decisions (a bulk step) and publish once. */
  async decideMany(items: readonly { key: string; decision: ReviewDecision }[]): Promise<void> {
    try {
      for (const { key, decision } of items) {
        if (!this.rowsByKey.has(key)) continue;
        await this.db.putDecision(key, decision);
        this.setRow({ ...this.rowsByKey.get(key)!, decision });
      }
    } finally {
      // Whatever was written (or kept in memory after a refused write) is shown.
      for (const { key, decision } of items) {
        const r = this.rowsByKey.get(key);
        if (r && r.decision !== decision) this.setRow({ ...r, decision });
      }
      this.flush();
    }
  }

  /** Put many spectra back to 'not reviewed' (undo of a bulk step). */
  async reopenMany(keys: readonly string[]): Promise<void> {
    try {
      for (const key of keys) if (this.rowsByKey.has(key)) await this.db.deleteDecision(key);
    } finally {
      for (const key of keys) {
        const r = this.rowsByKey.get(key);
        if (!r) continue;
        const { decision: _drop, ...rest } = r;
        this.setRow(rest);
      }
      this.flush();
    }
  }

  /** Put a spectrum back to 'not reviewed'. */
  async reopen(key: string): Promise<void> {
    const row = this.rowsByKey.get(key);
    if (!row) return;
    try {
      await this.db.deleteDecision(key);
    } finally {
      const { decision: _drop, ...rest } = this.rowsByKey.get(key)!;
      this.setRow(rest);
      this.flush();
    }
  }

  async setReviewer(name: string): Promise<void> {
    const clean = name.trim();
    if (!clean) return;
    this.reviewer = clean;
    this.flush();
    await this.db.putSetting('reviewer', clean).catch(() => undefined);
  }

  async setCosmology(params: CosmologyParams): Promise<void> {
    checkCosmology(params);
    this.cosmology = { ...params };
    this.flush();
    await this.db.putSetting('cosmology', this.cosmology).catch(() => undefined);
  }

  /** The place saved by the last page (read at restore), or null. */
  savedView(): SavedView | null {
    return this.view;
  }

  /** Remember the place (merged into what is saved). */
  saveView(v: SavedView): void {
    this.view = { ...this.view, ...v };
    void this.db.putSetting('view', this.view).catch(() => undefined);
  }

  /** The unsaved staged choice, or null. */
  stagedDraft(): StagedDraft | null {
    return this.draft;
  }

  /** Keep (or with null, drop) the unsaved staged choice. */
  saveDraft(d: StagedDraft | null): void {
    if (d === null && this.draft === null) return;
    this.draft = d;
    void this.db.putSetting('draft', d).catch(() => undefined);
  }

  dismissPersistError(): void {
    this.persistError = null;
    this.flush();
  }

  /** Take files out of the batch (e.g. files that could not be read); they can be dropped in again. */
  async removeFiles(keys: readonly string[]): Promise<void> {
    const gone = new Set(keys.filter((k) => this.rowsByKey.has(k)));
    if (!gone.size) return;
    // A multi-object file whose last spectrum goes is forgotten with it (its entry holds the bytes).
    const files = new Set([...gone].map((k) => this.rowsByKey.get(k)!.bytesKey).filter((k): k is string => k !== undefined));
    for (const r of this.rowsByKey.values()) if (r.bytesKey && !gone.has(r.key)) files.delete(r.bytesKey);
    try {
      await this.db.removeFiles([...gone, ...files]);
    } finally {
      for (const k of files) this.splitFiles.delete(k);
      for (const k of gone) this.rowsByKey.delete(k);
      this.order = this.order.filter((k) => !gone.has(k));
      if (this.draft && gone.has(this.draft.key)) this.draft = null;
      this.flush();
    }
  }

  /** Forget the batch (settings stay). */
  async clearBatch(): Promise<void> {
    await this.forgetBatch();
    this.flush();
  }

  private async forgetBatch(): Promise<void> {
    this.abort?.abort();
    await this.db.clearBatch();
    this.rowsByKey.clear();
    this.splitFiles.clear();
    this.order = [];
    this.nextOrder = 0;
    this.progress = EMPTY_PROGRESS;
    this.draft = null;
    this.team = null;
    await this.db.putSetting('team', null).catch(() => undefined);
  }

  /** The review packet this batch came from, or null. */
  teamTag(): TeamTag | null {
    return this.team;
  }

  /** Remember the packet this batch came from (kept in the browser and written into saved sessions). */
  async setTeamTag(tag: TeamTag | null): Promise<void> {
    this.team = tag;
    await this.db.putSetting('team', tag);
  }

  /**
   * Replace the batch by a session file: checked first (nothing is forgotten
   * when the file is refused), then the batch is forgotten and the file
   * loaded, shown in one step.
   */
  async replaceWithSession(text: string): Promise<{ ok: true; plan: ImportPlan } | { ok: false; problems: string[] }> {
    const parsed = parseSession(text);
    if (!parsed.ok) return parsed;
    await this.forgetBatch();
    const plan = planImport(new Map(), parsed.session);
    await this.applyImport(plan);
    return { ok: true, plan };
  }

  // ---- session file --------------------------------------------------

  /** The session as one JSON text; with `includeSpectra` the raw files ride along (larger). */
  async exportSession(includeSpectra: boolean): Promise<string> {
    const entries: SessionFile['entries'] = [];
    for (const key of this.order) {
      const row = this.rowsByKey.get(key)!;
      const result = (await this.db.getResult(key)) ?? null;
      const e: SessionFile['entries'][number] = { key, file: row.file, order: row.order, result, decision: row.decision ?? null };
      if (includeSpectra && row.hasBytes) {
        // A spectrum of a multi-object file carries its whole file (the reader picks its row by the #n of its name).
        const bytes = await this.getBytes(key);
        if (bytes) e.bytes = bytes;
      }
      entries.push(e);
    }
    return encodeSession({
      format: SESSION_FORMAT,
      version: SESSION_VERSION,
      exportedAt: new Date().toISOString(),
      software: SOFTWARE_NAME_VERSION,
      reviewer: this.reviewer ?? '',
      cosmology: this.cosmology,
      entries,
      ...(this.team ? { team: this.team } : {}),
    });
  }

  /** Check a session file and work out what importing it would do; nothing is changed yet. */
  planSessionImport(text: string): { ok: true; plan: ImportPlan; session: SessionFile } | { ok: false; problems: string[] } {
    const parsed = parseSession(text);
    if (!parsed.ok) return parsed;
    const existing = new Map<string, { hasBytes: boolean; decision?: ReviewDecision }>();
    for (const [k, r] of this.rowsByKey) existing.set(k, { hasBytes: r.hasBytes, decision: r.decision });
    return { ok: true, plan: planImport(existing, parsed.session), session: parsed.session };
  }

  /**
   * Carry out an import plan. `takeConflicts` lists the keys whose incoming
   * (older or different) decision the reviewer chose to take over their own.
   */
  async applyImport(plan: ImportPlan, takeConflicts: ReadonlySet<string> = new Set()): Promise<void> {
    const sorted = [...plan.newEntries].sort((a, b) => a.order - b.order);
    const records = sorted.map((e) => ({
      entry: {
        key: e.key,
        file: e.file,
        order: this.nextOrder++,
        sizeBytes: e.bytes?.length ?? 0,
        addedAt: new Date().toISOString(),
        hasBytes: !!e.bytes,
      } satisfies EntryRecord,
      bytes: e.bytes ?? null,
    }));
    await this.db.addFiles(records);
    const refit: string[] = [];
    for (let i = 0; i < sorted.length; i++) {
      const e = sorted[i];
      const entry = records[i].entry;
      let summary: ResultSummary | undefined;
      if (e.result) summary = await this.db.putResult(e.key, e.result);
      else if (e.bytes) refit.push(e.key);
      const status: RowStatus = summary ? statusOf(summary) : e.bytes ? 'waiting' : 'cancelled';
      this.setRow({ key: e.key, file: e.file, order: entry.order, hasBytes: entry.hasBytes, status, summary });
    }
    for (const e of plan.bytesToAttach) {
      if (!e.bytes) continue;
      await this.db.attachBytes(e.key, e.bytes);
      const r = this.rowsByKey.get(e.key);
      if (r) this.setRow({ ...r, hasBytes: true });
    }
    const decisions = [...plan.decisions, ...plan.conflicts.filter((c) => takeConflicts.has(c.key)).map((c) => ({ key: c.key, decision: c.theirs }))];
    for (const { key, decision } of decisions) {
      await this.db.putDecision(key, decision);
      const r = this.rowsByKey.get(key);
      if (r) this.setRow({ ...r, decision });
    }
    this.flush();
    if (refit.length) void this.fitKeys(refit);
  }
}

function statusOf(s: ResultSummary): RowStatus {
  return s.status === 'ok' ? 'ok' : s.status;
}

function isValidCosmology(p: CosmologyParams): boolean {
  try {
    checkCosmology(p);
    return true;
  } catch {
    return false;
  }
}
