/**
 * Builds the trial figure's plotly traces, shapes and axes: object height and vertical velocity with the
 * smoothed estimate and its ±2 SD band, measured contact, each hypothesis' predicted path from the
 * information cutoff to its predicted arrival, and one EMG row per muscle (raw, decimated per pixel for
 * the visible window, plus envelope) with its onset as a draggable line. No numerical analysis here: the
 * values come from the worker's prepared trial and evaluation; this only arranges them for plotting.
 */
import type { PlotData, Layout } from 'plotly.js-dist-min';
import type { PreparedTrial, StudyEvaluation } from '../../../shared/analysis/types';
import { minMaxDecimate } from '../../../shared/plot/minMaxDecimate';
import { HYPOTHESIS_DASHES, THEMES, hypothesisColour, hypothesisStyleIndex, type ThemeName } from '../plot/palette';
import type { TrialDetail } from '../worker/protocol';

/** Which shape index belongs to which muscle's onset line (for drag events). */
export interface OnsetShapeMap {
  [shapeIndex: number]: string;
}

export interface TrialFigure {
  data: PlotData[];
  layout: Layout;
  onsetShapes: OnsetShapeMap;
}

const STATE_STRIDE = 3;

/** Default visible window: the motion with some margin, or the whole recording. */
export function defaultWindowS(p: PreparedTrial): [number, number] {
  const t = p.timesS;
  const first = t[0] ?? 0;
  const last = t[t.length - 1] ?? 1;
  if (p.releaseS !== null && p.contactS !== null) return [Math.max(first, p.releaseS - 0.4), Math.min(last, p.contactS + 0.25)];
  return [first, last];
}

function column(state: Float64Array, n: number, col: number, scale = 1): Float64Array {
  const out = new Float64Array(n);
  for (let i = 0; i < n; i++) out[i] = state[i * STATE_STRIDE + col] * scale;
  return out;
}

function sdColumn(cov: Float64Array, n: number, col: number): Float64Array {
  const out = new Float64Array(n);
  for (let i = 0; i < n; i++) out[i] = Math.sqrt(Math.max(0, cov[i * 9 + col * 3 + col]));
  return out;
}

/** A closed polygon for a ±k SD band (x forward along the upper edge, back along the lower). */
function band(x: Float64Array, mean: Float64Array, sd: Float64Array, k: number): { x: number[]; y: number[] } {
  const n = x.length;
  const bx: number[] = new Array(2 * n);
  const by: number[] = new Array(2 * n);
  for (let i = 0; i < n; i++) {
    bx[i] = x[i];
    by[i] = mean[i] + k * sd[i];
    bx[2 * n - 1 - i] = x[i];
    by[2 * n - 1 - i] = mean[i] - k * sd[i];
  }
  return { x: bx, y: by };
}

/**
 * @param detail - prepared trial and raw EMG from the worker
 * @param evaluation - latest study evaluation (for onsets and predictions)
 * @param hypothesisIds - hypotheses in settings order (for colours)
 * @param activeMuscle - muscle whose cutoff drives the predicted paths
 * @param windowS - visible time window (for per-pixel decimation)
 * @param widthPx - plot width in pixels
 * @param theme - colours
 */
