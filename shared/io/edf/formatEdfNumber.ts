/**
 * Formats a number into an EDF header field of fixed width (8 characters for ranges and durations),
 * rounding in a chosen direction so a physical range still covers the data after formatting.
 */

/**
 * @param value - the number
 * @param width - field width in characters
 * @param direction - `down` (result <= value), `up` (result >= value) or `nearest`
 * @returns the shortest text of at most `width` characters, in plain decimal notation
 * @throws RangeError when the integer part alone does not fit
 */
export function formatEdfNumber(value: number, width: number, direction: 'down' | 'up' | 'nearest' = 'nearest'): string {
  if (!Number.isFinite(value)) throw new RangeError(`EDF header numbers must be finite, got ${value}`);
  const plain = String(value);
  if (plain.length <= width && !/e/i.test(plain)) return plain;
  const round = direction === 'down' ? Math.floor : direction === 'up' ? Math.ceil : Math.round;
  for (let decimals = width - 2; decimals >= 0; decimals--) {
    const f = 10 ** decimals;
    const v = round(value * f) / f;
    let s = v.toFixed(decimals);
    if (s.includes('.')) s = s.replace(/0+$/, '').replace(/\.$/, '');
    if (s === '-0') s = '0';
    if (s.length <= width) return s;
  }
  throw new RangeError(`${value} does not fit in an EDF header field of ${width} characters`);
}
