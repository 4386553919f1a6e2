/**
 * Quantile of unsorted values by selection instead of sorting (two or three partial partitions, linear
 * time on average), with the same definition and the same floating-point result as sorting first and
 * taking compareModels.ts quantileSorted: type 7 of Hyndman & Fan 1996 (Am Stat 50:361-365; the default of
 * R and numpy), the order statistics at floor(h) and floor(h) + 1 for h = (n - 1) q, interpolated linearly.
 */

/** Moves the k-th smallest of a[left..right] to a[k], smaller or equal values before it, larger or equal after. */
function selectInPlace(a: Float64Array, k: number, left: number, right: number): void {
  while (right > left) {
    const mid = (left + right) >> 1;
    // median of three as the pivot
    if (a[mid] < a[left]) swap(a, mid, left);
    if (a[right] < a[left]) swap(a, right, left);
    if (a[right] < a[mid]) swap(a, right, mid);
    const pivot = a[mid];
    let i = left;
    let j = right;
    while (i <= j) {
      while (a[i] < pivot) i++;
      while (a[j] > pivot) j--;
      if (i <= j) {
        swap(a, i, j);
        i++;
        j--;
      }
    }
    // now a[left..j] <= pivot, a[j+1..i-1] = pivot, a[i..right] >= pivot
    if (k <= j) right = j;
    else if (k >= i) left = i;
    else return;
  }
}

function swap(a: Float64Array, i: number, j: number): void {
  const t = a[i];
  a[i] = a[j];
  a[j] = t;
}

/**
 * Type-7 quantile of values in any order; reorders `values` in place (a permutation of them remains).
 *
 * @param values - the values (NaN-free; reordered)
 * @param q - probability in [0, 1]
 * @returns the quantile, equal to quantileSorted of the sorted values (NaN for no values)
 * @throws RangeError when q is outside [0, 1] or a value is NaN
 */
export function quantileSelect(values: Float64Array, q: number): number {
  if (!(q >= 0 && q <= 1)) throw new RangeError(`quantileSelect: q must be in [0, 1], got ${q}`);
  const n = values.length;
  if (n === 0) return NaN;
  for (let i = 0; i < n; i++) if (Number.isNaN(values[i])) throw new RangeError(`quantileSelect: value ${i} is NaN`);
  const h = (n - 1) * q;
  const lo = Math.floor(h);
  selectInPlace(values, lo, 0, n - 1);
  const a = values[lo];
  if (lo + 1 >= n) return a + (h - lo) * (a - a);
  // the next order statistic is the smallest value after lo
  let b = values[lo + 1];
  for (let i = lo + 2; i < n; i++) if (values[i] < b) b = values[i];
  return a + (h - lo) * (b - a);
}

/**
 * Two type-7 quantiles of the same values, the upper one selected only among the values above the lower
 * one's position (about half the work of two {@link quantileSelect} calls, the same results).
 *
 * @param values - the values (NaN-free; reordered)
 * @param qLo - lower probability in [0, 1]
 * @param qHi - upper probability in [qLo, 1]
 * @param out - receives [lower quantile, upper quantile] (NaN, NaN for no values)
 * @throws RangeError when a probability is outside [0, 1], qHi < qLo, or a value is NaN
 */
export function quantileSelectPair(values: Float64Array, qLo: number, qHi: number, out: Float64Array): void {
  if (!(qLo >= 0 && qHi <= 1 && qHi >= qLo)) throw new RangeError(`quantileSelectPair: need 0 <= qLo <= qHi <= 1, got ${qLo}, ${qHi}`);
  const n = values.length;
  if (n === 0) {
    out[0] = out[1] = NaN;
    return;
  }
  for (let i = 0; i < n; i++) if (Number.isNaN(values[i])) throw new RangeError(`quantileSelectPair: value ${i} is NaN`);
  let at = -1; // values[0..at] hold the at + 1 smallest values, in place
  for (let k = 0; k < 2; k++) {
    const h = (n - 1) * (k === 0 ? qLo : qHi);
    const lo = Math.floor(h);
    if (lo > at) selectInPlace(values, lo, at + 1, n - 1);
    at = Math.max(at, lo);
    const a = values[lo];
    let b = a;
    if (lo + 1 < n) {
      b = values[lo + 1];
      for (let i = lo + 2; i < n; i++) if (values[i] < b) b = values[i];
    }
    out[k] = a + (h - lo) * (b - a);
  }
}
