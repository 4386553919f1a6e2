/**
 * The 3-state [height m, velocity m/s, acceleration m/s^2] and its 3x3 covariance at any instant,
 * linearly interpolated between the samples of a cached series.
 *
 * @param timesS - sample times, s, strictly increasing, length T
 * @param state - T x 3 row-major states
 * @param cov - T x 9 row-major covariances
 * @param tS - instant, s
 * @param outState - receives the 3 state values
 * @param outCov - receives the 9 covariance values (may be null when not needed)
 * @returns false when tS lies outside [timesS[0], timesS[T-1]] or is NaN (outputs untouched)
 */
export function stateAtTime(
  timesS: Float64Array,
  state: Float64Array,
  cov: Float64Array | null,
  tS: number,
  outState: Float64Array,
  outCov: Float64Array | null,
): boolean {
  const T = timesS.length;
  if (T === 0 || !(tS >= timesS[0]) || !(tS <= timesS[T - 1])) return false;
  // binary search for the last sample at or before tS
  let lo = 0;
  let hi = T - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (timesS[mid] <= tS) lo = mid;
    else hi = mid;
  }
  const span = timesS[hi] - timesS[lo];
  const w = span > 0 ? (tS - timesS[lo]) / span : 0;
  const w0 = 1 - w;
  for (let i = 0; i < 3; i++) outState[i] = w0 * state[lo * 3 + i] + w * state[hi * 3 + i];
  if (cov && outCov) for (let i = 0; i < 9; i++) outCov[i] = w0 * cov[lo * 9 + i] + w * cov[hi * 9 + i];
  return true;
}

/**
 * A scalar series (e.g. target height) linearly interpolated at tS; the end value outside the range.
 *
 * @param timesS - sample times, s, increasing
 * @param values - values at those times (NaN allowed)
 * @param tS - instant, s
 * @returns interpolated value (NaN when tS is NaN or the series is empty)
 */
export function valueAtTime(timesS: Float64Array, values: Float64Array, tS: number): number {
  const T = timesS.length;
  if (T === 0 || Number.isNaN(tS)) return NaN;
  if (tS <= timesS[0]) return values[0];
  if (tS >= timesS[T - 1]) return values[T - 1];
  let lo = 0;
  let hi = T - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (timesS[mid] <= tS) lo = mid;
    else hi = mid;
  }
  const w = (tS - timesS[lo]) / (timesS[hi] - timesS[lo]);
  return (1 - w) * values[lo] + w * values[hi];
}
