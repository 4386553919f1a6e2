import type { CutoffRows } from './cutoffRows';
import type { RowGroup } from './groups';
import type { AnalysisHypothesis, PreparedTrial, PriorWidthFit } from './types';
import { arrivalTimeS } from './arrivalTime';
import { bayesPriorWeight, G0_MPS2, onsetJacobian } from './hypothesisTtc';
import { profileInterval, stratifiedMaxLogLik } from './thresholdModel';

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
  const values = new Float64Array(rows.n);
  const jac = new Float64Array(rows.n);
  const logGrid = grid.map(Math.log);
  for (const grp of subjectGroups) {
    const S = grid.length;
    const ttc = new Float64Array(grp.rows.length * S);
    const lj = new Float64Array(grp.rows.length * S);
    const keep: number[] = [];
    for (let i = 0; i < grp.rows.length; i++) {
      const r = grp.rows[i];
      const p = rows.state[r * 3];
      const v = rows.state[r * 3 + 1];
      const off = rows.cutoffS[r] - rows.onsetS[r];
      const fitted = prepared[rows.trialIndex[r]].fittedAccMps2;
      const aSeen = Number.isFinite(fitted) ? fitted : rows.state[r * 3 + 2];
      let ok = true;
      for (let s = 0; s < S; s++) {
        const w = bayesPriorWeight(rows.accFiltVar[r], grid[s]);
        const a = w * -gPrior + (1 - w) * rows.accFilt[r];
        const tau = arrivalTimeS(p, v, a, rows.targetM[r]);
        const t = off + tau;
        ttc[i * S + s] = t;
        lj[i * S + s] = cutoffMovesWithOnset ? onsetJacobian(v, aSeen, a, tau) : 1;
        if (!Number.isFinite(t) || !Number.isFinite(lj[i * S + s])) ok = false;
      }
      if (ok) keep.push(i);
    }
    const stratum = Int32Array.from(keep.map((i) => grp.rows[i]));
    const ll = new Float64Array(S);
    for (let s = 0; s < S; s++) {
      for (const i of keep) {
        values[grp.rows[i]] = ttc[i * S + s];
        jac[grp.rows[i]] = lj[i * S + s];
      }
      ll[s] = stratum.length >= 3 ? stratifiedMaxLogLik(values, [stratum], jac) : NaN;
    }
    const iv = stratum.length >= 3 ? profileInterval(logGrid, ll) : { best: NaN, lo: NaN, hi: NaN };
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
