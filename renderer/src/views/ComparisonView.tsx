/**
 * Hypothesis comparison: time-to-contact at onset per hypothesis against motion duration or condition
 * (one point per trial; a click opens the trial), the model-comparison table with posterior probabilities
 * and bootstrap intervals, the internal-gravity profile with its interval, and the delay sensitivity.
 */
import { useMemo, useRef, useState } from 'react';
import type { PlotData, Layout } from 'plotly.js-dist-min';
import type { StudyEvaluation, StudySettings } from '../../../shared/analysis/types';
import { Plot } from '../plot/Plot';
import { HYPOTHESIS_DASHES, HYPOTHESIS_SYMBOLS, THEMES, hypothesisColour, hypothesisStyleIndex, type ThemeName } from '../plot/palette';
import { fmtMs } from './trialRows';
import { MarkerLegend, type LegendEntry } from '../plot/MarkerLegend';
import { hiddenTracesCss } from '../plot/switchedOff';

export interface ComparisonViewProps {
  evaluation: StudyEvaluation;
  settings: StudySettings;
  theme: ThemeName;
  onOpenTrial: (trialId: string) => void;
  /** Called after the scatter has been drawn for an evaluation (times repaints). */
  onPainted?: () => void;
  /** True while the shown evaluation is the quick one (intervals and delay sweep still coming). */
  refining?: boolean;
}

const G0 = 9.80665;

type Profile = StudyEvaluation['internalGravity'][number];

/** Same profiles, value for value (the evaluation rebuilds them on every re-evaluation). */
function sameProfiles(a: readonly Profile[], b: readonly Profile[]): boolean {
  if (a.length !== b.length) return false;
  for (let i = 0; i < a.length; i++) {
    const p = a[i];
    const q = b[i];
    if (p.subject !== q.subject || p.condition !== q.condition || p.muscle !== q.muscle || p.n !== q.n) return false;
    if (!Object.is(p.bestGMps2, q.bestGMps2) || !Object.is(p.loMps2, q.loMps2) || !Object.is(p.hiMps2, q.hiMps2)) return false;
    if (p.logLik.length !== q.logLik.length || p.gMps2.length !== q.gMps2.length) return false;
    for (let j = 0; j < p.logLik.length; j++) if (!Object.is(p.logLik[j], q.logLik[j])) return false;
    for (let j = 0; j < p.gMps2.length; j++) if (!Object.is(p.gMps2[j], q.gMps2[j])) return false;
  }
  return true;
}

/** Same values in the same order (NaN equal to NaN). */
function sameValues(a: readonly unknown[] | undefined, b: readonly unknown[]): boolean {
  if (!a || a.length !== b.length) return false;
  for (let i = 0; i < a.length; i++) if (!Object.is(a[i], b[i])) return false;
  return true;
}

