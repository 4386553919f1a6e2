/**
 * Per-pixel min/max decimation of an evenly sampled signal, for drawing long recordings.
 *
 * Each pixel column (bin) of the visible window keeps its smallest and largest sample, emitted in time
 * order, so every peak the screen could show survives: a 10-million-sample EMG channel becomes at most
 * 2 x `binCount` points. Bins holding two samples or fewer keep them all, so zooming in far enough
 * returns the raw samples exactly.
 */

/** Decimated points ready to plot: times in seconds and values in the signal's units. */
export interface DecimatedSeries {
  timesS: Float64Array;
  values: Float64Array;
  /** First and one-past-last sample index of the window that was decimated. */
  fromIndex: number;
  toIndex: number;
  /** True when every sample of the window was kept (no decimation was needed). */
  raw: boolean;
}

/**
 * Index range of the samples of an evenly sampled signal that fall in `[fromS, toS]`, widened by one
 * sample each side so a line drawn from them reaches the window's edges.
 *
 * @param length - number of samples in the signal
 * @param startS - time of sample 0, s
 * @param rateHz - sample rate, Hz (positive)
 * @param fromS - window start, s
 * @param toS - window end, s (>= fromS)
 * @returns `[fromIndex, toIndex)` clipped to `[0, length]`
 * @throws RangeError when rateHz is not positive or the window is not a finite, ordered pair
 */
export function visibleIndexRange(length: number, startS: number, rateHz: number, fromS: number, toS: number): [number, number] {
  if (!(rateHz > 0) || !Number.isFinite(rateHz)) throw new RangeError(`rateHz must be a positive finite number, got ${rateHz}`);
  if (!Number.isFinite(fromS) || !Number.isFinite(toS) || !(toS >= fromS)) {
    throw new RangeError(`window must be finite with toS >= fromS, got [${fromS}, ${toS}]`);
  }
  const from = Math.max(0, Math.floor((fromS - startS) * rateHz) - 1);
  const to = Math.min(length, Math.ceil((toS - startS) * rateHz) + 2);
  return [Math.min(from, length), Math.max(Math.min(from, length), to)];
}

/**
 * Min/max decimation of the samples of `values` inside a time window.
 *
 * @param values - the signal (evenly sampled); NaN samples are skipped
 * @param startS - time of sample 0, s
 * @param rateHz - sample rate, Hz
 * @param fromS - window start, s
 * @param toS - window end, s
 * @param binCount - number of bins, normally the plot's width in pixels (>= 1)
 * @returns at most 2 x binCount points in time order; see {@link DecimatedSeries}
 * @throws RangeError on a non-positive rate, an unordered window or binCount < 1
 */
export function minMaxDecimate(
  values: Float64Array | Float32Array,
  startS: number,
  rateHz: number,
  fromS: number,
  toS: number,
  binCount: number,
): DecimatedSeries {
  if (!(binCount >= 1) || !Number.isFinite(binCount)) throw new RangeError(`binCount must be >= 1, got ${binCount}`);
  const bins = Math.floor(binCount);
  const [fromIndex, toIndex] = visibleIndexRange(values.length, startS, rateHz, fromS, toS);
  const n = toIndex - fromIndex;
  const dtS = 1 / rateHz;
  if (n <= 2 * bins) {
    const timesS = new Float64Array(n);
    const out = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      timesS[i] = startS + (fromIndex + i) * dtS;
      out[i] = values[fromIndex + i];
    }
    return { timesS, values: out, fromIndex, toIndex, raw: true };
  }
  const timesS = new Float64Array(2 * bins);
  const out = new Float64Array(2 * bins);
  let k = 0;
  for (let b = 0; b < bins; b++) {
    // bin b covers samples [lo, hi): an even split of the window, each bin non-empty because n > 2 bins
    const lo = fromIndex + Math.floor((b * n) / bins);
    const hi = fromIndex + Math.floor(((b + 1) * n) / bins);
    let iMin = -1;
    let iMax = -1;
    let vMin = Infinity;
    let vMax = -Infinity;
    for (let i = lo; i < hi; i++) {
      const v = values[i];
      if (v < vMin) {
        vMin = v;
        iMin = i;
      }
      if (v > vMax) {
        vMax = v;
        iMax = i;
      }
    }
    if (iMin < 0) continue; // an all-NaN bin leaves a gap
    const first = iMin <= iMax ? iMin : iMax;
    const second = iMin <= iMax ? iMax : iMin;
    timesS[k] = startS + first * dtS;
    out[k++] = values[first];
    if (second !== first) {
      timesS[k] = startS + second * dtS;
      out[k++] = values[second];
    }
  }
  return { timesS: timesS.subarray(0, k), values: out.subarray(0, k), fromIndex, toIndex, raw: false };
}
