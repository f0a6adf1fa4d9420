/**
 * Stand-ins for the canvas plots in jsdom (no canvas there): they show the
 * props the tests check and offer buttons for the plot's callbacks.
 */
export const PLOT_KEYS = [{ keys: ['0'], action: 'Show the whole spectrum' }];

export function SpectrumView(props: {
  z: number | null;
  onFeatureClick?: (a: number) => void;
  wavelengthA: Float64Array;
  compare?: { z: number; model: Float64Array | null } | null;
}) {
  return (
    <div data-testid="spectrum-view" data-z={props.z ?? ''} data-compare-z={props.compare?.z ?? ''} data-compare-model={props.compare?.model ? 'yes' : ''} tabIndex={0}>
      {props.wavelengthA.length} px
      <button type="button" onClick={() => props.onFeatureClick?.(5000)}>
        click feature at 5000
      </button>
    </div>
  );
}

export function FitQualityPlot(props: { onPickZ: (z: number) => void }) {
  return (
    <div data-testid="fit-quality">
      <button type="button" onClick={() => props.onPickZ(2.5)}>
        pick z 2.5
      </button>
    </div>
  );
}
