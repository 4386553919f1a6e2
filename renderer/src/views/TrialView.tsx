/**
 * Trial view: the object's height and velocity with the smoothed estimate and band, measured contact, and
 * each hypothesis' predicted path from the information cutoff; EMG raw and envelope per muscle on the same
 * time axis with the onset, which can be dragged, nudged with the arrow keys, marked invalid or restored
 * (undo/redo). Long EMG is re-decimated for the visible window after every zoom or pan.
 */
import { useCallback, useEffect, useMemo, useRef, useState, type KeyboardEvent } from 'react';
import type { StudyEvaluation, StudySettings } from '../../../shared/analysis/types';
import { Plot } from '../plot/Plot';
import type { ThemeName } from '../plot/palette';
import { hypothesisColour, hypothesisStyleIndex } from '../plot/palette';
import type { TrialDetail } from '../worker/protocol';
import { buildTrialFigure, defaultWindowS } from './trialFigure';
import { fmtMs, fmtS } from './trialRows';

export interface TrialViewProps {
  trialId: string;
  settings: StudySettings;
  evaluation: StudyEvaluation | null;
  theme: ThemeName;
  excludedReason?: string;
  loadDetail: (trialId: string) => Promise<TrialDetail>;
  onMove: (muscle: string, fromS: number | null, toS: number) => void;
  onInvalidate: (muscle: string, fromS: number | null) => void;
  onRestore: (muscle: string, fromS: number | null, automaticS: number | null) => void;
  onUndo: () => void;
  onRedo: () => void;
  canUndo: boolean;
  canRedo: boolean;
  onPrevious: () => void;
  onNext: () => void;
  onError: (err: unknown) => void;
}