export function buildTrialFigure(
  detail: TrialDetail,
  evaluation: StudyEvaluation | null,
  hypothesisIds: string[],
  hypothesisLabels: Record<string, string>,
  activeMuscle: string | null,
  windowS: [number, number],
  widthPx: number,
  theme: ThemeName,
): TrialFigure {
  const p = detail.prepared;
  const c = THEMES[theme];
  const n = p.timesS.length;
  const h = column(p.smoothedState, n, 0);
  const v = column(p.smoothedState, n, 1);
  const hSd = sdColumn(p.smoothedCov, n, 0);
  const vSd = sdColumn(p.smoothedCov, n, 1);
  const muscles = detail.emg.map((e) => e.muscle);
  const rows = 2 + muscles.length;
  const weights = [3, 1.6, ...muscles.map(() => 1.6)];
  const total = weights.reduce((a, b) => a + b, 0);
  const gap = 0.035;
  const usable = 1 - gap * (rows - 1);
  const domains: [number, number][] = [];
  let top = 1;
  for (const w of weights) {
    const height = (usable * w) / total;
    domains.push([Math.max(0, top - height), top]);
    top -= height + gap;
  }
  const axisName = (row: number) => (row === 0 ? 'y' : `y${row + 1}`);
  const data: PlotData[] = [];
  const bandH = band(p.timesS, h, hSd, 2);
  data.push({ type: 'scatter', mode: 'lines', x: bandH.x, y: bandH.y, fill: 'toself', fillcolor: c.band, line: { width: 0 }, hoverinfo: 'skip', name: 'height ±2 SD', legendgroup: 'est', showlegend: true, yaxis: 'y' });
  data.push({ type: 'scatter', mode: 'markers', x: p.timesS, y: p.heightM, marker: { size: 3, color: c.measured }, name: 'measured height', yaxis: 'y', hovertemplate: '%{x:.3f} s<br>%{y:.4f} m<extra>measured</extra>' });
  data.push({ type: 'scatter', mode: 'lines', x: p.timesS, y: h, line: { color: c.text, width: 1.5 }, name: 'smoothed estimate', legendgroup: 'est', yaxis: 'y', hovertemplate: '%{x:.3f} s<br>%{y:.4f} m<extra>smoothed</extra>' });
  data.push({ type: 'scatter', mode: 'lines', x: p.timesS, y: p.targetHeightM, line: { color: c.muted, width: 1, dash: 'dot' }, name: 'target height', yaxis: 'y', hoverinfo: 'skip' });
  const bandV = band(p.timesS, v, vSd, 2);
  data.push({ type: 'scatter', mode: 'lines', x: bandV.x, y: bandV.y, fill: 'toself', fillcolor: c.band, line: { width: 0 }, hoverinfo: 'skip', showlegend: false, yaxis: 'y2' });
  data.push({ type: 'scatter', mode: 'lines', x: p.timesS, y: v, line: { color: c.text, width: 1.5 }, showlegend: false, name: 'vertical velocity', yaxis: 'y2', hovertemplate: '%{x:.3f} s<br>%{y:.3f} m/s<extra>velocity</extra>' });

  // predicted paths of the active muscle's evaluation
  const row = evaluation?.trials.find((t) => t.trialId === p.trial.id && t.muscle === activeMuscle);
  if (row) {
    row.hypotheses.forEach((ev) => {
      const k = hypothesisStyleIndex(ev.hypothesis, hypothesisIds);
      const colour = hypothesisColour(k);
      const label = hypothesisLabels[ev.hypothesis] ?? ev.hypothesis;
      if (!Number.isFinite(ev.cutoffS)) return;
      const end = Number.isFinite(ev.predictedContactS) ? ev.predictedContactS : ev.cutoffS + 1;
      const xs: number[] = [];
      const ys: number[] = [];
      for (let i = 0; i <= 48; i++) {
        const dt = ((end - ev.cutoffS) * i) / 48;
        xs.push(ev.cutoffS + dt);
        ys.push(ev.stateHeightM + ev.stateVelMps * dt + 0.5 * ev.accUsedMps2 * dt * dt);
      }
      data.push({ type: 'scatter', mode: 'lines', x: xs, y: ys, line: { color: colour, width: 2, dash: HYPOTHESIS_DASHES[k % HYPOTHESIS_DASHES.length] }, name: label, legendgroup: ev.hypothesis, yaxis: 'y', hovertemplate: `%{x:.3f} s<br>%{y:.4f} m<extra>${label}</extra>` });
      if (Number.isFinite(ev.predictedContactS)) {
        data.push({
          type: 'scatter',
          mode: 'markers',
          x: [ev.predictedContactS],
          y: [ev.targetHeightM],
          marker: { color: colour, size: 10, symbol: 'x-thin', line: { width: 2, color: colour } },
          error_x: Number.isFinite(ev.predictedContactSdMs) ? { type: 'constant', value: (2 * ev.predictedContactSdMs) / 1000, color: colour, thickness: 1 } : undefined,
          name: `${label}: predicted arrival`,
          legendgroup: ev.hypothesis,
          showlegend: false,
          yaxis: 'y',
          hovertemplate: `predicted arrival %{x:.3f} s<br>ttc at onset ${ev.ttcMs.toFixed(1)} ms<extra>${label}</extra>`,
        });
      }
    });
  }

  // EMG rows, decimated per pixel for the visible window
  // onset lines first (shape i = muscle i's onset when every muscle has one), then the rest
  const shapes: Record<string, unknown>[] = [];
  const laterShapes: Record<string, unknown>[] = [];
  const onsetShapes: OnsetShapeMap = {};
  detail.emg.forEach((e, m) => {
    const yaxis = axisName(2 + m);
    const d = minMaxDecimate(e.values, e.startS, e.rateHz, windowS[0], windowS[1], Math.max(100, Math.round(widthPx)));
    data.push({ type: 'scatter', mode: 'lines', x: d.timesS, y: d.values, line: { color: c.measured, width: 1 }, name: `${e.muscle} raw`, showlegend: false, yaxis, hovertemplate: `%{x:.4f} s<br>%{y:.1f} ${e.units}<extra>${e.muscle} raw</extra>` });
    const env = p.envelopes[e.muscle];
    if (env) data.push({ type: 'scatter', mode: 'lines', x: env.timesS, y: env.values, line: { color: '#0072B2', width: 1.8 }, name: `${e.muscle} envelope`, showlegend: false, yaxis, hovertemplate: `%{x:.4f} s<br>%{y:.1f} ${e.units}<extra>${e.muscle} envelope</extra>` });
    const r = evaluation?.trials.find((t) => t.trialId === p.trial.id && t.muscle === e.muscle);
    const [y0, y1] = domains[2 + m];
    if (r?.onsetEdited && r.automaticOnsetS !== null) {
      laterShapes.push({ type: 'line', xref: 'x', yref: 'paper', x0: r.automaticOnsetS, x1: r.automaticOnsetS, y0, y1, line: { color: c.muted, width: 1.5, dash: 'dash' }, editable: false, name: `auto-${e.muscle}` });
    }
    if (r && r.onsetS !== null) {
      onsetShapes[shapes.length] = e.muscle;
      shapes.push({ type: 'line', xref: 'x', yref: 'paper', x0: r.onsetS, x1: r.onsetS, y0, y1, line: { color: c.onset, width: e.muscle === activeMuscle ? 3 : 2 }, editable: true, name: `onset-${e.muscle}` });
    }
  });
  shapes.push(...laterShapes);
  if (p.releaseS !== null) shapes.push({ type: 'line', xref: 'x', yref: 'paper', x0: p.releaseS, x1: p.releaseS, y0: 0, y1: 1, line: { color: c.muted, width: 1, dash: 'dot' }, editable: false, name: 'release' });
  if (p.contactS !== null) shapes.push({ type: 'line', xref: 'x', yref: 'paper', x0: p.contactS, x1: p.contactS, y0: 0, y1: 1, line: { color: c.contact, width: 1.5 }, editable: false, name: 'contact' });

  const layout: Layout = {
    uirevision: p.trial.id,
    height: 380 + 120 * muscles.length,
    margin: { l: 70, r: 20, t: 30, b: 45 },
    showlegend: true,
    legend: { orientation: 'h', y: 1.02, yanchor: 'bottom', x: 0 },
    hovermode: 'closest',
    xaxis: { title: { text: 'time (s)' }, range: windowS, anchor: axisName(rows - 1), showspikes: true, spikemode: 'across', spikethickness: 1 },
    shapes,
    annotations: [
      ...(p.contactS !== null ? [{ x: p.contactS, y: 1, xref: 'x', yref: 'paper', text: 'contact', showarrow: false, yanchor: 'bottom', font: { size: 10, color: c.muted } }] : []),
      ...(p.releaseS !== null ? [{ x: p.releaseS, y: 1, xref: 'x', yref: 'paper', text: 'release', showarrow: false, yanchor: 'bottom', font: { size: 10, color: c.muted } }] : []),
    ],
  };
  layout.yaxis = { title: { text: 'height (m)' }, domain: domains[0] };
  layout.yaxis2 = { title: { text: 'velocity (m/s)' }, domain: domains[1] };
  detail.emg.forEach((e, m) => {
    layout[`yaxis${m + 3}`] = { title: { text: `${e.muscle} (${e.units})` }, domain: domains[2 + m] };
  });
  return { data, layout, onsetShapes };
}
