/**
 * FitWorkspace: everything a thread reuses from fit to fit (FFT plans, the
 * template side of the scan's correlations, binned template vectors), owned by the
 * caller (one per browser worker or CLI thread, or one per test) and passed
 * down. Nothing in the engine keeps state of its own.
 */
import { CorrelationPlan, type HalfSpectrum } from './fftCorrelate';
import type { DataSpectra, ScanData, TemplateSpectra } from './kernels/correlationSums';
import type { Family } from './family';

/** Template transforms kept (each family x window x FFT size); the least recently used goes first. */
const TEMPLATE_CACHE_MAX = 24;

export class FitWorkspace {
  private readonly plans = new Map<number, CorrelationPlan>();
  private readonly templates = new Map<string, TemplateSpectra>();
  /** Data transforms of the spectrum being fitted (keyed by its ScanData object; dropped with it). */
  private dataOwner: ScanData | null = null;
  private readonly dataByL = new Map<number, DataSpectra>();
  /** Arrays for the data side's half spectra, by FFT size (the current spectrum's; see dataSpectra). */
  private readonly halves = new Map<number, HalfSpectrum[]>();
  /** Scratch for the weighted columns of one full-model evaluation (model.ts), grown as needed. */
  private model = new Float64Array(0);
  /** One buffer for the per-shift sums of the scan being read (correlationSums), grown as needed. */
  private sums = new Float64Array(0);
  /** Binned copies of family vectors, by family object and binning. */
  private readonly binned = new WeakMap<Family, Map<string, { kStart: number; vectors: Float64Array[] }>>();

  plan(L: number): CorrelationPlan {
    let p = this.plans.get(L);
    if (!p) {
      p = new CorrelationPlan(L);
      this.plans.set(L, p);
    }
    return p;
  }

  templateSpectra(key: string, build: () => TemplateSpectra): TemplateSpectra {
    let t = this.templates.get(key);
    if (t) {
      this.templates.delete(key);
      this.templates.set(key, t);
      return t;
    }
    t = build();
    this.templates.set(key, t);
    if (this.templates.size > TEMPLATE_CACHE_MAX) this.templates.delete(this.templates.keys().next().value as string);
    return t;
  }

  dataSpectra(data: ScanData, L: number, build: () => DataSpectra): DataSpectra {
    if (this.dataOwner !== data) {
      this.dataOwner = data;
      this.dataByL.clear();
    }
    let d = this.dataByL.get(L);
    if (!d) {
      d = build();
      this.dataByL.set(L, d);
    }
    return d;
  }

  /**
   * Room for `length` per-shift sums, reused from scan to scan: the sums are
   * read once, right after they are made, and reusing one buffer spares the
   * garbage collector tens of arrays per fit. Valid until the next call.
   */
  sumsBuffer(length: number): Float64Array {
    if (this.sums.length < length) this.sums = new Float64Array(Math.max(length, 2 * this.sums.length));
    return this.sums;
  }

  /** Room for `length` weighted model columns, reused by every full-model evaluation (each reads it only while it runs). */
  modelBuffer(length: number): Float64Array {
    if (this.model.length < length) this.model = new Float64Array(Math.max(length, 2 * this.model.length));
    return this.model;
  }

  /**
   * `count` half-spectrum arrays for FFT size L, reused from spectrum to
   * spectrum: only the data transforms of the spectrum being fitted use them
   * (dataSpectra keeps one spectrum's at a time, and a new spectrum's
   * overwrite them).
   */
  halfSpectra(L: number, count: number): HalfSpectrum[] {
    let h = this.halves.get(L);
    if (!h) {
      h = [];
      this.halves.set(L, h);
    }
    while (h.length < count) h.push(new Float64Array(L + 2));
    return h;
  }

  /** Forget the last spectrum's data transforms (call when a fit ends). */
  releaseData(): void {
    this.dataOwner = null;
    this.dataByL.clear();
  }

  binnedVectors(f: Family, which: 'scan' | 'full', factor: number, build: () => { kStart: number; vectors: Float64Array[] }) {
    let m = this.binned.get(f);
    if (!m) {
      m = new Map();
      this.binned.set(f, m);
    }
    const key = `${which}|${factor}`;
    let v = m.get(key);
    if (!v) {
      v = build();
      m.set(key, v);
    }
    return v;
  }
}

export type { HalfSpectrum };
