/** Figure export: every plot of the current view as PNG and SVG through plotly's own image export. */
import { loadPlotly } from './plot/loadPlotly';
import type { Layout, PlotData } from 'plotly.js-dist-min';
import type { OutputFile } from './host/host';
import { exportFigure, omittedNames } from './plot/switchedOff';

/** Bytes of a `data:` URL (base64 or percent-encoded). */
export function dataUrlBytes(url: string): Uint8Array {
  const comma = url.indexOf(',');
  const meta = url.slice(0, comma);
  const body = url.slice(comma + 1);
  if (meta.endsWith(';base64')) {
    const bin = atob(body);
    const out = new Uint8Array(bin.length);
    for (let i = 0; i < bin.length; i++) out[i] = bin.charCodeAt(i);
    return out;
  }
  return new TextEncoder().encode(decodeURIComponent(body));
}

/**
 * Renders the plots found under `root` to files named `<plot id>.<format>`.
 * @param root - element holding the plots (those with `data-plot-id`)
 * @param formats - image formats to write
 */
export async function renderFigures(root: ParentNode, formats: ('png' | 'svg')[] = ['png', 'svg']): Promise<OutputFile[]> {
  const Plotly = await loadPlotly();
  const files: OutputFile[] = [];
  for (const el of Array.from(root.querySelectorAll<HTMLElement>('[data-plot-id]'))) {
    const id = (el.dataset.plotId ?? 'figure').replace(/[^\w.-]+/g, '_');
    const drawn = el as HTMLElement & { data?: PlotData[]; layout?: Layout };
    const source = drawn.data && drawn.layout ? exportFigure(drawn.data, drawn.layout, omittedNames(el.dataset.exportOmit), el.dataset.exportLegend === 'true') : el;
    for (const format of formats) {
      const url = await Plotly.toImage(source, { format, width: Math.max(800, el.clientWidth), height: Math.max(400, el.clientHeight), scale: format === 'png' ? 2 : 1 });
      files.push({ name: `${id}.${format}`, data: format === 'svg' ? new TextDecoder().decode(dataUrlBytes(url)) : dataUrlBytes(url) });
    }
  }
  return files;
}
