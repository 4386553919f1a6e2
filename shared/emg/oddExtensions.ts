/**
 * The odd-extension padding of zero-phase filtering (scipy.signal.sosfiltfilt's padtype 'odd').
 */

/**
 * The `edge` samples before and after src - shift, reflected through its end samples:
 * left[i] = 2 x[0] - x[edge - i], right[i] = 2 x[N-1] - x[N-2-i] (x = src - shift). The filters run left,
 * middle, right with their state carried across, the same arithmetic as filtering one extended array.
 * @param src - samples (src.length > edge)
 * @param shift - subtracted from every sample
 * @param edge - extension length, samples (>= 0)
 * @returns the extension before (left) and after (right) the signal
 */
export function oddExtensions(src: Float64Array, shift: number, edge: number): { left: Float64Array; right: Float64Array } {
  const n = src.length;
  const left = new Float64Array(edge);
  const right = new Float64Array(edge);
  const x0 = src[0] - shift;
  const xn = src[n - 1] - shift;
  for (let i = 0; i < edge; i++) {
    left[i] = 2 * x0 - (src[edge - i] - shift);
    right[i] = 2 * xn - (src[n - 2 - i] - shift);
  }
  return { left, right };
}
