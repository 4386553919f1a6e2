/**
 * Small index-based helpers shared by the onset detectors (no allocation).
 */

/** Mean, SD (n - 1) and finite count of a span, NaN skipped. */
export interface SpanStats {
  mean: number;
  sd: number;
  count: number;
}

/**
 * Mean and standard deviation of the finite samples of x[from..to).
 * @param x - samples
 * @param from - first index (inclusive)
 * @param to - last index (exclusive)
 * @returns mean, SD with n - 1 and the finite count (mean/SD NaN when fewer than 2 finite samples)
 */
export function spanStats(x: ArrayLike<number>, from: number, to: number): SpanStats {
  let n = 0;
  let mean = 0;
  let m2 = 0;
  // Welford's update: numerically stable for long spans
  for (let i = from; i < to; i++) {
    const v = x[i];
    if (v === v) {
      n++;
      const d = v - mean;
      mean += d / n;
      m2 += d * (v - mean);
    }
  }
  return { mean: n > 0 ? mean : NaN, sd: n > 1 ? Math.sqrt(m2 / (n - 1)) : NaN, count: n };
}

/**
 * First index i in [from, to) where stat stays above thr for runLength samples (i .. i + runLength - 1,
 * which may extend up to limit). NaN ends a run.
 * @param stat - detection statistic
 * @param from - first candidate index
 * @param to - candidates end (exclusive)
 * @param limit - the run may look up to here (exclusive)
 * @param thr - threshold (strictly above counts)
 * @param runLength - samples the run must last (>= 1)
 * @returns index, or -1
 */
export function firstSustainedAbove(stat: ArrayLike<number>, from: number, to: number, limit: number, thr: number, runLength: number): number {
  let start = -1;
  for (let i = from; i < limit; i++) {
    if (stat[i] > thr) {
      if (start < 0) {
        if (i >= to) return -1;
        start = i;
      }
      if (i - start + 1 >= runLength) return start;
    } else start = -1;
  }
  return -1;
}

/**
 * First index i in [from, to) where stat stays at or below thr (or NaN) for runLength samples.
 * @param stat - detection statistic
 * @param from - first candidate index
 * @param to - end of the search (exclusive); the run must fit before it
 * @param thr - threshold (at or below counts)
 * @param runLength - samples the run must last (>= 1)
 * @returns index, or -1
 */
export function firstSustainedBelow(stat: ArrayLike<number>, from: number, to: number, thr: number, runLength: number): number {
  let start = -1;
  for (let i = from; i < to; i++) {
    if (!(stat[i] > thr)) {
      if (start < 0) start = i;
      if (i - start + 1 >= runLength) return start;
    } else start = -1;
  }
  return -1;
}

/**
 * Walks back from index idx while the previous sample is above level (and not before lowest).
 * @param stat - detection statistic
 * @param idx - starting index (a sample above level)
 * @param lowest - the walk stops here at the latest
 * @param level - level the stretch must stay above
 * @returns the first index of the above-level stretch that contains idx
 */
export function walkBackAbove(stat: ArrayLike<number>, idx: number, lowest: number, level: number): number {
  let i = idx;
  while (i > lowest && stat[i - 1] > level) i--;
  return i;
}
