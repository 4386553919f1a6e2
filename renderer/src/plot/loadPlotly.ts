/**
 * plotly.js loaded on first use (a separate chunk of about 5 MB), so the window, the trial table and the
 * analysis worker start before the plotting library has been parsed.
 */
type PlotlyModule = typeof import('plotly.js-dist-min').default;

let pending: Promise<PlotlyModule> | null = null;

/** Resolves with plotly.js (loaded once). */
export function loadPlotly(): Promise<PlotlyModule> {
  pending ??= import('plotly.js-dist-min').then((m) => m.default);
  return pending;
}
