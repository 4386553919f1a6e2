import type { CutoffRows } from './cutoffRows';
import type { RowGroup } from './groups';
import type { AnalysisHypothesis, PreparedTrial, PriorWidthFit } from './types';
import { arrivalTimeS } from './arrivalTime';
import { bayesPriorWeight, G0_MPS2, onsetJacobian } from './hypothesisTtc';
import { profileInterval, SPREAD_FLOOR_S } from './thresholdModel';

/**
 * Log-spaced grid of prior widths.
 *
 * @param points - number of values (>= 3)
 * @param minMps2 - smallest width, m/s^2 (> 0)
 * @param maxMps2 - largest width, m/s^2 (> minMps2)
 * @returns the grid, m/s^2
 * @throws RangeError on bad bounds
 */
export function priorWidthGrid(points: number, minMps2: number, maxMps2: number): Float64Array {
  if (!(points >= 3) || !Number.isInteger(points)) throw new RangeError(`priorWidthGrid: points must be an integer >= 3, got ${points}`);
  if (!(minMps2 > 0) || !(maxMps2 > minMps2)) throw new RangeError(`priorWidthGrid: need 0 < min < max, got ${minMps2}, ${maxMps2}`);
  const out = new Float64Array(points);
  const a = Math.log(minMps2);
  const b = Math.log(maxMps2);
  for (let i = 0; i < points; i++) out[i] = Math.exp(a + ((b - a) * i) / (points - 1));
  return out;
}

/**
 * Fits the Bayesian observer's prior width per subject (per muscle) by maximum likelihood of the
 * constant-threshold model, pooled over the subject's conditions (one threshold), and returns the width to
 * use on every row. The profile runs over log(sigma) so the interval is found on the log grid; the
 * 95% interval uses the likelihood-ratio cut 1.92.
 *
 * @param h - the bayesian-observer hypothesis (prior centre `priorGMps2`, default g0)
 * @param rows - cutoff rows
 * @param prepared - prepared trials (conditions for the per-condition prior weight)
 * @param subjectGroups - the subject x `all` groups (one stratum each)
 * @param grid - prior widths, m/s^2 (log spaced)
 * @param cutoffMovesWithOnset - false for the `after-release` rule (Jacobian 1)
 * @returns fits per subject x muscle, and sigma per row (NaN for rows of unfitted subjects)
 * @see Koerding & Wolpert 2004, Nature 427:244-247 (Bayesian integration of a prior and a noisy cue,
 *   precision weighting); Wilks 1938 (likelihood-ratio interval)
 */
export function fitPriorWidths(
  h: AnalysisHypothesis,
  rows: CutoffRows,
  prepared: readonly PreparedTrial[],
  subjectGroups: readonly RowGroup[],
  grid: Float64Array,
  cutoffMovesWithOnset: boolean,
): { fits: PriorWidthFit[]; sigmaByRow: Float64Array } {
  const gPrior = h.priorGMps2 ?? G0_MPS2;
  const sigmaByRow = new Float64Array(rows.n).fill(NaN);
  const fits: PriorWidthFit[] = [];
  const logGrid = grid.map(Math.log);
  const S = grid.length;
  let most = 0;
  for (const grp of subjectGroups) most = Math.max(most, grp.rows.length);
  // ttc and Jacobian of each group row (row-major, S per row), reused across groups
  const ttc = new Float64Array(most * S);
  const lj = new Float64Array(most * S);
  const keep = new Int32Array(most);
  for (const grp of subjectGroups) {
    let kept = 0;
    for (let i = 0; i < grp.rows.length; i++) {
      const r = grp.rows[i];
      const p = rows.state[r * 3];
      const v = rows.state[r * 3 + 1];
      const off = rows.cutoffS[r] - rows.onsetS[r];
      const fitted = prepared[rows.trialIndex[r]].fittedAccMps2;
      const aSeen = Number.isFinite(fitted) ? fitted : rows.state[r * 3 + 2];
      const vf = rows.accFiltVar[r];
      const af = rows.accFilt[r];
      const target = rows.targetM[r];
      let ok = true;
      for (let s = 0; s < S; s++) {
        const w = bayesPriorWeight(vf, grid[s]);
        const a = w * -gPrior + (1 - w) * af;
        const tau = arrivalTimeS(p, v, a, target);
        const t = off + tau;
        const j = cutoffMovesWithOnset ? onsetJacobian(v, aSeen, a, tau) : 1;
        ttc[i * S + s] = t;
        lj[i * S + s] = j;
        if (!Number.isFinite(t) || !Number.isFinite(j)) ok = false;
      }
      if (ok) keep[kept++] = i;
    }
    const ll = new Float64Array(S);
    for (let s = 0; s < S; s++) ll[s] = kept >= 3 ? keptMaxLogLik(ttc, lj, keep, kept, S, s) : NaN;
    const iv = kept >= 3 ? profileInterval(logGrid, ll) : { best: NaN, lo: NaN, hi: NaN };
    const best = Math.exp(iv.best);
    const weightSum = new Map<string, { s: number; n: number }>();
    for (const r of grp.rows) {
      sigmaByRow[r] = best;
      const c = prepared[rows.trialIndex[r]].trial.condition;
      const w = bayesPriorWeight(rows.accFiltVar[r], best);
      if (!Number.isFinite(w)) continue;
      const e = weightSum.get(c) ?? { s: 0, n: 0 };
      e.s += w;
      e.n += 1;
      weightSum.set(c, e);
    }
    const priorWeightByCondition: Record<string, number> = {};
    for (const [c, e] of [...weightSum].sort((a, b) => (a[0] < b[0] ? -1 : 1))) priorWeightByCondition[c] = e.s / e.n;
    fits.push({
      subject: grp.subject,
      muscle: grp.muscle,
      hypothesis: h.id,
      sigmaMps2: grid,
      logLik: ll,
      bestSigmaMps2: best,
      loMps2: Math.exp(iv.lo),
      hiMps2: Math.exp(iv.hi),
      priorWeightByCondition,
    });
  }
  return { fits, sigmaByRow };
}

/**
 * thresholdModel.ts gaussianMaxLogLik (same sums in the same order) of column s of the row-major
 * ttc/Jacobian block, over the kept rows.
 */
function keptMaxLogLik(ttc: Float64Array, lj: Float64Array, keep: Int32Array, count: number, S: number, s: number): number {
  let sw = 0;
  let swx = 0;
  for (let k = 0; k < count; k++) {
    const q = keep[k] * S + s;
    const w = 1 / (lj[q] * lj[q]);
    sw += w;
    swx += w * ttc[q];
  }
  const mean = swx / sw;
  let ss = 0;
  for (let k = 0; k < count; k++) {
    const q = keep[k] * S + s;
    const d = ttc[q] - mean;
    ss += (d * d) / (lj[q] * lj[q]);
  }
  const v = Math.max(ss / count, SPREAD_FLOOR_S * SPREAD_FLOOR_S);
  return -0.5 * count * (Math.log(2 * Math.PI * v) + 1);
}
