/**
 * After a click on a feature: the catalogue lines it could be, with the
 * redshift each implies and how many other catalogue lines would then fall
 * on real features, best first. Number keys or arrows + Enter choose.
 */
import { useEffect, useRef, useState, type KeyboardEvent } from 'react';
import type { LineSuggestion } from '../../core/engine/identify';
import type { ChiSquareCurve } from '../../core/types';
import { deltaChi2At } from '../../core/engine/curveAt';
import type { FeatureAnswer } from '../../worker/fitWorkerApi';
import { fmtNum, fmtZ } from '../format';

export type RankedSuggestion = LineSuggestion & { fitDeltaChi2: number };

/**
 * Best first. With the automatic fit's chi-square curves: the lowest fit
 * delta chi-square at the implied z first (the whole template fits there),
 * then more supporting lines; without curves: more supporting lines first,
 * the engine's order among equals.
 */
export function rankSuggestions(s: readonly LineSuggestion[], curves: readonly ChiSquareCurve[] = []): RankedSuggestion[] {
  const withFit = s.map((x, i) => ({ x: { ...x, fitDeltaChi2: deltaChi2At(curves, x.z) }, i }));
  const fitKey = (v: number) => (Number.isFinite(v) ? v : Infinity);
  return withFit
    .sort((a, b) => fitKey(a.x.fitDeltaChi2) - fitKey(b.x.fitDeltaChi2) || b.x.supporting - a.x.supporting || a.i - b.i)
    .map((o) => o.x);
}

export interface LineNamingListProps {
  answer: FeatureAnswer;
  onChoose: (s: LineSuggestion) => void;
  onClose: () => void;
  busy?: boolean;
  /** The automatic fit's chi-square curves, to rank the lines by fit quality at their z. */
  curves?: readonly ChiSquareCurve[];
}

export function LineNamingList({ answer, onChoose, onClose, busy = false, curves = [] }: LineNamingListProps) {
  const ranked = rankSuggestions(answer.suggestions, curves);
  const [active, setActive] = useState(0);
  const list = useRef<HTMLUListElement>(null);
  useEffect(() => {
    setActive(0);
    list.current?.focus();
  }, [answer]);

  if (!answer.feature) {
    return (
      <section className="line-naming" aria-label="Name a line" data-testid="line-naming">
        <p>No clear feature there. Click closer to a peak or dip, or type another wavelength.</p>
        <button type="button" onClick={onClose}>
          Close
        </button>
      </section>
    );
  }
  const f = answer.feature;
  const onKey = (e: KeyboardEvent) => {
    if (e.key === 'ArrowDown') setActive((a) => Math.min(ranked.length - 1, a + 1));
    else if (e.key === 'ArrowUp') setActive((a) => Math.max(0, a - 1));
    else if (e.key === 'Enter' && ranked[active]) onChoose(ranked[active]);
    else if (/^[1-9]$/.test(e.key) && ranked[Number(e.key) - 1]) onChoose(ranked[Number(e.key) - 1]);
    else if (e.key === 'Escape') onClose();
    else return;
    e.preventDefault();
    e.stopPropagation();
  };
  return (
    <section className="line-naming" aria-label="Name a line" data-testid="line-naming">
      <p>
        {f.kind === 'emission' ? 'Emission' : 'Absorption'} feature at {fmtNum(f.centreA, 1)} ± {fmtNum(f.centreErrA, 1)} Å (S/N{' '}
        {fmtNum(f.snr, 1)}). Which line is it?
      </p>
      {ranked.length === 0 ? (
        <p>
          No catalogue {f.kind === 'emission' ? 'emission' : 'absorption'} line puts this feature at a positive redshift.
          {f.kind === 'absorption' ? ' A wide trough on the blue side of a broad emission line is often outflow absorption (BAL): flag it (w) instead of naming it.' : ''}
        </p>
      ) : (
        <ul role="listbox" aria-label="Possible lines" tabIndex={0} ref={list} onKeyDown={onKey} aria-activedescendant={`line-option-${active}`} aria-busy={busy}>
          {ranked.slice(0, 20).map((s, i) => (
            <li
              key={`${s.lineId}-${i}`}
              id={`line-option-${i}`}
              role="option"
              aria-selected={i === active}
              className={i === active ? 'current' : undefined}
              onClick={() => onChoose(s)}
              data-testid="line-option"
            >
              <span className="opt-key">{i < 9 ? i + 1 : ''}</span>
              <span className="opt-label">{s.label}</span>
              <span className="opt-rest">{fmtNum(s.restA, 1)} Å</span>
              <span className="opt-z">z = {fmtZ(s.z)}</span>
              <span className="opt-support" title="A quick test at the catalogue positions, not a fit: a line it misses can still be there. Check the spectrum.">
                {s.supporting === 0 ? 'quick check: no other line found' : `quick check: ${s.supporting} other line${s.supporting === 1 ? '' : 's'} found`}
              </span>
              {Number.isFinite(s.fitDeltaChi2) ? <span className="opt-fit">fit Δχ² {fmtNum(s.fitDeltaChi2, 1)}</span> : null}
            </li>
          ))}
        </ul>
      )}
      <button type="button" onClick={onClose}>
        Cancel
      </button>
    </section>
  );
}
