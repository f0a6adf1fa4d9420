/**
 * Review of one spectrum: the data and fit, the fit quality against z, the
 * candidates, naming a line, a typed z, the decision, the line table and
 * derived quantities. State and worker calls live in useReviewSession; this
 * component lays the parts out and takes the keys the workbench passes on
 * through `handle`. Every number comes from the worker (core).
 */
import { useImperativeHandle, useRef, useState, type Ref } from 'react';
import type { CosmologyParams } from '../../core/types';
import type { Row } from '../state/session';
import type { ActionId } from '../keys/keyMap';
import { SpectrumView } from '../plots';
import { LineNamingList } from './LineNamingList';
import { LineTable } from './LineTable';
import { DerivedPanel } from './DerivedPanel';
import { PlotTools } from './PlotTools';
import { DecisionBox } from './DecisionBox';
import { CandidatesSection } from './CandidatesSection';
import { SolutionLine, isAutoShown } from './SolutionLine';
import { markersFor, SKY } from './markers';
import { nextGrade, type DecisionDraft } from './solution';
import { flagByKey } from './flags';
import { useReviewSession } from './useReviewSession';
import { fmtNum, fmtRangeA, fmtZ } from '../format';
import { QuasarPhysicsBox } from '../physics/QuasarPhysicsBox';

/** Plain words for the engine's mask reasons (src/core/engine/artifacts.ts). */
const MASK_REASON_WORDS: Record<string, string> = {
  'identical-run': 'in runs of one repeated value',
  'roll-off': 'of roll-off beside a dead end',
  edge: 'at the ends',
  'edge-step': 'in a step at an end',
  negative: 'far below zero',
};

export interface ReviewHandle {
  /** Run a key action; true when the panel used it. */
  handle(action: ActionId, key: string): boolean;
}

export interface ReviewPanelProps {
  row: Row;
  cosmology: CosmologyParams;
  onDecision: (draft: DecisionDraft) => void;
  onReopen: () => void;
  ref?: Ref<ReviewHandle>;
}

