/**
 * Bridging NaN runs before recursive filtering (a single NaN would otherwise spread through every later sample).
 */

/**
 * Replaces non-finite samples in place by linear interpolation between the finite neighbours (the nearest
 * finite value at either end) and marks where they were.
 * @param y - samples, modified in place
 * @param mask - output of y's length: 1 where y was not finite, 0 elsewhere
 * @returns number of samples bridged (y.length when no sample is finite; y is then left unchanged)
 */
export function fillGaps(y: Float64Array, mask: Uint8Array): number {
  const n = y.length;
  let bridged = 0;
  let last = -1;
  for (let i = 0; i < n; i++) {
    if (Number.isFinite(y[i])) {
      mask[i] = 0;
      if (i - last > 1) {
        const from = last >= 0 ? y[last] : y[i];
        const span = i - last;
        for (let j = last + 1; j < i; j++) y[j] = last >= 0 ? from + ((y[i] - from) * (j - last)) / span : y[i];
      }
      last = i;
    } else {
      mask[i] = 1;
      bridged++;
    }
  }
  if (last < 0) return n;
  for (let j = last + 1; j < n; j++) y[j] = y[last];
  return bridged;
}