export function ComparisonView(props: ComparisonViewProps) {
  const { evaluation, settings, theme } = props;
  const muscles = settings.emgChannels.map((c) => c.muscle);
  const [muscle, setMuscle] = useState(muscles[0] ?? '');
  const [xKind, setXKind] = useState<'duration' | 'condition'>('duration');
  const subjects = useMemo(() => [...new Set(evaluation.trials.map((t) => t.subject))], [evaluation.trials]);
  const [subject, setSubject] = useState('all');
  // every hypothesis seen in this study, in order of appearance, with its label: the scatter keeps one trace
  // per hypothesis ever shown (hidden when not chosen), so a change of the hypothesis set restyles the
  // traces in place instead of rebuilding the figure, and figures whose data did not change do not redraw
  const seen = useRef(new Map<string, string>());
  for (const h of settings.hypotheses) seen.current.set(h.id, h.label ?? h.id);
  for (const id of evaluation.hypotheses) if (!seen.current.has(id)) seen.current.set(id, id);
  const labelOf = (id: string) => seen.current.get(id) ?? id;
  const labels = useMemo(() => Object.fromEntries(evaluation.hypotheses.map((id) => [id, labelOf(id)])), [evaluation.hypotheses]); // eslint-disable-line react-hooks/exhaustive-deps
  const c = THEMES[theme];

  // per hypothesis, the trace last drawn: when a hypothesis' points are unchanged (a change of the hypothesis
  // set leaves the other hypotheses' times-to-contact as they were), the same trace object is handed to
  // Plotly.react again, which then skips it. A hypothesis switched off keeps its trace and points, hidden by a
  // style rule on its trace group and skipped by hover (plotly redraws nothing for that), and the legend is the
  // page's own, so switching hypotheses neither redraws the figure nor moves its axes; against condition,
  // where every trace takes a slot in each category, it is hidden outright instead.
  const traceCache = useRef(new Map<string, { trace: PlotData; style: string }>());
  const traceCacheKey = useRef('');
  const scatter = useMemo(() => {
    const rows = evaluation.trials.filter((t) => t.muscle === muscle && t.usable && (subject === 'all' || t.subject === subject));
    const conditions = [...new Set(rows.map((r) => r.condition))].sort((a, b) => a.localeCompare(b, undefined, { numeric: true }));
    const shown = new Set(evaluation.hypotheses);
    const all = [...seen.current.keys()];
    // hidden traces keep points of the muscle, subject and axis they were drawn for: forget them when these change
    const key = `${muscle}\u0000${subject}\u0000${xKind}`;
    if (traceCacheKey.current !== key) traceCache.current.clear();
    traceCacheKey.current = key;
    const cache = traceCache.current;
    const data: PlotData[] = all.map((hid, index) => {
      const k = hypothesisStyleIndex(hid, shown.has(hid) ? evaluation.hypotheses : all);
      const visible = shown.has(hid);
      const previous = cache.get(hid)?.trace;
      let x: (number | string)[] = [];
      let y: number[] = [];
      let ids: string[] = [];
      if (visible) {
        for (const r of rows) {
          const h = r.hypotheses.find((e) => e.hypothesis === hid);
          if (!h || !Number.isFinite(h.ttcMs)) continue;
          x.push(xKind === 'duration' ? r.motionDurationS : r.condition);
          y.push(h.ttcMs);
          ids.push(r.trialId);
        }
      } else if (previous) {
        x = previous.x as (number | string)[];
        y = previous.y as number[];
        ids = previous.customdata as string[];
      }
      const colour = hypothesisColour(k);
      const symbol = HYPOTHESIS_SYMBOLS[k % HYPOTHESIS_SYMBOLS.length];
      const label = labelOf(hid);
      const style = `${visible}\u0000${label}\u0000${colour}\u0000${symbol}`;
      const same = previous !== undefined && sameValues(previous.x as unknown[], x) && sameValues(previous.y as unknown[], y) && sameValues(previous.customdata as unknown[], ids);
      if (same && cache.get(hid)?.style === style) return previous;
      const byCondition = xKind === 'condition';
      const trace = {
        type: 'scatter',
        mode: 'markers',
        name: label,
        uid: `hyp${index}`,
        visible: visible || !byCondition,
        showlegend: false,
        hoverinfo: visible ? 'all' : 'skip',
        // unchanged points keep their arrays (plotly compares data arrays by identity)
        x: same ? previous.x : x,
        y: same ? previous.y : y,
        customdata: same ? previous.customdata : ids,
        marker: { color: colour, symbol, size: 7, opacity: 0.8 },
        hovertemplate: `trial %{customdata}<br>%{x}<br>ttc at onset %{y:.1f} ms<extra>${label}</extra>`,
        ...(byCondition ? { offsetgroup: hid } : {}),
      } as PlotData;
      cache.set(hid, { trace, style });
      return trace;
    });
    // switched-off series: hidden on screen by a style rule, left out of exported figures
    const omitted = all.filter((hid) => !shown.has(hid)).map(labelOf);
    const hiddenCss = hiddenTracesCss('ttc-at-onset', all.map((hid, index) => (shown.has(hid) ? '' : `hyp${index}`)).filter(Boolean));
    const legend: LegendEntry[] = data
      .filter((_, index) => shown.has(all[index]))
      .map((t) => ({ name: t.name as string, colour: (t.marker as { color: string }).color, symbol: (t.marker as { symbol: string }).symbol }));
    return { data, conditions, omitted, hiddenCss, legend };
  }, [evaluation, muscle, subject, xKind]); // eslint-disable-line react-hooks/exhaustive-deps
  // the layout changes only with the horizontal axis (fixed margins; exported images widen the top margin for
  // plotly's legend, which sits there without pushing the plot area)
  const conditionKey = scatter.conditions.join('\u0000');
  const scatterLayout = useMemo((): Layout => ({
    height: 420,
    margin: { l: 70, r: 20, t: 16, b: 50 },
    legend: { orientation: 'h', xref: 'container', yref: 'container', x: 0.01, y: 0.995, xanchor: 'left', yanchor: 'top' },
    hovermode: 'closest',
    xaxis: xKind === 'duration' ? { title: { text: 'motion duration, release to contact (s)' } } : { title: { text: 'condition' }, type: 'category', categoryarray: scatter.conditions },
    yaxis: { title: { text: 'time-to-contact at onset (ms)' } },
    ...(xKind === 'condition' ? { scattermode: 'group' } : {}),
  } as Layout), [xKind, conditionKey]); // eslint-disable-line react-hooks/exhaustive-deps

  const models = useMemo(() => evaluation.models.filter((m) => m.muscle === muscle && (subject === 'all' || m.subject === subject)), [evaluation.models, muscle, subject]);
  const groups = useMemo(() => {
    const map = new Map<string, typeof models>();
    for (const m of models) {
      const key = `${m.subject} · ${m.condition}`;
      map.set(key, [...(map.get(key) ?? []), m]);
    }
    return [...map.entries()];
  }, [models]);

  // the internal-gravity profiles do not depend on the hypothesis set: keep the same list (and figures)
  // while their content is unchanged
  const profilesNow = useMemo(() => evaluation.internalGravity.filter((p) => p.muscle === muscle && (subject === 'all' || p.subject === subject)), [evaluation.internalGravity, muscle, subject]);
  const profilesKept = useRef(profilesNow);
  if (profilesKept.current !== profilesNow && !sameProfiles(profilesKept.current, profilesNow)) profilesKept.current = profilesNow;
  const profiles = profilesKept.current;
  const gravityFigure = useMemo(() => {
    const data: PlotData[] = [];
    const summary: PlotData = { type: 'scatter', mode: 'markers', x: [], y: [], error_x: { type: 'data', symmetric: false, array: [], arrayminus: [], color: c.text, thickness: 1.2 }, marker: { color: c.text, size: 8 }, name: 'internal gravity (95% interval)', hovertemplate: '%{y}<br>%{x:.2f} m/s²<extra></extra>' };
    for (const p of profiles) {
      if (!Number.isFinite(p.bestGMps2)) continue;
      (summary.x as number[]).push(p.bestGMps2);
      (summary.y as string[]).push(`${p.subject} · ${p.condition} (n=${p.n})`);
      ((summary.error_x as { array: number[] }).array).push(p.hiMps2 - p.bestGMps2);
      ((summary.error_x as { arrayminus: number[] }).arrayminus).push(p.bestGMps2 - p.loMps2);
    }
    data.push(summary);
    const layout: Layout = {
      height: Math.max(260, 60 + 26 * (summary.y as string[]).length),
      margin: { l: 150, r: 20, t: 20, b: 50 },
      showlegend: false,
      xaxis: { title: { text: 'internal gravity (m/s²)' }, rangemode: 'tozero' },
      yaxis: { type: 'category', automargin: true },
      shapes: [{ type: 'line', xref: 'x', yref: 'paper', x0: G0, x1: G0, y0: 0, y1: 1, line: { color: c.muted, dash: 'dot', width: 1 } }],
      annotations: [{ x: G0, y: 1, xref: 'x', yref: 'paper', text: '1 g', showarrow: false, yanchor: 'bottom', font: { size: 10, color: c.muted } }],
    };
    return { data, layout };
  }, [profiles, c]);

  const profileCurves = useMemo(() => {
    // pooled profiles per condition when all subjects are shown, else the subject's own
    const shown = profiles.filter((p) => (subject === 'all' ? p.subject === 'all' : true)).slice(0, 8);
    const data: PlotData[] = shown.map((p, i) => {
      const max = Math.max(...Array.from(p.logLik).filter(Number.isFinite));
      return { type: 'scatter', mode: 'lines', x: Array.from(p.gMps2), y: Array.from(p.logLik, (v) => v - max), name: `${p.subject} · ${p.condition}`, line: { color: hypothesisColour(i), dash: HYPOTHESIS_DASHES[i % HYPOTHESIS_DASHES.length] } };
    });
    const layout: Layout = {
      height: 300,
      margin: { l: 70, r: 20, t: 20, b: 50 },
      xaxis: { title: { text: 'internal gravity (m/s²)' } },
      yaxis: { title: { text: 'profile log-likelihood − max' }, range: [-8, 0.5] },
      shapes: [{ type: 'line', xref: 'paper', yref: 'y', x0: 0, x1: 1, y0: -1.92, y1: -1.92, line: { color: c.muted, dash: 'dot', width: 1 } }],
      annotations: [{ x: 1, y: -1.92, xref: 'paper', yref: 'y', text: '95% (−1.92)', showarrow: false, xanchor: 'right', yanchor: 'bottom', font: { size: 10, color: c.muted } }],
    };
    return { data, layout };
  }, [profiles, subject, c]);

  const delay = useMemo(() => {
    const list = evaluation.delaySensitivity.filter((d) => d.muscle === muscle);
    const pick = list.find((d) => d.subject === subject) ?? list[0];
    if (!pick) return null;
    const nd = pick.delaysMs.length;
    const data: PlotData[] = pick.hypotheses.map((hid, k) => {
      const style = hypothesisStyleIndex(hid, pick.hypotheses);
      return {
        type: 'scatter',
        mode: 'lines+markers',
        name: labelOf(hid),
        x: Array.from(pick.delaysMs),
        y: Array.from({ length: nd }, (_, i) => pick.posterior[i * pick.hypotheses.length + k]),
        line: { color: hypothesisColour(style), dash: HYPOTHESIS_DASHES[style % HYPOTHESIS_DASHES.length] },
        marker: { symbol: HYPOTHESIS_SYMBOLS[style % HYPOTHESIS_SYMBOLS.length] },
      };
    });
    const layout: Layout = {
      height: 300,
      margin: { l: 70, r: 20, t: 20, b: 50 },
      legend: { orientation: 'h', y: 1.02, yanchor: 'bottom' },
      xaxis: { title: { text: 'visuomotor delay (ms)' } },
      yaxis: { title: { text: 'posterior probability' }, range: [0, 1.02] },
    };
    return { data, layout, subject: pick.subject };
  }, [evaluation.delaySensitivity, muscle, subject]); // eslint-disable-line react-hooks/exhaustive-deps

  return (
    <section className="view comparison" aria-label="Hypothesis comparison">
      <div className="toolbar">
        <label>
          Muscle{' '}
          <select value={muscle} onChange={(e) => setMuscle(e.target.value)} aria-label="Muscle">
            {muscles.map((m) => (
              <option key={m}>{m}</option>
            ))}
          </select>
        </label>
        <label>
          Subject{' '}
          <select value={subject} onChange={(e) => setSubject(e.target.value)} aria-label="Subject">
            <option value="all">all</option>
            {subjects.map((s) => (
              <option key={s}>{s}</option>
            ))}
          </select>
        </label>
        <label>
          Against{' '}
          <select value={xKind} onChange={(e) => setXKind(e.target.value as 'duration' | 'condition')} aria-label="Horizontal axis">
            <option value="duration">motion duration</option>
            <option value="condition">condition</option>
          </select>
        </label>
        <span className="muted">A constant time-to-contact at onset under the right hypothesis shows as a flat cloud. Click a point to open its trial.</span>
      </div>
      {scatter.hiddenCss && <style>{scatter.hiddenCss}</style>}
      <MarkerLegend entries={scatter.legend} label="Hypotheses shown" />
      <Plot
        plotId="ttc-at-onset"
        label="Time-to-contact at onset per hypothesis"
        data={scatter.data}
        layout={scatterLayout}
        theme={theme}
        exportOmit={scatter.omitted}
        exportLegend
        onClick={(points) => {
          const id = points[0]?.customdata;
          if (typeof id === 'string') props.onOpenTrial(id);
        }}
        onDrawn={props.onPainted}
      />
      <h3>Model comparison ({muscle})</h3>
      <div className="table-wrap">
        <table className="models" aria-label="Model comparison">
          <thead>
            <tr>
              <th scope="col">Subject · condition</th>
              {evaluation.hypotheses.map((h) => (
                <th scope="col" key={h}>
                  <span className="swatch" style={{ background: hypothesisColour(hypothesisStyleIndex(h, evaluation.hypotheses)) }} />
                  {labels[h] ?? h}
                </th>
              ))}
            </tr>
          </thead>
          <tbody>
            {groups.map(([key, rows]) => {
              const best = Math.max(...rows.map((r) => r.posterior).filter(Number.isFinite));
              return (
                <tr key={key}>
                  <th scope="row">
                    {key} <span className="muted">(n={rows[0]?.n ?? 0})</span>
                  </th>
                  {evaluation.hypotheses.map((h) => {
                    const r = rows.find((x) => x.hypothesis === h);
                    if (!r) return <td key={h}>—</td>;
                    return (
                      // one text node per line (fewer DOM nodes to create on every re-evaluation)
                      <td key={h} className={`num ${r.posterior === best ? 'best' : ''}`} data-hypothesis={h} title={`log-likelihood ${r.logLik.toFixed(2)}, AIC ${r.aic.toFixed(1)}, BIC ${r.bic.toFixed(1)}`}>
                        <span className="posterior">{`P = ${r.posterior.toFixed(3)}`}</span>
                        <span className="muted detail">{`ΔlogL ${r.dLogLik.toFixed(2)} ${Number.isFinite(r.dLogLikLo) ? `[${r.dLogLikLo.toFixed(2)}, ${r.dLogLikHi.toFixed(2)}]` : '[…]'}\nttc ${fmtMs(r.ttcMeanMs)} ± ${fmtMs(r.ttcSdMs)} ms`}</span>
                      </td>
                    );
                  })}
                </tr>
              );
            })}
          </tbody>
        </table>
      </div>
      <div className="two-col">
        <div>
          <h3>Internal gravity (maximum likelihood, 95% interval)</h3>
          <Plot deferred plotId="internal-gravity" label="Internal gravity per subject and condition" data={gravityFigure.data} layout={gravityFigure.layout} theme={theme} />
          <Plot deferred plotId="internal-gravity-profile" label="Profile likelihood of internal gravity" data={profileCurves.data} layout={profileCurves.layout} theme={theme} />
        </div>
        <div>
          <h3>
            Delay sensitivity{delay ? ` (${delay.subject})` : ''}
            {props.refining ? <span className="muted small"> updating…</span> : null}
          </h3>
          {delay ? <Plot deferred plotId="delay-sensitivity" label="Posterior probability against visuomotor delay" data={delay.data} layout={delay.layout} theme={theme} /> : <p className="muted">No delay sweep in this evaluation.</p>}
        </div>
      </div>
    </section>
  );
}
