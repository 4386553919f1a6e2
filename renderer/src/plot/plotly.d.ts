// The part of plotly.js's API the renderer uses (the dist bundle ships no types).
declare module 'plotly.js-dist-min' {
  export type Datum = number | string | null;
  export interface PlotData {
    [key: string]: unknown;
  }
  export interface Layout {
    [key: string]: unknown;
  }
  export interface Config {
    [key: string]: unknown;
  }
  export interface PlotlyHTMLElement extends HTMLElement {
    on(event: string, handler: (data: any) => void): void;
    removeAllListeners(event: string): void;
    layout?: Layout;
  }
  export function react(root: HTMLElement, data: PlotData[], layout?: Layout, config?: Config): Promise<PlotlyHTMLElement>;
  export function newPlot(root: HTMLElement, data: PlotData[], layout?: Layout, config?: Config): Promise<PlotlyHTMLElement>;
  export function purge(root: HTMLElement): void;
  export function toImage(root: HTMLElement | { data: PlotData[]; layout?: Layout }, opts: { format: 'png' | 'svg'; width?: number; height?: number; scale?: number }): Promise<string>;
  export function relayout(root: HTMLElement, update: Record<string, unknown>): Promise<PlotlyHTMLElement>;
  export const Plots: { resize(root: HTMLElement): void };
  const Plotly: {
    react: typeof react;
    newPlot: typeof newPlot;
    purge: typeof purge;
    toImage: typeof toImage;
    relayout: typeof relayout;
    Plots: typeof Plots;
  };
  export default Plotly;
}
