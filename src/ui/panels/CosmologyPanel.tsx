/** The cosmology used for derived quantities and exports; checked by core before it is kept. */
import { useState } from 'react';
import type { CosmologyParams } from '../../core/types';
import { DEFAULT_COSMOLOGY, checkCosmology, describeCosmology } from '../../core/cosmology';
import { Overlay } from './Overlay';

const FIELDS: { k: keyof CosmologyParams; label: string; step: string }[] = [
  { k: 'h0', label: 'H0 (km/s/Mpc)', step: '0.1' },
  { k: 'omegaM', label: 'Ω_m (matter)', step: '0.001' },
  { k: 'omegaK', label: 'Ω_k (curvature, 0 = flat)', step: '0.001' },
  { k: 'omegaR', label: 'Ω_r (radiation)', step: '0.00001' },
];

export function CosmologyPanel({ value, onSave, onClose }: { value: CosmologyParams; onSave: (p: CosmologyParams) => void; onClose: () => void }) {
  const [text, setText] = useState<Record<keyof CosmologyParams, string>>({
    h0: String(value.h0),
    omegaM: String(value.omegaM),
    omegaK: String(value.omegaK),
    omegaR: String(value.omegaR),
  });
  const parsed: CosmologyParams = { h0: Number(text.h0), omegaM: Number(text.omegaM), omegaK: Number(text.omegaK), omegaR: Number(text.omegaR) };
  let problem: string | null = null;
  try {
    if (Object.values(text).some((t) => t.trim() === '')) throw new Error('every field needs a number');
    checkCosmology(parsed);
  } catch (e) {
    problem = (e as Error).message;
  }
  return (
    <Overlay title="Cosmology" onClose={onClose} testId="cosmology-panel">
      <p>
        Defaults: {describeCosmology(DEFAULT_COSMOLOGY)} (a round-number convention, not a measurement). Ω_Λ follows as 1 − Ω_m − Ω_k − Ω_r.
        The model is written into every export.
      </p>
      <form
        onSubmit={(e) => {
          e.preventDefault();
          if (!problem) onSave(parsed);
        }}
      >
        {FIELDS.map((f) => (
          <label key={f.k} className="field">
            {f.label}
            <input type="number" step={f.step} value={text[f.k]} onChange={(e) => setText({ ...text, [f.k]: e.target.value })} aria-label={f.label} />
          </label>
        ))}
        {problem ? (
          <p className="caution" role="alert">
            {problem}
          </p>
        ) : (
          <p className="muted">{describeCosmology(parsed)}</p>
        )}
        <button type="submit" className="primary" disabled={!!problem}>
          Use this cosmology
        </button>
        <button type="button" onClick={() => setText({ h0: String(DEFAULT_COSMOLOGY.h0), omegaM: String(DEFAULT_COSMOLOGY.omegaM), omegaK: String(DEFAULT_COSMOLOGY.omegaK), omegaR: String(DEFAULT_COSMOLOGY.omegaR) })}>
          Back to defaults
        </button>
      </form>
    </Overlay>
  );
}
