/**
 * The constant time-to-contact threshold model: the muscle switches on when the time-to-contact computed
 * under a hypothesis reaches the subject's threshold theta, and the onset time carries Gaussian motor noise
 * of SD sigma (seconds). To first order the onset's time residual is (ttc_i - theta) / J_i with
 * J_i = |d ttc / d onset| (hypothesisTtc.ts onsetJacobian), so the log-likelihood of the onset times is
 *   logL = sum_i ln N((ttc_i - theta) / J_i; 0, sigma^2),
 * maximised by the weighted mean theta = sum w_i ttc_i / sum w_i (w_i = 1 / J_i^2) and
 * sigma^2 = sum w_i (ttc_i - theta)^2 / n, giving logL = -n/2 * (ln(2 pi sigma^2) + 1).
 * With J_i = 1 (no Jacobian given) this is the plain Gaussian fit of ttc.
 *
 * Strata: a pooled fit sums independent fits (each stratum its own threshold and spread).
 */

/** Smallest spread allowed, s (0.1 ms): keeps the likelihood finite for identical values. */
export const SPREAD_FLOOR_S = 1e-4;

/**
 * Maximised Gaussian log-likelihood of values[idx[0..count)].
 *
 * @param values - ttc values, s
 * @param idx - row indices
 * @param count - how many of idx to use
 * @param jac - Jacobian |d ttc / d onset| per row (null: all 1)
 * @returns the log-likelihood; 0 when count is 0
 * @see any statistics text: normal maximum likelihood (e.g. Casella & Berger 2002, Example 7.2.11)
 */
export function gaussianMaxLogLik(values: Float64Array, idx: Int32Array, count: number, jac: Float64Array | null = null): number {
  if (count === 0) return 0;
  let sw = 0;
  let swx = 0;
  for (let i = 0; i < count; i++) {
    const r = idx[i];
    const w = jac ? 1 / (jac[r] * jac[r]) : 1;
    sw += w;
    swx += w * values[r];
  }
  const mean = swx / sw;
  let ss = 0;
  for (let i = 0; i < count; i++) {
    const r = idx[i];
    const d = values[r] - mean;
    ss += jac ? (d * d) / (jac[r] * jac[r]) : d * d;
  }
  const v = Math.max(ss / count, SPREAD_FLOOR_S * SPREAD_FLOOR_S);
  return -0.5 * count * (Math.log(2 * Math.PI * v) + 1);
}

/**
 * Sum of {@link gaussianMaxLogLik} over strata (each stratum its own threshold and spread).
 *
 * @param values - ttc values, s
 * @param strata - row indices of each stratum
 * @param jac - Jacobian per row (null: all 1)
 * @returns the pooled log-likelihood
 */
export function stratifiedMaxLogLik(values: Float64Array, strata: readonly Int32Array[], jac: Float64Array | null = null): number {
  let ll = 0;
  for (const s of strata) ll += gaussianMaxLogLik(values, s, s.length, jac);
  return ll;
}

/** Best grid value and a likelihood-ratio interval. */
export interface ProfileInterval {
  best: number;
  bestLogLik: number;
  lo: number;
  hi: number;
}

/**
 * Maximum of a profile log-likelihood over a grid (refined by the parabola through the best point and its
 * neighbours) and the likelihood-ratio interval {x : logL(x) >= max - cut}, edges interpolated linearly
 * (cut = 1.92 = chi-square(1) 95% quantile 3.841 / 2 gives a 95% interval; Wilks 1938).
 *
 * @param grid - increasing grid values
 * @param logLik - profile log-likelihood at each grid value (NaN/-Infinity allowed)
 * @param cut - drop from the maximum, default 1.92
 * @returns best value, its log-likelihood and the interval ends (grid ends when the interval is open)
 */
export function profileInterval(grid: Float64Array, logLik: Float64Array, cut = 1.92): ProfileInterval {
  const n = grid.length;
  let ib = -1;
  for (let i = 0; i < n; i++) if (Number.isFinite(logLik[i]) && (ib < 0 || logLik[i] > logLik[ib])) ib = i;
  if (ib < 0) return { best: NaN, bestLogLik: NaN, lo: NaN, hi: NaN };
  let best = grid[ib];
  let bestLL = logLik[ib];
  if (ib > 0 && ib < n - 1 && Number.isFinite(logLik[ib - 1]) && Number.isFinite(logLik[ib + 1])) {
    const x0 = grid[ib - 1];
    const x1 = grid[ib];
    const x2 = grid[ib + 1];
    const y0 = logLik[ib - 1];
    const y1 = logLik[ib];
    const y2 = logLik[ib + 1];
    const den = (x0 - x1) * (x0 - x2) * (x1 - x2);
    const A = (x2 * (y1 - y0) + x1 * (y0 - y2) + x0 * (y2 - y1)) / den;
    const B = (x2 * x2 * (y0 - y1) + x1 * x1 * (y2 - y0) + x0 * x0 * (y1 - y2)) / den;
    if (A < 0) {
      const xv = -B / (2 * A);
      if (xv > x0 && xv < x2) {
        best = xv;
        const C = y0 - A * x0 * x0 - B * x0;
        bestLL = A * xv * xv + B * xv + C;
      }
    }
  }
  const level = bestLL - cut;
  let lo = grid[0];
  for (let i = ib; i > 0; i--) {
    if (!(logLik[i - 1] >= level)) {
      const a = logLik[i - 1];
      const b = logLik[i];
      lo = Number.isFinite(a) ? grid[i - 1] + ((level - a) / (b - a)) * (grid[i] - grid[i - 1]) : grid[i];
      break;
    }
  }
  let hi = grid[n - 1];
  for (let i = ib; i < n - 1; i++) {
    if (!(logLik[i + 1] >= level)) {
      const a = logLik[i];
      const b = logLik[i + 1];
      hi = Number.isFinite(b) ? grid[i] + ((a - level) / (a - b)) * (grid[i + 1] - grid[i]) : grid[i];
      break;
    }
  }
  return { best, bestLogLik: bestLL, lo: Math.min(lo, best), hi: Math.max(hi, best) };
}
