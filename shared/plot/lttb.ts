/**
 * Largest-Triangle-Three-Buckets downsampling: keeps the points that best preserve a line's visual shape.
 *
 * @see Steinarsson S. (2013) Downsampling time series for visual representation. MSc thesis, University
 *   of Iceland, ch. 4.2 (LTTB): the first and last points are kept; the rest is split into `threshold - 2`
 *   buckets, and from each bucket the point forming the largest triangle with the point kept from the
 *   previous bucket and the average of the next bucket is kept.
 */

/**
 * Indices of the points LTTB keeps.
 *
 * @param x - abscissae, non-decreasing (e.g. times, s)
 * @param y - ordinates, same length as x
 * @param threshold - number of points to keep (>= 3); when it is >= the input length every index is kept
 * @returns increasing indices into x and y, `min(threshold, length)` of them
 * @throws RangeError when lengths differ or threshold < 3
 */
export function lttbIndices(x: ArrayLike<number>, y: ArrayLike<number>, threshold: number): Uint32Array {
  const n = x.length;
  if (y.length !== n) throw new RangeError(`x and y lengths differ: ${n} vs ${y.length}`);
  if (!(threshold >= 3) || !Number.isFinite(threshold)) throw new RangeError(`threshold must be >= 3, got ${threshold}`);
  const keep = Math.floor(threshold);
  if (keep >= n) {
    const all = new Uint32Array(n);
    for (let i = 0; i < n; i++) all[i] = i;
    return all;
  }
  const out = new Uint32Array(keep);
  const every = (n - 2) / (keep - 2);
  let a = 0;
  out[0] = 0;
  for (let i = 0; i < keep - 2; i++) {
    // average of the next bucket (the last bucket's "next" is the final point)
    let avgStart = Math.floor((i + 1) * every) + 1;
    let avgEnd = Math.floor((i + 2) * every) + 1;
    if (avgEnd > n) avgEnd = n;
    if (avgStart >= avgEnd) avgStart = avgEnd - 1;
    let avgX = 0;
    let avgY = 0;
    for (let j = avgStart; j < avgEnd; j++) {
      avgX += x[j];
      avgY += y[j];
    }
    const count = avgEnd - avgStart;
    avgX /= count;
    avgY /= count;
    // this bucket
    const start = Math.floor(i * every) + 1;
    const end = Math.floor((i + 1) * every) + 1;
    const ax = x[a];
    const ay = y[a];
    let best = start;
    let bestArea = -1;
    for (let j = start; j < end; j++) {
      // twice the triangle area |(ax - avgX)(yj - ay) - (ax - xj)(avgY - ay)|
      const area = Math.abs((ax - avgX) * (y[j] - ay) - (ax - x[j]) * (avgY - ay));
      if (area > bestArea) {
        bestArea = area;
        best = j;
      }
    }
    out[i + 1] = best;
    a = best;
  }
  out[keep - 1] = n - 1;
  return out;
}

/**
 * LTTB downsampling returning the kept points.
 *
 * @param x - abscissae, non-decreasing
 * @param y - ordinates
 * @param threshold - number of points to keep (>= 3)
 * @returns the kept points as Float64Arrays
 * @throws RangeError as {@link lttbIndices}
 */
export function lttb(x: ArrayLike<number>, y: ArrayLike<number>, threshold: number): { x: Float64Array; y: Float64Array } {
  const idx = lttbIndices(x, y, threshold);
  const ox = new Float64Array(idx.length);
  const oy = new Float64Array(idx.length);
  for (let i = 0; i < idx.length; i++) {
    ox[i] = x[idx[i]];
    oy[i] = y[idx[i]];
  }
  return { x: ox, y: oy };
}
