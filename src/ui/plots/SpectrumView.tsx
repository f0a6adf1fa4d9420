/**
 * The spectrum under review: flux (canvas, decimated per pixel column) with its
 * 1-sigma band, masked pixels, model, shifted line markers, night-sky regions,
 * observed and rest wavelength axes. React owns the container; the inside is
 * drawn by SpectrumPlotController, which redraws only layers whose inputs changed.
 */
import { useId, useLayoutEffect, useMemo, useRef, useState, type ReactElement } from 'react';
import { buildDisplaySeries } from './displaySeries';
import { strongestLinesInRange, type LineMarker } from './markerLayout';
import { SpectrumPlotController, type SkyRegion } from './SpectrumPlotController';
import { useElementWidth } from './useElementWidth';
import { PLOT_KEYS } from './viewActions';

export interface SpectrumViewProps {
  /** Observed vacuum wavelength per pixel, Angstrom, ascending. */
  wavelengthA: Float64Array;
  /** Flux density per pixel (NaN allowed). */
  flux: Float64Array;
  /** Inverse variance of flux; null when unknown (no band is drawn). */
  ivar: Float64Array | null;
  /** 1 = bad pixel. */
  mask: Uint8Array;
  /** Model flux on the same wavelength grid. */
  model?: Float64Array | null;
  /** Redshift the markers and the rest-frame axis use; null = none yet (no markers). */
  z: number | null;
  markers: readonly LineMarker[];
  /** Night-sky regions in observed vacuum Angstrom. */
  skyRegions: SkyRegion[];
  /** Boxcar width, pixels (1 = raw). */
  smoothingPx: number;
  /** Height of the plot, CSS px (the jump row and readout add about 50 px). */
  height?: number;
  /** Called with the observed wavelength (Angstrom) under a click that was not a drag. */
  onFeatureClick?: (lambdaA: number) => void;
  /** Observed wavelength to mark (e.g. the feature being identified), Angstrom. */
  highlightA?: number | null;
  /** Change to reset the zoom (e.g. the file name); by default a new wavelength array resets it. */
  resetKey?: string;
  /** Flux unit for the readout and axis title, as the file gives it. */
  fluxUnit?: string;
  /** A second solution to compare with: its model (dashed) and its line markers (ticks from the bottom). */
  compare?: { z: number; markers: readonly LineMarker[]; model: Float64Array | null } | null;
  /** Quasar broad-line fits on the same grid (NaN outside their ranges), drawn in short dashes; null = none. */
  physicsModel?: Float64Array | null;
}

/** Default plot height, CSS px. */
export const SPECTRUM_DEFAULT_HEIGHT_PX = 320;
/** Width used until (or where) the container can be measured, CSS px. */
export const SPECTRUM_FALLBACK_WIDTH_PX = 800;
/** Half-width of the window a jump button shows, rest-frame Angstrom. */
export const JUMP_HALF_WIDTH_REST_A = 60;
/** How many jump buttons at most. */
export const JUMP_MAX_LINES = 6;

const KEY_HINT = PLOT_KEYS.map((k) => `${k.keys.join('/')}: ${k.action.toLowerCase()}`).join('; ');

