import type { RowGroup } from './groups';
import { SPREAD_FLOOR_S, stratifiedMaxLogLik } from './thresholdModel';
import { seededRandom } from './seededRandom';
import { quantileSelectPair } from './quantileSelect';
import { bootstrapBucket, findBootstrap, rememberBootstrap } from './evaluationMemo';

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
 * @param memoLabel - when given (a label naming the group, e.g. subject, condition and muscle), each
 *   hypothesis' bootstrap replicates are kept between calls and reused while its values at the group's rows,
 *   the strata, seed and replicate count stay the same (evaluationMemo.ts); results are identical either way
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
  memoLabel?: string,
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
  if (replicates > 0 && n >= 3) bootstrapDifferences(group, ttcByHyp, jacByHyp, best, replicates, seed, dLo, dHi, memoLabel);
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

/**
 * Seeded bootstrap percentile intervals of logLik_h - logLik_best (rows resampled with replacement within
 * each stratum, the same resample for every hypothesis). Each resample is scored from sufficient
 * statistics: per row and hypothesis w = 1/J^2, w d and w d^2 with d = ttc - c, c the stratum's weighted
 * mean under that hypothesis (centring keeps sum w d^2 - (sum w d)^2 / sum w free of cancellation when the
 * spread is small against the threshold). The rows' statistics sit side by side (row-major, 3 values per
 * hypothesis) so a draw reads one contiguous block; a stratum's draws come in one call of the generator.
 * A hypothesis' replicate log-likelihoods depend only on the resamples (strata, seed) and its own values,
 * so with a memo label they are kept between evaluations and reused while those stay equal (toggling
 * other hypotheses leaves them untouched). The resamples themselves are drawn again when needed: a new
 * delay usually changes which rows are usable, hence the strata, so keeping them did not pay for its memory.
 */
function bootstrapDifferences(
  group: RowGroup,
  ttcByHyp: readonly Float64Array[],
  jacByHyp: readonly Float64Array[],
  best: number,
  replicates: number,
  seed: number,
  dLo: Float64Array,
  dHi: Float64Array,
  memoLabel: string | undefined,
): void {
  const H = ttcByHyp.length;
  const strata = group.strata;
  const S = strata.length;
  const start = new Int32Array(S + 1);
  for (let s = 0; s < S; s++) start[s + 1] = start[s] + strata[s].length;
  const R = start[S];
  const rows = new Int32Array(R);
  for (let s = 0; s < S; s++) rows.set(strata[s], start[s]);
  const bucket = memoLabel === undefined ? null : bootstrapBucket(memoLabel, strata, seed, replicates);
  const entries = bucket ? bucket.entries : null;
  const llByHyp: Float64Array[] = new Array(H);
  const missing: number[] = [];
  for (let h = 0; h < H; h++) {
    const found = entries ? findBootstrap(entries, rows, ttcByHyp[h], jacByHyp[h]) : null;
    if (found) llByHyp[h] = found.ll;
    else missing.push(h);
  }
  if (missing.length > 0) {
    const fresh = replicateLogLiks(strata, start, missing.map((h) => ttcByHyp[h]), missing.map((h) => jacByHyp[h]), replicates, seed);
    for (let i = 0; i < missing.length; i++) {
      const h = missing[i];
      llByHyp[h] = fresh[i];
      if (!entries) continue;
      const ttc = new Float64Array(R);
      const jac = new Float64Array(R);
      for (let k = 0; k < R; k++) {
        ttc[k] = ttcByHyp[h][rows[k]];
        jac[k] = jacByHyp[h][rows[k]];
      }
      rememberBootstrap(entries, { ttc, jac, ll: fresh[i] });
    }
  }
  const d = new Float64Array(replicates);
  const q = new Float64Array(2);
  const llBest = llByHyp[best];
  for (let h = 0; h < H; h++) {
    const ll = llByHyp[h];
    let finite = true;
    for (let b = 0; b < replicates; b++) finite = Number.isFinite((d[b] = ll[b] - llBest[b])) && finite;
    if (!finite) {
      d.sort(); // never expected (weights and values are finite): the sorted route orders NaN last
      dLo[h] = quantileSorted(d, 0.025);
      dHi[h] = quantileSorted(d, 0.975);
    } else if (h === best) {
      dLo[h] = dHi[h] = 0; // every difference is exactly 0
    } else {
      quantileSelectPair(d, 0.025, 0.975, q);
      dLo[h] = q[0];
      dHi[h] = q[1];
    }
  }
}

const FLOOR2 = SPREAD_FLOOR_S * SPREAD_FLOOR_S;
const LOG2PI = Math.log(2 * Math.PI);

/**
 * Maximised log-likelihood of one stratum's resample under one hypothesis from its rows' statistics.
 * @param stats - per row 3 values per hypothesis (w, w d, w d^2)
 * @param offsets - offsets of the drawn rows' blocks in stats
 * @param m - draws
 * @param col - the hypothesis' column in a block (3 h)
 */
