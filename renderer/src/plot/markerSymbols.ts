/** Marker shapes of the page's own legends, drawn to match plotly's marker symbols. */

/** SVG path of a marker symbol centred at (7, 7), radius about 5 (plotly's symbol names). */
export function symbolPath(symbol: string): string {
  switch (symbol) {
    case 'square':
      return 'M2.5,2.5H11.5V11.5H2.5Z';
    case 'diamond':
      return 'M7,1.5L12.5,7L7,12.5L1.5,7Z';
    case 'triangle-up':
      return 'M7,1.5L12.5,11.5H1.5Z';
    case 'x':
      return 'M3,1.6L7,5.6L11,1.6L12.4,3L8.4,7L12.4,11L11,12.4L7,8.4L3,12.4L1.6,11L5.6,7L1.6,3Z';
    case 'star':
      return 'M7,1.2L8.6,5.2L12.8,5.4L9.5,8.1L10.6,12.2L7,9.9L3.4,12.2L4.5,8.1L1.2,5.4L5.4,5.2Z';
    case 'hexagon':
      return 'M7,1.5L11.8,4.25V9.75L7,12.5L2.2,9.75V4.25Z';
    default:
      return 'M12,7A5,5 0 1,1 2,7A5,5 0 1,1 12,7Z';
  }
}