export function SpectrumView(props: SpectrumViewProps): ReactElement {
  const { wavelengthA, flux, ivar, mask, model = null, z, markers, skyRegions, smoothingPx, onFeatureClick } = props;
  const height = props.height ?? SPECTRUM_DEFAULT_HEIGHT_PX;
  const highlightA = props.highlightA ?? null;
  const [containerRef, width] = useElementWidth<HTMLDivElement>(SPECTRUM_FALLBACK_WIDTH_PX);
  const canvasRef = useRef<HTMLCanvasElement>(null);
  const svgRef = useRef<SVGSVGElement>(null);
  const readoutRef = useRef<HTMLDivElement>(null);
  const ctrlRef = useRef<SpectrumPlotController | null>(null);
  const [ctrl, setCtrl] = useState<SpectrumPlotController | null>(null);
  const clipId = 'sm-clip-' + useId().replace(/[^a-zA-Z0-9_-]/g, '');

  // Smoothing and masking: once per data or smoothing change, never on a pan or hover.
  const series = useMemo(() => buildDisplaySeries(wavelengthA, flux, ivar, mask, smoothingPx), [wavelengthA, flux, ivar, mask, smoothingPx]);
  const fullA = useMemo<[number, number]>(() => [wavelengthA[0] ?? 0, wavelengthA[wavelengthA.length - 1] ?? 0], [wavelengthA]);
  const jumpLines = useMemo(() => strongestLinesInRange(markers, z, fullA[0], fullA[1], JUMP_MAX_LINES), [markers, z, fullA]);

  useLayoutEffect(() => {
    const c = new SpectrumPlotController(canvasRef.current!, svgRef.current!, readoutRef.current, clipId);
    ctrlRef.current = c;
    setCtrl(c);
    return () => {
      c.destroy();
      ctrlRef.current = null;
    };
  }, [clipId]);

  useLayoutEffect(() => {
    ctrlRef.current?.setData(series, model);
  }, [ctrl, series, model]);

  useLayoutEffect(() => {
    const dpr = typeof window !== 'undefined' && window.devicePixelRatio > 0 ? window.devicePixelRatio : 1;
    ctrlRef.current?.setSize(width, height, dpr);
  }, [ctrl, width, height]);

  const compareZ = props.compare?.z ?? null;
  const compareMarkers = props.compare?.markers ?? null;
  const compareModel = props.compare?.model ?? null;
  useLayoutEffect(() => {
    ctrlRef.current?.setOverlays({
      z,
      markers,
      skyRegions,
      highlightA,
      fluxUnit: props.fluxUnit,
      compare: compareZ !== null && compareMarkers ? { z: compareZ, markers: compareMarkers } : null,
    });
  }, [ctrl, z, markers, skyRegions, highlightA, props.fluxUnit, compareZ, compareMarkers]);

  useLayoutEffect(() => {
    ctrlRef.current?.setCompareModel(compareModel);
  }, [ctrl, series, compareModel]);

  const physicsModel = props.physicsModel ?? null;
  useLayoutEffect(() => {
    ctrlRef.current?.setPhysicsModel(physicsModel);
  }, [ctrl, series, physicsModel]);

  useLayoutEffect(() => {
    ctrlRef.current?.setOnFeatureClick(onFeatureClick);
  }, [ctrl, onFeatureClick]);

  const resetOn = props.resetKey ?? wavelengthA;
  useLayoutEffect(() => {
    ctrlRef.current?.resetView();
  }, [ctrl, resetOn]);

  // Last: one redraw of whatever the effects above marked dirty.
  useLayoutEffect(() => {
    ctrlRef.current?.flush();
  });

  const zoomToLine = (observedA: number) => {
    const half = JUMP_HALF_WIDTH_REST_A * (1 + (z ?? 0));
    ctrlRef.current?.setView(observedA - half, observedA + half);
  };

  return (
    <div ref={containerRef} className="sm-spectrum" style={{ width: '100%' }}>
      <div className="sm-jump-row" role="toolbar" aria-label="Zoom to a line" style={{ display: 'flex', gap: 4, flexWrap: 'wrap', minHeight: 24, alignItems: 'center', fontSize: 12 }}>
        {jumpLines.length > 0 && <span style={{ color: '#555' }}>Zoom to:</span>}
        {jumpLines.map((m) => (
          <button
            key={m.id}
            type="button"
            data-line-id={m.id}
            title={`Show ±${JUMP_HALF_WIDTH_REST_A} Å (rest) around ${m.label}, observed at ${m.observedA.toFixed(1)} Å`}
            onClick={() => zoomToLine(m.observedA)}
          >
            {m.label}
          </button>
        ))}
        <button type="button" onClick={() => ctrlRef.current?.resetView()} title="Show the whole spectrum (key 0)">
          Whole spectrum
        </button>
      </div>
      <div style={{ position: 'relative', width, height }}>
        <canvas ref={canvasRef} style={{ position: 'absolute', left: 0, top: 0, width, height }} aria-hidden="true" />
        <svg
          ref={svgRef}
          tabIndex={0}
          role="group"
          aria-roledescription="spectrum plot"
          aria-label={`Spectrum plot. ${KEY_HINT}. Click a feature to identify it.`}
          style={{ position: 'absolute', left: 0, top: 0, cursor: 'crosshair', touchAction: 'none' }}
          width={width}
          height={height}
        />
      </div>
      {/* Written by the controller on pointer moves, so hovering never re-renders React. */}
      <div ref={readoutRef} className="sm-readout" aria-live="off" style={{ fontSize: 12, fontVariantNumeric: 'tabular-nums', minHeight: 18, color: '#333' }} />
    </div>
  );
}