function resampleLogLik(stats: Float64Array, offsets: Int32Array, m: number, col: number): number {
  let sw = 0;
  let swd = 0;
  let swdd = 0;
  for (let i = 0; i < m; i++) {
    const q = offsets[i] + col;
    sw += stats[q];
    swd += stats[q + 1];
    swdd += stats[q + 2];
  }
  // sum w (x - mean)^2 = sum w d^2 - (sum w d)^2 / sum w
  const v = Math.max((swdd - (swd * swd) / sw) / m, FLOOR2);
  return -0.5 * m * (LOG2PI + Math.log(v) + 1);
}

/**
 * {@link resampleLogLik} for three neighbouring hypotheses in one pass (nine independent sums); adds the
 * results to outA[b], outB[b] and outC[b].
 */
function resampleTripleLogLik(
  stats: Float64Array,
  offsets: Int32Array,
  m: number,
  col: number,
  outA: Float64Array,
  outB: Float64Array,
  outC: Float64Array,
  b: number,
): void {
  let aw = 0;
  let awd = 0;
  let awdd = 0;
  let bw = 0;
  let bwd = 0;
  let bwdd = 0;
  let cw = 0;
  let cwd = 0;
  let cwdd = 0;
  for (let i = 0; i < m; i++) {
    const q = offsets[i] + col;
    aw += stats[q];
    awd += stats[q + 1];
    awdd += stats[q + 2];
    bw += stats[q + 3];
    bwd += stats[q + 4];
    bwdd += stats[q + 5];
    cw += stats[q + 6];
    cwd += stats[q + 7];
    cwdd += stats[q + 8];
  }
  const va = Math.max((awdd - (awd * awd) / aw) / m, FLOOR2);
  const vb = Math.max((bwdd - (bwd * bwd) / bw) / m, FLOOR2);
  const vc = Math.max((cwdd - (cwd * cwd) / cw) / m, FLOOR2);
  outA[b] += -0.5 * m * (LOG2PI + Math.log(va) + 1);
  outB[b] += -0.5 * m * (LOG2PI + Math.log(vb) + 1);
  outC[b] += -0.5 * m * (LOG2PI + Math.log(vc) + 1);
}

/**
 * {@link resampleLogLik} for two neighbouring hypotheses in one pass (six independent sums keep the
 * processor busier than three); adds the results to outA[b] and outB[b].
 */
function resamplePairLogLik(stats: Float64Array, offsets: Int32Array, m: number, col: number, outA: Float64Array, outB: Float64Array, b: number): void {
  let sw = 0;
  let swd = 0;
  let swdd = 0;
  let tw = 0;
  let twd = 0;
  let twdd = 0;
  for (let i = 0; i < m; i++) {
    const q = offsets[i] + col;
    sw += stats[q];
    swd += stats[q + 1];
    swdd += stats[q + 2];
    tw += stats[q + 3];
    twd += stats[q + 4];
    twdd += stats[q + 5];
  }
  const v = Math.max((swdd - (swd * swd) / sw) / m, FLOOR2);
  const u = Math.max((twdd - (twd * twd) / tw) / m, FLOOR2);
  outA[b] += -0.5 * m * (LOG2PI + Math.log(v) + 1);
  outB[b] += -0.5 * m * (LOG2PI + Math.log(u) + 1);
}

/** Maximised log-likelihood of every bootstrap resample for each of the given hypotheses (see above). */
function replicateLogLiks(
  strata: readonly Int32Array[],
  start: Int32Array,
  ttcByHyp: readonly Float64Array[],
  jacByHyp: readonly Float64Array[],
  replicates: number,
  seed: number,
): Float64Array[] {
  const H = ttcByHyp.length;
  const W = 3 * H;
  const S = strata.length;
  const R = start[S];
  const stats = new Float64Array(R * W);
  for (let s = 0; s < S; s++) {
    const src = strata[s];
    const m = src.length;
    for (let h = 0; h < H; h++) {
      const x = ttcByHyp[h];
      const j = jacByHyp[h];
      let sw = 0;
      let swx = 0;
      for (let i = 0; i < m; i++) {
        const wi = 1 / (j[src[i]] * j[src[i]]);
        sw += wi;
        swx += wi * x[src[i]];
      }
      const c = swx / sw;
      for (let i = 0; i < m; i++) {
        const r = src[i];
        const wi = 1 / (j[r] * j[r]);
        const d = x[r] - c;
        const q = (start[s] + i) * W + 3 * h;
        stats[q] = wi;
        stats[q + 1] = wi * d;
        stats[q + 2] = wi * d * d;
      }
    }
  }
  const rng = seededRandom(seed);
  const out = ttcByHyp.map(() => new Float64Array(replicates));
  const idx = new Int32Array(R);
  for (let b = 0; b < replicates; b++) {
    for (let s = 0; s < S; s++) {
      const m = start[s + 1] - start[s];
      if (m === 0) continue;
      rng.fillInt(idx, m, m);
      const base = start[s];
      for (let i = 0; i < m; i++) idx[i] = (base + idx[i]) * W;
      let h = 0;
      for (; h + 2 < H; h += 3) resampleTripleLogLik(stats, idx, m, 3 * h, out[h], out[h + 1], out[h + 2], b);
      if (h + 1 < H) resamplePairLogLik(stats, idx, m, 3 * h, out[h], out[h + 1], b);
      else if (h < H) out[h][b] += resampleLogLik(stats, idx, m, 3 * h);
    }
  }
  return out;
}
