/**
 * Fast decimal-text to number conversion for the delimited reader's hot loop, with exactly the result of
 * `Number(text)` (or of `Number(text.replace(',', '.'))` with a decimal comma).
 *
 * Fast path: plain decimals (`-12.345`, `.5`, `7`) with at most 15 significant digits and at most 22 decimals
 * are computed as integer mantissa / 10^decimals. Both operands are exact doubles (mantissa < 2^53,
 * 10^k exact for k <= 22), so the one IEEE division is correctly rounded: the same double `Number` returns.
 * Everything else (exponents, spaces, more digits, `NaN`, garbage) goes to `Number`.
 * @see Clinger WD (1990) How to read floating point numbers accurately. PLDI '90, 92-101 (the exact fast path).
 */

const POW10 = [1, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11, 1e12, 1e13, 1e14, 1e15, 1e16, 1e17, 1e18, 1e19, 1e20, 1e21, 1e22];

/**
 * Converts one cell's text to a number.
 * @param text - the cell text (non-empty)
 * @param decimalComma - true when ',' is the decimal mark
 * @returns the same value as `Number(decimalComma ? text.replace(',', '.') : text)`
 */
export function parseDecimal(text: string, decimalComma: boolean): number {
  const n = text.length;
  const mark = decimalComma ? 44 : 46;
  let i = 0;
  let negative = false;
  let c = text.charCodeAt(0);
  if (c === 45 || c === 43) {
    negative = c === 45;
    i = 1;
  }
  let mantissa = 0;
  let digits = 0;
  let significant = 0;
  let decimals = -1;
  for (; i < n; i++) {
    c = text.charCodeAt(i);
    if (c >= 48 && c <= 57) {
      digits++;
      if (significant > 0 || c !== 48) significant++;
      mantissa = mantissa * 10 + (c - 48);
      if (decimals >= 0) decimals++;
    } else if (c === mark && decimals < 0) {
      decimals = 0;
    } else {
      return Number(decimalComma ? text.replace(',', '.') : text);
    }
  }
  if (digits === 0 || significant > 15 || decimals > 22) return Number(decimalComma ? text.replace(',', '.') : text);
  const v = decimals > 0 ? mantissa / POW10[decimals] : mantissa;
  return negative ? -v : v;
}
