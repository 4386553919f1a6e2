/**
 * Series the user switched off: on screen they stay as transparent points so that the axes hold still;
 * exported figures leave them out.
 */

/** `meta` of a trace that is switched off. */
export const SWITCHED_OFF = 'forecatch:switched-off';

/**
 * What an exported image is drawn from: the plot's traces without those switched off, and its layout.
 * @param data - the traces as drawn
 * @param layout - the layout as drawn
 * @returns the figure to export
 */
export function exportFigure<T extends { meta?: unknown }, L>(data: T[], layout: L): { data: T[]; layout: L } {
  return { data: data.filter((t) => t.meta !== SWITCHED_OFF), layout };
}
