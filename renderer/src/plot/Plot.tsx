/**
 * A plotly.js chart as a React component: draws with Plotly.react on every change of data or layout,
 * follows the theme, resizes with its box, and forwards clicks and zoom/drag (relayout) events.
 */
import { useEffect, useLayoutEffect, useRef } from 'react';
import type { Config, Layout, PlotData, PlotlyHTMLElement } from 'plotly.js-dist-min';
import { loadPlotly } from './loadPlotly';
import { THEMES, type ThemeName } from './palette';

export interface PlotProps {
  data: PlotData[];
  layout: Layout;
  theme: ThemeName;
  /** Extra config (e.g. `edits: { shapePosition: true }` for draggable onset lines). */
  config?: Config;
  className?: string;
  /** Accessible name of the figure. */
  label: string;
  /** Stable id used by figure export and the tests. */
  plotId: string;
  /** Names of traces that figure export leaves out (series switched off but kept on screen, transparent). */
  exportOmit?: readonly string[];
  /** Exported images show plotly's legend for every kept trace (figures whose on-screen legend is the page's). */
  exportLegend?: boolean;
  onClick?: (points: { curveNumber: number; pointIndex: number; customdata?: unknown; x: unknown; y: unknown }[]) => void;
  onRelayout?: (update: Record<string, unknown>, el: PlotlyHTMLElement) => void;
  /** Called after each draw (used to time repaints). */
  onDrawn?: (el: PlotlyHTMLElement) => void;
  /** Secondary figure: drawn after the next frame has been painted, so the view's main figure shows first. */
  deferred?: boolean;
}

/** Applies the theme's neutral colours to a layout (axes included). */
export function themedLayout(layout: Layout, theme: ThemeName): Layout {
  const c = THEMES[theme];
  const out: Layout = {
    ...layout,
    paper_bgcolor: c.paper,
    plot_bgcolor: c.plot,
    font: { family: 'system-ui, sans-serif', size: 12, color: c.text, ...(layout.font as object) },
  };
  for (const key of Object.keys(layout)) {
    if (/^[xy]axis\d*$/.test(key)) out[key] = { gridcolor: c.grid, zerolinecolor: c.grid, linecolor: c.muted, ...(layout[key] as object) };
  }
  return out;
}

export function Plot(props: PlotProps) {
  const ref = useRef<HTMLDivElement>(null);
  const handlers = useRef(props);
  handlers.current = props;

  useEffect(() => {
    const el = ref.current;
    if (!el) return;
    // only a change of the box's width re-lays the figure out: plotly's own redraws change the element's
    // height and children, which must not feed back into another resize
    let lastWidth = -1;
    const ro = new ResizeObserver((entries) => {
      const width = Math.round(entries[entries.length - 1].contentRect.width);
      if (width === lastWidth) return;
      const first = lastWidth < 0;
      lastWidth = width;
      if (first || !(el as unknown as PlotlyHTMLElement).layout) return;
      void loadPlotly().then((Plotly) => Plotly.Plots.resize(el));
    });
    ro.observe(el);
    return () => {
      ro.disconnect();
      void loadPlotly().then((Plotly) => Plotly.purge(el));
    };
  }, []);

  // the view's main figure is drawn before the browser paints the commit that changed it (one frame, no
  // intermediate paint of stale plot next to a fresh table); secondary figures after that frame
  const drawEffect = props.deferred ? useEffect : useLayoutEffect;
  drawEffect(() => {
    const el = ref.current;
    if (!el) return;
    let cancelled = false;
    const onDrawn = props.onDrawn; // the callback of the render whose data is drawn here
    const draw = () => {
      if (cancelled) return;
      void loadPlotly().then((Plotly) => Plotly.react(el, props.data, themedLayout({ autosize: true, ...props.layout }, props.theme), {
        displaylogo: false,
        responsive: false,
        modeBarButtonsToRemove: ['sendDataToCloud', 'lasso2d', 'select2d'],
        toImageButtonOptions: { filename: props.plotId },
        ...props.config,
      })).then((gd) => {
        if (cancelled) return;
        gd.removeAllListeners('plotly_click');
        gd.removeAllListeners('plotly_relayout');
        gd.on('plotly_click', (ev: { points: any[] }) => handlers.current.onClick?.(ev.points));
        gd.on('plotly_relayout', (ev: Record<string, unknown>) => handlers.current.onRelayout?.(ev, gd));
        onDrawn?.(gd);
      });
    };
    let frame = 0;
    let timer: ReturnType<typeof setTimeout> | undefined;
    if (props.deferred) frame = requestAnimationFrame(() => (timer = setTimeout(draw, 0)));
    else draw();
    return () => {
      cancelled = true;
      cancelAnimationFrame(frame);
      if (timer) clearTimeout(timer);
    };
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [props.data, props.layout, props.theme, props.config]);

  return <div ref={ref} className={props.className ?? 'plot'} role="img" aria-label={props.label} data-plot-id={props.plotId} data-export-omit={props.exportOmit?.length ? JSON.stringify(props.exportOmit) : undefined} data-export-legend={props.exportLegend ? 'true' : undefined} />;
}
