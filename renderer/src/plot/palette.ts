/**
 * Colours of the renderer: the Okabe-Ito colour-blind-safe palette for data, two neutral themes.
 * @see Okabe M., Ito K. (2008) Color Universal Design (CUD): how to make figures and presentations that
 *   are friendly to colorblind people. jfly.uni-koeln.de/color/ (the 8-colour set).
 */
import { STANDARD_HYPOTHESES } from '../../../shared/analysis/defaultSettings';

const STANDARD_IDS = STANDARD_HYPOTHESES.map((h) => h.id);

/** The eight Okabe-Ito colours. */
export const OKABE_ITO = {
  black: '#000000',
  orange: '#E69F00',
  skyBlue: '#56B4E9',
  bluishGreen: '#009E73',
  yellow: '#F0E442',
  blue: '#0072B2',
  vermillion: '#D55E00',
  reddishPurple: '#CC79A7',
} as const;

/** Hypothesis colours (cycled), by {@link hypothesisStyleIndex}. */
export const HYPOTHESIS_COLOURS = [OKABE_ITO.blue, OKABE_ITO.vermillion, OKABE_ITO.bluishGreen, OKABE_ITO.reddishPurple, OKABE_ITO.orange, OKABE_ITO.skyBlue, OKABE_ITO.yellow];

/** Dash styles paired with the colours so hypotheses also differ without colour. */
export const HYPOTHESIS_DASHES = ['solid', 'dash', 'dot', 'dashdot', 'longdash', 'longdashdot', 'solid'];

/** Marker symbols paired with the colours. */
export const HYPOTHESIS_SYMBOLS = ['circle', 'square', 'diamond', 'triangle-up', 'x', 'star', 'hexagon'];

/**
 * A hypothesis keeps its colour, dash and symbol whatever else is chosen: the standard hypotheses by their
 * place in the standard set, any other by its place among the non-standard ones of the settings.
 * @param id - hypothesis id
 * @param settingsIds - ids of the hypotheses in the settings, in order
 */
export function hypothesisStyleIndex(id: string, settingsIds: readonly string[]): number {
  const std = STANDARD_IDS.indexOf(id);
  if (std >= 0) return std;
  return STANDARD_IDS.length + Math.max(0, settingsIds.filter((x) => !STANDARD_IDS.includes(x)).indexOf(id));
}

export type ThemeName = 'light' | 'dark';

/** Neutral colours of a theme, for plot backgrounds, grids, measured data and text. */
export interface ThemeColours {
  paper: string;
  plot: string;
  grid: string;
  text: string;
  muted: string;
  measured: string;
  band: string;
  onset: string;
  contact: string;
}

export const THEMES: Record<ThemeName, ThemeColours> = {
  light: { paper: '#ffffff', plot: '#ffffff', grid: '#e3e5e8', text: '#1d2024', muted: '#6b7178', measured: '#7a7f87', band: 'rgba(0,114,178,0.18)', onset: OKABE_ITO.vermillion, contact: '#1d2024' },
  dark: { paper: '#1f2227', plot: '#1f2227', grid: '#353a41', text: '#e6e8eb', muted: '#9aa1a9', measured: '#a3a9b1', band: 'rgba(86,180,233,0.22)', onset: OKABE_ITO.orange, contact: '#e6e8eb' },
};

/** Colour of a hypothesis by its style index ({@link hypothesisStyleIndex}). */
export function hypothesisColour(index: number): string {
  return HYPOTHESIS_COLOURS[((index % HYPOTHESIS_COLOURS.length) + HYPOTHESIS_COLOURS.length) % HYPOTHESIS_COLOURS.length];
}
