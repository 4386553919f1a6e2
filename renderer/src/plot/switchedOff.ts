/**
 * Series the user switched off. On screen they stay in the figure, hidden by a style rule on their trace
 * group and skipped by hover, so that the axes hold still and plotly redraws nothing (hover skipping is the
 * one attribute plotly takes without redrawing); the figure's legend is drawn by the page (MarkerLegend).
 * Exported figures leave them out and, when asked, get plotly's own legend back. Both travel beside the
 * figure as attributes of the plot element: `data-export-omit` (trace names as JSON) and `data-export-legend`.
 */

/**
 * The trace names a plot element asks exports to leave out.
 * @param attribute - the element's `data-export-omit` value (a JSON array of names), or undefined
 * @returns the names (none when the attribute is absent or not a JSON array of strings)
 */
export function omittedNames(attribute: string | undefined): string[] {
  if (!attribute) return [];
  try {
    const v: unknown = JSON.parse(attribute);
    return Array.isArray(v) ? v.filter((x): x is string => typeof x === 'string') : [];
  } catch {
    return [];
  }
}

/** Top margin (px) an exported figure keeps for plotly's one-row legend above the plot area. */
export const EXPORT_LEGEND_MARGIN_PX = 56;

/**
 * What an exported image is drawn from: the plot's traces without those named in `omit`, and its layout. With
 * `legend`, every kept trace gets a legend entry and the top margin room for it (figures whose on-screen
 * legend is the page's).
 * @param data - the traces as drawn
 * @param layout - the layout as drawn
 * @param omit - names of the traces to leave out
 * @param legend - give the exported figure plotly's legend
 * @returns the figure to export
 */
export function exportFigure<T extends { name?: unknown }, L extends object>(data: T[], layout: L, omit: readonly string[], legend = false): { data: T[]; layout: L } {
  const skip = new Set(omit);
  const kept = data.filter((t) => !(typeof t.name === 'string' && skip.has(t.name)));
  if (!legend) return { data: kept, layout };
  const margin = ((layout as { margin?: unknown }).margin ?? {}) as { t?: number };
  return {
    data: kept.map((t) => ({ ...t, showlegend: true })),
    layout: { ...layout, margin: { ...margin, t: Math.max(margin.t ?? 0, EXPORT_LEGEND_MARGIN_PX) } },
  };
}

/**
 * A style rule hiding the trace groups of one figure (plotly gives each scatter trace group the class
 * `trace<uid>`).
 * @param plotId - the figure's `data-plot-id`
 * @param uids - uids of the traces to hide (letters, digits, '-' and '_' only)
 * @returns CSS text (empty when there is nothing to hide)
 */
export function hiddenTracesCss(plotId: string, uids: readonly string[]): string {
  const safe = uids.filter((u) => /^[\w-]+$/.test(u));
  if (safe.length === 0) return '';
  return `${safe.map((u) => `[data-plot-id="${plotId}"] .trace${u}`).join(',\n')} { display: none; }`;
}
