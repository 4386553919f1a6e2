/**
 * Series the user switched off: on screen they stay as transparent points, out of legend and hover, so that
 * the axes hold still and plotly only restyles; exported figures leave them out. Which traces those are
 * travels beside the figure (the plot element's `data-export-omit`, trace names as JSON), not in the traces:
 * an extra trace attribute would make plotly redraw the figure from scratch on every switch.
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

/**
 * What an exported image is drawn from: the plot's traces without those named in `omit`, and its layout.
 * @param data - the traces as drawn
 * @param layout - the layout as drawn
 * @param omit - names of the traces to leave out
 * @returns the figure to export
 */
export function exportFigure<T extends { name?: unknown }, L>(data: T[], layout: L, omit: readonly string[]): { data: T[]; layout: L } {
  const skip = new Set(omit);
  return { data: data.filter((t) => !(typeof t.name === 'string' && skip.has(t.name))), layout };
}
