/**
 * A legend drawn by the page instead of by plotly, for figures whose series are switched on and off often:
 * switching then changes this list and a style rule, and plotly redraws nothing (see switchedOff.ts).
 */

import { symbolPath } from './markerSymbols';

export interface LegendEntry {
  /** Series name, as in the figure. */
  name: string;
  colour: string;
  /** plotly marker symbol name. */
  symbol: string;
}

/**
 * The legend of a figure's series, one entry per series shown.
 * @param props - entries in figure order, and an accessible label
 */
export function MarkerLegend(props: { entries: readonly LegendEntry[]; label: string }) {
  return (
    <ul className="marker-legend" aria-label={props.label}>
      {props.entries.map((e) => (
        <li key={e.name} data-series={e.name}>
          <svg width="14" height="14" viewBox="0 0 14 14" aria-hidden="true">
            <path d={symbolPath(e.symbol)} fill={e.colour} fillOpacity={0.8} />
          </svg>
          {e.name}
        </li>
      ))}
    </ul>
  );
}
