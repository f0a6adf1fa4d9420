/** Under the spectrum: smoothing, naming a line at a typed wavelength, and a typed redshift. */
import type { Ref } from 'react';

export const SMOOTHING_PX = [1, 3, 5, 9, 15];

export interface PlotToolsProps {
  smoothingPx: number;
  onSmoothing: (px: number) => void;
  ready: boolean;
  typedA: string;
  onTypedA: (s: string) => void;
  /** Look for a feature at this observed wavelength (Angstrom). */
  onNameAt: (a: number) => void;
  typedZ: string;
  onTypedZ: (s: string) => void;
  refine: boolean;
  onRefine: (b: boolean) => void;
  /** Submit the typed redshift; true when it was taken. */
  onSubmitZ: () => boolean;
  lambdaRef?: Ref<HTMLInputElement>;
  zRef?: Ref<HTMLInputElement>;
}

export function PlotTools(p: PlotToolsProps) {
  return (
    <div className="plot-tools">
      <label>
        Smoothing{' '}
        <select value={p.smoothingPx} onChange={(e) => p.onSmoothing(Number(e.target.value))} aria-label="Smoothing">
          {SMOOTHING_PX.map((s) => (
            <option key={s} value={s}>
              {s === 1 ? 'none' : `${s} px`}
            </option>
          ))}
        </select>
      </label>
      <form
        className="inline-form"
        onSubmit={(e) => {
          e.preventDefault();
          const a = Number(p.typedA);
          if (Number.isFinite(a) && a > 0) p.onNameAt(a);
        }}
      >
        <label>
          Name a line at{' '}
          <input ref={p.lambdaRef} inputMode="decimal" value={p.typedA} onChange={(e) => p.onTypedA(e.target.value)} aria-label="Observed wavelength of a feature (Å)" size={8} />{' '}
          Å
        </label>
        <button type="submit" disabled={!p.ready}>
          Find
        </button>
      </form>
      <form
        className="inline-form"
        onSubmit={(e) => {
          e.preventDefault();
          const input = e.currentTarget.querySelector('input');
          if (p.onSubmitZ()) input?.blur();
        }}
      >
        <label>
          z = <input ref={p.zRef} inputMode="decimal" value={p.typedZ} onChange={(e) => p.onTypedZ(e.target.value)} aria-label="Type a redshift" size={8} />
        </label>
        <label>
          <input type="checkbox" checked={p.refine} onChange={(e) => p.onRefine(e.target.checked)} /> refine near it
        </label>
        <button type="submit">Set z</button>
      </form>
    </div>
  );
}
