import type { RowGroup } from './groups';
import { SPREAD_FLOOR_S, stratifiedMaxLogLik } from './thresholdModel';
import { seededRandom } from './seededRandom';

/** Comparison of hypotheses in one group. */
export interface GroupComparison {
  n: number;
  /** Per hypothesis (settings order). */
  logLik: Float64Array;
  k: Int32Array;
  aic: Float64Array;
  bic: Float64Array;
  posterior: Float64Array;
  /** logLik - best logLik, with bootstrap 95% percentile interval. */
  dLogLik: Float64Array;
  dLo: Float64Array;
  dHi: Float64Array;
  /** Index of the best hypothesis (highest posterior). */
  best: number;
}

/**
 * Compares hypotheses in one group under the constant-threshold model: maximised log-likelihood, AIC,
 * BIC, posterior probabilities with equal priors (BIC approximation: p_h proportional to exp(-BIC_h / 2)),
 * and seeded bootstrap percentile intervals of the log-likelihood difference to the best hypothesis
 * (rows resampled with replacement within each stratum; the same resample for every hypothesis).
 *
 * @param group - the group's strata of row indices
 * @param ttcByHyp - ttc at onset per hypothesis, s (indexed by row)
 * @param jacByHyp - Jacobian |d ttc / d onset| per hypothesis and row (change of variables to onset times)
 * @param paramsPerStratum - free parameters per stratum per hypothesis (2, or 3 with a fitted prior width)
 * @param replicates - bootstrap replicates (0 = none: intervals NaN)
 * @param seed - bootstrap seed
 * @returns the comparison
 * @see Akaike 1974, IEEE Trans Automat Contr 19:716-723; Schwarz 1978, Ann Stat 6:461-464;
 *   Wagenmakers & Farrell 2004, Psychon Bull Rev 11:192-196 (weights from information criteria);
 *   Efron & Tibshirani 1993, An Introduction to the Bootstrap, ch. 13 (percentile interval).
 */
export function compareGroup(
  group: RowGroup,
  ttcByHyp: readonly Float64Array[],
  jacByHyp: readonly Float64Array[],
  paramsPerStratum: readonly number[],
  replicates: number,
  seed: number,
): GroupComparison {
  const H = ttcByHyp.length;
  const n = group.rows.length;
  const logLik = new Float64Array(H);
  const k = new Int32Array(H);
  const aic = new Float64Array(H);
  const bic = new Float64Array(H);
  const posterior = new Float64Array(H);
  const nStrata = group.strata.filter((s) => s.length > 0).length;
  let minBic = Infinity;
  for (let h = 0; h < H; h++) {
    logLik[h] = stratifiedMaxLogLik(ttcByHyp[h], group.strata, jacByHyp[h]);
    k[h] = paramsPerStratum[h] * nStrata;
    aic[h] = 2 * k[h] - 2 * logLik[h];
    bic[h] = k[h] * Math.log(Math.max(n, 1)) - 2 * logLik[h];
    if (bic[h] < minBic) minBic = bic[h];
  }
  let z = 0;
  for (let h = 0; h < H; h++) z += (posterior[h] = Math.exp(-0.5 * (bic[h] - minBic)));
  let best = 0;
  for (let h = 0; h < H; h++) {
    posterior[h] /= z;
    if (posterior[h] > posterior[best]) best = h;
  }
  const dLogLik = new Float64Array(H);
  for (let h = 0; h < H; h++) dLogLik[h] = logLik[h] - logLik[best];
  const dLo = new Float64Array(H).fill(NaN);
  const dHi = new Float64Array(H).fill(NaN);
  if (replicates > 0 && n >= 3) {
    // per row and hypothesis: w = 1/J^2, w x, w x^2 (one pass per resample, no division in the loop)
    const rowsAll = group.rows;
    const R = rowsAll.length;
    const w = new Float64Array(H * R);
    const wx = new Float64Array(H * R);
    const wxx = new Float64Array(H * R);
    const local = new Map<number, number>();
    for (let i = 0; i < R; i++) local.set(rowsAll[i], i);
    const strataLocal = group.strata.map((s) => Int32Array.from(s, (r) => local.get(r)!));
    for (let h = 0; h < H; h++) {
      const x = ttcByHyp[h];
      const j = jacByHyp[h];
      for (let i = 0; i < R; i++) {
        const r = rowsAll[i];
        const wi = 1 / (j[r] * j[r]);
        w[h * R + i] = wi;
        wx[h * R + i] = wi * x[r];
        wxx[h * R + i] = wi * x[r] * x[r];
      }
    }
    const rng = seededRandom(seed);
    const draws = new Float64Array(replicates * H);
    const idx = strataLocal.map((s) => new Int32Array(s.length));
    const ll = new Float64Array(H);
    const floor2 = SPREAD_FLOOR_S * SPREAD_FLOOR_S;
    const LOG2PI = Math.log(2 * Math.PI);
    for (let b = 0; b < replicates; b++) {
      for (let s = 0; s < strataLocal.length; s++) {
        const src = strataLocal[s];
        const dst = idx[s];
        const m = src.length;
        for (let i = 0; i < m; i++) dst[i] = src[Math.floor(rng.uniform() * m)];
      }
      for (let h = 0; h < H; h++) {
        const off = h * R;
        let sum = 0;
        for (let s = 0; s < idx.length; s++) {
          const ids = idx[s];
          const m = ids.length;
          if (m === 0) continue;
          let sw = 0;
          let swx = 0;
          let swxx = 0;
          for (let i = 0; i < m; i++) {
            const q = off + ids[i];
            sw += w[q];
            swx += wx[q];
            swxx += wxx[q];
          }
          // sum w (x - mean)^2 = sum w x^2 - (sum w x)^2 / sum w
          const v = Math.max((swxx - (swx * swx) / sw) / m, floor2);
          sum += -0.5 * m * (LOG2PI + Math.log(v) + 1);
        }
        ll[h] = sum;
      }
      for (let h = 0; h < H; h++) draws[h * replicates + b] = ll[h] - ll[best];
    }
    for (let h = 0; h < H; h++) {
      const d = draws.subarray(h * replicates, (h + 1) * replicates).sort();
      dLo[h] = quantileSorted(d, 0.025);
      dHi[h] = quantileSorted(d, 0.975);
    }
  }
  return { n, logLik, k, aic, bic, posterior, dLogLik, dLo, dHi, best };
}

/**
 * Quantile of sorted values by linear interpolation (type 7 of Hyndman & Fan 1996, Am Stat 50:361-365;
 * the default of R and numpy).
 *
 * @param sorted - ascending values
 * @param q - probability in [0, 1]
 * @returns the quantile (NaN for no values)
 */
export function quantileSorted(sorted: Float64Array, q: number): number {
  const n = sorted.length;
  if (n === 0) return NaN;
  const h = (n - 1) * q;
  const lo = Math.floor(h);
  const hi = Math.min(lo + 1, n - 1);
  return sorted[lo] + (h - lo) * (sorted[hi] - sorted[lo]);
}