export function ReviewPanel({ row, cosmology, onDecision, onReopen, ref }: ReviewPanelProps) {
  const rs = useReviewSession({ row, onDecision });
  const { solution, result, spec, naming } = rs;
  const [smoothingPx, setSmoothingPx] = useState(1);
  const [troughsA, setTroughsA] = useState<[number, number][]>([]);
  const [physicsCurve, setPhysicsCurve] = useState<Float64Array | null>(null);
  const zInput = useRef<HTMLInputElement>(null);
  const lambdaInput = useRef<HTMLInputElement>(null);
  const noteInput = useRef<HTMLTextAreaElement>(null);
  const plotBox = useRef<HTMLDivElement>(null);

  useImperativeHandle(
    ref,
    () => ({
      handle(action, k) {
        switch (action) {
          case 'accept':
            rs.accept();
            return true;
          case 'reject':
            rs.reject();
            return true;
          case 'reopen':
            onReopen();
            return true;
          case 'candidate':
            rs.pickKey(Number(k));
            return true;
          case 'bestOfClass':
            rs.pickClass(k === 'Q' ? 'qso' : k === 'G' ? 'galaxy' : 'star');
            return true;
          case 'refine':
            void rs.refineShown();
            return true;
          case 'compare':
            rs.cycleCompare();
            return true;
          case 'flag': {
            const f = flagByKey(k);
            if (f) rs.toggle(f.id);
            return !!f;
          }
          case 'typeZ':
            zInput.current?.focus();
            zInput.current?.select();
            return true;
          case 'nameLine':
            lambdaInput.current?.focus();
            lambdaInput.current?.select();
            return true;
          case 'grade':
            rs.setGrade((g) => nextGrade(g));
            return true;
          case 'note':
            noteInput.current?.focus();
            return true;
          case 'focusPlot':
            plotBox.current?.querySelector<HTMLElement>('[tabindex]')?.focus();
            return true;
          case 'escape':
            if (naming) {
              rs.closeNaming();
              return true;
            }
            if (rs.compare) {
              rs.stopCompare();
              return true;
            }
            return false;
          default:
            return false;
        }
      },
    }),
    [rs, onReopen, naming],
  );

  const decided = row.decision && row.decision.state !== 'unreviewed' ? row.decision : null;
  const summary = row.summary;
  // A file that could not be read or fitted: its error once, and only what can be done with it (reject it, or remove it from the list).
  const failed = row.status === 'failed' || row.status === 'timeout';
  const compared = rs.compare ? result?.candidates[rs.compare.index] : undefined;
  const compareKey = rs.compare ? rs.keyed.indexOf(rs.compare.index) + 1 : 0;
  const specError = spec.kind === 'error' && !(failed && summary?.error && summary.error === spec.message) ? spec.message : null;

  return (
    <section className="review-panel" aria-label="Review" data-testid="review-panel">
      <header className="review-head">
        <h2 data-testid="review-title">{summary?.objectId || row.file}</h2>
        {summary?.objectId ? <span className="muted">{row.file}</span> : null}
        {summary && summary.nPix > 0 && (
          <span className="muted">
            {summary.nPix} pixels, {fmtRangeA(summary.lambdaMinA, summary.lambdaMaxA)}
          </span>
        )}
        {result?.masked && result.masked.length > 0 && (
          <span className="muted" data-testid="review-masked" title="Input pixels the engine masked before fitting, by reason">
            masked before the fit: {result.masked.map((m) => `${m.pixels} ${MASK_REASON_WORDS[m.reason] ?? m.reason}`).join(', ')}
          </span>
        )}
      </header>

      <SolutionLine solution={solution} decided={decided} summary={summary} keyed={rs.keyed} onRefine={solution && rs.ready ? () => void rs.refineShown() : undefined} />

      {row.status !== 'ok' && summary?.error && (
        <p className="error-text" role="alert" data-testid="review-error">
          {summary.error}
        </p>
      )}
      {rs.message && (
        <p className="caution" role="status">
          {rs.message}
        </p>
      )}
      {rs.busy && (
        <p className="muted" role="status">
          {rs.busy}
        </p>
      )}

      {compared && (
        <p className="compare-note" data-testid="compare-note">
          Comparing with candidate {compareKey}: z = {fmtZ(compared.z, 5)} {compared.class} — its model dashed, its lines as ticks from the bottom. <kbd>o</kbd> next,{' '}
          <kbd>Esc</kbd> off.
        </p>
      )}
      <div className="plot-box" ref={plotBox}>
        {spec.kind === 'ready' ? (
          <SpectrumView
            wavelengthA={spec.spectrum.wavelengthA}
            flux={spec.spectrum.flux}
            ivar={spec.spectrum.ivar}
            mask={spec.spectrum.mask}
            model={rs.model}
            z={solution ? solution.z : null}
            markers={markersFor(solution?.cls)}
            skyRegions={troughsA.length ? [...SKY, ...troughsA.map(([fromA, toA]) => ({ label: 'C IV trough', fromA, toA }))] : SKY}
            smoothingPx={smoothingPx}
            height={300}
            onFeatureClick={(a) => void rs.nameFeatureAt(a)}
            highlightA={naming?.answer?.feature?.centreA ?? naming?.clickA ?? null}
            resetKey={row.key}
            fluxUnit={spec.spectrum.meta.fluxUnit}
            compare={compared ? { z: compared.z, markers: markersFor(compared.class), model: rs.compare?.model ?? null } : null}
            physicsModel={physicsCurve}
          />
        ) : spec.kind === 'loading' ? (
          <p className="muted">Opening the spectrum…</p>
        ) : spec.kind === 'missing' ? (
          <p className="muted">The raw file is not stored in this session (it was imported without spectra). Drop the file again to see it.</p>
        ) : specError ? (
          <p className="error-text">{specError}</p>
        ) : null}
      </div>

      {!failed && (
      <PlotTools
        smoothingPx={smoothingPx}
        onSmoothing={setSmoothingPx}
        ready={rs.ready}
        typedA={rs.typedA}
        onTypedA={rs.setTypedA}
        onNameAt={(a) => void rs.nameFeatureAt(a)}
        typedZ={rs.typedZ}
        onTypedZ={rs.setTypedZ}
        refine={rs.refine}
        onRefine={rs.setRefine}
        onSubmitZ={rs.submitTypedZ}
        lambdaRef={lambdaInput}
        zRef={zInput}
      />
      )}

      {naming &&
        (naming.answer ? (
          <LineNamingList answer={naming.answer} onChoose={rs.chooseLine} onClose={rs.closeNaming} busy={rs.busy !== null} curves={result?.curves ?? []} />
        ) : (
          <p className="muted" role="status">
            Looking for a feature near {fmtNum(naming.clickA, 1)} Å…
          </p>
        ))}

      <div className="review-columns">
        {failed ? (
          <p className="muted">No fit, so no redshift to review: reject the file as unusable (x) to record that, or remove the failed files from the batch (toolbar).</p>
        ) : (
        <CandidatesSection
          result={result}
          currentZ={solution?.z ?? null}
          selected={solution?.candidateIndex ?? null}
          onPick={rs.pickCandidate}
          onPickZ={(z) => void rs.refitAt(z, 'refit')}
          keyed={rs.keyed}
        />
        )}
        <DecisionBox
          grade={rs.grade}
          onGrade={rs.setGrade}
          note={rs.note}
          onNote={rs.setNote}
          noteRef={noteInput}
          flags={rs.flags}
          onToggleFlag={rs.toggle}
          canAccept={!!solution}
          acceptLabel={isAutoShown(solution) || !solution ? 'Accept' : 'Accept change'}
          onAccept={rs.accept}
          onReject={rs.reject}
          onUndo={decided ? onReopen : undefined}
        />
      </div>

      {!failed && (
        <>
          <h3>Lines at this redshift</h3>
          {solution ? <LineTable lines={solution.lines} /> : <p className="muted">No redshift.</p>}
          <DerivedPanel z={solution?.z ?? null} cls={solution?.cls ?? 'unknown'} cosmology={cosmology} reviewed={!!decided} />
          <QuasarPhysicsBox rowKey={row.key} z={solution?.z ?? null} cls={solution?.cls ?? 'unknown'} ready={spec.kind === 'ready'} cosmology={cosmology} onTroughs={setTroughsA} onUseZ={(z) => void rs.refitAt(z, 'refit')} wavelengthA={spec.kind === 'ready' ? spec.spectrum.wavelengthA : null} onCurve={setPhysicsCurve} />
        </>
      )}
    </section>
  );
}