export function TrialView(props: TrialViewProps) {
  const [detail, setDetail] = useState<TrialDetail | null>(null);
  const [windowS, setWindowS] = useState<[number, number] | null>(null);
  const [widthPx, setWidthPx] = useState(1100);
  const muscles = props.settings.emgChannels.map((c) => c.muscle);
  const [activeMuscle, setActiveMuscle] = useState<string | null>(muscles[0] ?? null);
  const rootRef = useRef<HTMLElement>(null);

  useEffect(() => {
    let live = true;
    setDetail(null);
    props
      .loadDetail(props.trialId)
      .then((d) => {
        if (!live) return;
        setDetail(d);
        setWindowS(defaultWindowS(d.prepared));
      })
      .catch((err) => live && props.onError(err));
    return () => {
      live = false;
    };
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [props.trialId, props.loadDetail]);

  useEffect(() => {
    if (activeMuscle === null || !muscles.includes(activeMuscle)) setActiveMuscle(muscles[0] ?? null);
  }, [muscles, activeMuscle]);

  const hypothesisIds = useMemo(() => props.settings.hypotheses.map((h) => h.id), [props.settings.hypotheses]);
  const hypothesisLabels = useMemo(() => Object.fromEntries(props.settings.hypotheses.map((h) => [h.id, h.label ?? h.id])), [props.settings.hypotheses]);
  // Plotly keeps a user's shape drags across redraws while `editrevision` stays the same; a new revision
  // after every evaluation and every drag puts each line back where the evaluation says it is (undo, or a
  // drag of a line that is not an onset)
  const [shapeRevision, setShapeRevision] = useState(0);
  useEffect(() => setShapeRevision((r) => r + 1), [props.evaluation]);
  const figure = useMemo(() => {
    if (!detail || !windowS) return null;
    const f = buildTrialFigure(detail, props.evaluation, hypothesisIds, hypothesisLabels, activeMuscle, windowS, widthPx, props.theme);
    return { ...f, layout: { ...f.layout, editrevision: `${props.trialId}:${shapeRevision}` } };
  }, [detail, props.evaluation, props.trialId, hypothesisIds, hypothesisLabels, activeMuscle, windowS, widthPx, props.theme, shapeRevision]);
  const config = useMemo(() => ({ edits: { shapePosition: true }, scrollZoom: false }), []);

  const rows = useMemo(() => props.evaluation?.trials.filter((t) => t.trialId === props.trialId) ?? [], [props.evaluation, props.trialId]);
  const activeRow = rows.find((r) => r.muscle === activeMuscle);

  const onRelayout = useCallback(
    (update: Record<string, unknown>, el: HTMLElement) => {
      if (!figure || !detail) return;
      setWidthPx(el.clientWidth - 90);
      for (const [key, value] of Object.entries(update)) {
        const m = /^shapes\[(\d+)\]\.x0$/.exec(key);
        if (m) {
          setShapeRevision((r) => r + 1);
          const muscle = figure.onsetShapes[Number(m[1])];
          const row = rows.find((r) => r.muscle === muscle);
          if (muscle && typeof value === 'number' && row) {
            setActiveMuscle(muscle);
            props.onMove(muscle, row.onsetS, Math.round(value * 10000) / 10000);
          }
          return;
        }
      }
      const r0 = update['xaxis.range[0]'];
      const r1 = update['xaxis.range[1]'];
      const range = update['xaxis.range'] as [number, number] | undefined;
      if (typeof r0 === 'number' && typeof r1 === 'number') setWindowS([r0, r1]);
      else if (range) setWindowS([Number(range[0]), Number(range[1])]);
      else if (update['xaxis.autorange'] === true) {
        const e = detail.emg[0];
        const last = detail.prepared.timesS[detail.prepared.timesS.length - 1];
        setWindowS([detail.prepared.timesS[0], e ? Math.max(last, e.startS + e.values.length / e.rateHz) : last]);
      }
    },
    [figure, detail, rows, props],
  );

  const nudge = (ms: number) => {
    if (!activeRow || activeMuscle === null) return;
    const from = activeRow.onsetS ?? activeRow.automaticOnsetS;
    if (from === null) return;
    props.onMove(activeMuscle, activeRow.onsetS, Math.round((from + ms / 1000) * 10000) / 10000);
  };

  const onKey = (e: KeyboardEvent<HTMLElement>) => {
    if ((e.target as HTMLElement).tagName === 'INPUT' || (e.target as HTMLElement).tagName === 'SELECT') return;
    if (e.altKey || e.ctrlKey || e.metaKey) return;
    if (e.key === 'ArrowLeft' || e.key === 'ArrowRight') {
      e.preventDefault();
      nudge((e.key === 'ArrowLeft' ? -1 : 1) * (e.shiftKey ? 10 : 1));
    } else if (e.key === 'ArrowDown' || e.key === 'PageDown' || e.key === ']') {
      e.preventDefault();
      props.onNext();
    } else if (e.key === 'ArrowUp' || e.key === 'PageUp' || e.key === '[') {
      e.preventDefault();
      props.onPrevious();
    } else if (e.key === 'i' && activeRow && activeMuscle) props.onInvalidate(activeMuscle, activeRow.onsetS);
    else if (e.key === 'r' && activeRow && activeMuscle) props.onRestore(activeMuscle, activeRow.onsetS, activeRow.automaticOnsetS);
    else if (/^[1-9]$/.test(e.key) && muscles[Number(e.key) - 1]) setActiveMuscle(muscles[Number(e.key) - 1]);
  };

  const trial = detail?.prepared.trial;
  return (
    <section className="view trial" aria-label="Trial view" tabIndex={0} ref={rootRef} onKeyDown={onKey}>
      <div className="toolbar">
        <button onClick={props.onPrevious} title="Previous trial (↑ or [)">
          ◀ Previous
        </button>
        <strong className="trial-title" data-testid="trial-title">
          {props.trialId}
        </strong>
        {trial && (
          <span className="muted">
            subject {trial.subject} · condition {trial.condition}
            {props.excludedReason !== undefined ? ` · excluded: ${props.excludedReason}` : ''}
          </span>
        )}
        <button onClick={props.onNext} title="Next trial (↓ or ])">
          Next ▶
        </button>
        <span className="spacer" />
        <label>
          Muscle{' '}
          <select value={activeMuscle ?? ''} onChange={(e) => setActiveMuscle(e.target.value)} aria-label="Active muscle">
            {muscles.map((m) => (
              <option key={m}>{m}</option>
            ))}
          </select>
        </label>
        <span className="onset-readout" data-testid="onset-readout">
          onset {activeRow?.onsetInvalid ? 'invalid' : `${fmtS(activeRow?.onsetS)} s`}
          {activeRow?.onsetEdited ? ' (edited)' : ''}
        </span>
        <button onClick={() => nudge(-10)} title="Move the onset 10 ms earlier (Shift+←)">
          −10 ms
        </button>
        <button onClick={() => nudge(-1)} title="Move the onset 1 ms earlier (←)">
          −1 ms
        </button>
        <button onClick={() => nudge(1)} title="Move the onset 1 ms later (→)">
          +1 ms
        </button>
        <button onClick={() => nudge(10)} title="Move the onset 10 ms later (Shift+→)">
          +10 ms
        </button>
        <button disabled={!activeRow || activeRow.onsetInvalid} onClick={() => activeRow && activeMuscle && props.onInvalidate(activeMuscle, activeRow.onsetS)} title="Mark the onset invalid (i)">
          Mark invalid
        </button>
        <button disabled={!activeRow?.onsetEdited} onClick={() => activeRow && activeMuscle && props.onRestore(activeMuscle, activeRow.onsetS, activeRow.automaticOnsetS)} title="Restore the automatic onset (r)">
          Restore
        </button>
        <button disabled={!props.canUndo} onClick={props.onUndo} title="Undo (Ctrl+Z)">
          Undo
        </button>
        <button disabled={!props.canRedo} onClick={props.onRedo} title="Redo (Ctrl+Y)">
          Redo
        </button>
      </div>
      {figure ? (
        <Plot
          plotId={`trial-${props.trialId}`}
          label={`Trial ${props.trialId}: height, velocity and EMG against time`}
          data={figure.data}
          layout={figure.layout}
          theme={props.theme}
          config={config}
          onRelayout={onRelayout}
          onDrawn={() => {
            // a stamp per drawn figure, read by the browser benchmark
            document.body.dataset.trialPainted = `${props.trialId}:${performance.now().toFixed(1)}`;
          }}
          className="plot plot-trial"
        />
      ) : (
        <div className="placeholder">Loading trial…</div>
      )}
      <table className="evaluations" aria-label="Predictions for this trial">
        <thead>
          <tr>
            <th scope="col">Muscle</th>
            <th scope="col">Hypothesis</th>
            <th scope="col">Cutoff (s)</th>
            <th scope="col">Predicted arrival (s)</th>
            <th scope="col">SD (ms)</th>
            <th scope="col">TTC at onset (ms)</th>
            <th scope="col">Prediction error (ms)</th>
          </tr>
        </thead>
        <tbody>
          {rows.flatMap((r) =>
            r.hypotheses.map((h) => (
              <tr key={`${r.muscle}-${h.hypothesis}`}>
                <td>{r.muscle}</td>
                <td>
                  <span className="swatch" style={{ background: hypothesisColour(hypothesisStyleIndex(h.hypothesis, hypothesisIds)) }} />
                  {hypothesisLabels[h.hypothesis] ?? h.hypothesis}
                </td>
                <td className="num">{fmtS(h.cutoffS)}</td>
                <td className="num">{fmtS(h.predictedContactS)}</td>
                <td className="num">{fmtMs(h.predictedContactSdMs)}</td>
                <td className="num">{fmtMs(h.ttcMs)}</td>
                <td className="num">{fmtMs(h.predictionErrorMs)}</td>
              </tr>
            )),
          )}
        </tbody>
      </table>
      <p className="hint muted">Drag an onset line, or use ← → (Shift: 10 ms) to nudge it; i marks it invalid, r restores it; ↑ ↓ move between trials; 1–9 pick the muscle.</p>
    </section>
  );
}
