import type { CutoffRows } from './cutoffRows';
import type { RowGroup } from './groups';
import type { InternalGravityProfile, PreparedTrial } from './types';
import { arrivalTimeS } from './arrivalTime';
import { profileInterval, SPREAD_FLOOR_S } from './thresholdModel';
import { G0_MPS2, onsetJacobian } from './hypothesisTtc';

/** ttc and Jacobian |d ttc / d onset| of every row at every grid value, rows x grid row-major. */
export interface GravityGridTtc {
  ttc: Float64Array;
  jac: Float64Array;
}

/**
 * Time-to-contact at onset of every row for each internal gravity of a grid (s), rows x grid row-major:
 * ttc(G) = cutoff + arrival(p, v, -G, target) - onset. Rows without a base state are NaN.
 *
 * @param rows - cutoff rows (filled)
 * @param prepared - prepared trials (fitted constant acceleration for the Jacobian)
 * @param gridMps2 - internal gravity magnitudes, m/s^2
 * @param cutoffMovesWithOnset - false for the `after-release` rule (Jacobian 1)
 * @returns ttc and Jacobian |d ttc / d onset|, rows.n * grid.length each
 */
export function ttcOverGravityGrid(rows: CutoffRows, prepared: readonly PreparedTrial[], gridMps2: Float64Array, cutoffMovesWithOnset: boolean): GravityGridTtc {
  const G = gridMps2.length;
  const out = new Float64Array(rows.n * G).fill(NaN);
  const lj = new Float64Array(rows.n * G).fill(NaN);
  for (let r = 0; r < rows.n; r++) {
    if (!rows.base[r]) continue;
    const p = rows.state[r * 3];
    const v = rows.state[r * 3 + 1];
    const tgt = rows.targetM[r];
    const off = rows.cutoffS[r] - rows.onsetS[r];
    const fitted = prepared[rows.trialIndex[r]].fittedAccMps2;
    const aSeen = Number.isFinite(fitted) ? fitted : rows.state[r * 3 + 2];
    for (let g = 0; g < G; g++) {
      const tau = arrivalTimeS(p, v, -gridMps2[g], tgt);
      out[r * G + g] = off + tau;
      lj[r * G + g] = cutoffMovesWithOnset ? onsetJacobian(v, aSeen, -gridMps2[g], tau) : 1;
    }
  }
  return { ttc: out, jac: lj };
}

/**
 * Evenly spaced internal-gravity grid from 0 to maxG * g0.
 *
 * @param points - number of grid values (>= 3)
 * @param maxG - upper end in multiples of g0 = 9.80665 m/s^2
 * @returns the grid, m/s^2
 * @throws RangeError for fewer than 3 points or a non-positive maxG
 */
export function gravityGrid(points: number, maxG: number): Float64Array {
  if (!(points >= 3) || !Number.isInteger(points)) throw new RangeError(`gravityGrid: points must be an integer >= 3, got ${points}`);
  if (!(maxG > 0)) throw new RangeError(`gravityGrid: maxG must be > 0, got ${maxG}`);
  const out = new Float64Array(points);
  for (let i = 0; i < points; i++) out[i] = (i / (points - 1)) * maxG * G0_MPS2;
  return out;
}

/**
 * Internal gravity per group: the gravity magnitude whose time-to-contact at onset is best explained by
 * the constant-threshold model (profile log-likelihood over the grid, threshold and spread profiled out),
 * with its 95% likelihood-ratio interval. Rows whose ttc is not finite at every grid value are left out
 * of that group's profile so all grid values see the same data.
 *
 * @param groups - row groups (strata)
 * @param gridTtc - from {@link ttcOverGravityGrid}
 * @param gridMps2 - the grid, m/s^2
 * @returns one profile per group (groups with fewer than 3 rows give NaN estimates)
 * @see Wilks 1938, Ann Math Stat 9:60-62 (likelihood-ratio interval); Pawitan 2001, In All Likelihood, ch. 2.
 */
export function internalGravityProfiles(groups: readonly RowGroup[], gridTtc: GravityGridTtc, gridMps2: Float64Array): InternalGravityProfile[] {
  const ttcGrid = gridTtc.ttc;
  const ljGrid = gridTtc.jac;
  const G = gridMps2.length;
  const out: InternalGravityProfile[] = [];
  // rows finite at every grid value (the same for every group they belong to)
  const complete = new Uint8Array(ttcGrid.length / G);
  for (let r = 0; r < complete.length; r++) {
    let ok = true;
    for (let g = 0; g < G && ok; g++) ok = Number.isFinite(ttcGrid[r * G + g]) && Number.isFinite(ljGrid[r * G + g]);
    complete[r] = ok ? 1 : 0;
  }
  for (const grp of groups) {
    const strata = grp.strata.map((s) => s.filter((r) => complete[r] === 1));
    const n = strata.reduce((a, s) => a + s.length, 0);
    const ll = new Float64Array(G);
    for (let g = 0; g < G; g++) {
      if (n < 3) {
        ll[g] = NaN;
        continue;
      }
      let sum = 0;
      for (const s of strata) sum += gridColumnMaxLogLik(ttcGrid, ljGrid, s, G, g);
      ll[g] = sum;
    }
    const iv = n >= 3 ? profileInterval(gridMps2, ll) : { best: NaN, lo: NaN, hi: NaN };
    out.push({
      subject: grp.subject,
      condition: grp.condition,
      muscle: grp.muscle,
      gMps2: gridMps2,
      logLik: ll,
      bestGMps2: iv.best,
      loMps2: iv.lo,
      hiMps2: iv.hi,
      n,
    });
  }
  return out;
}

/**
 * thresholdModel.ts gaussianMaxLogLik (same sums in the same order) of grid column g over one stratum's
 * rows, read in place from the rows x grid matrices (0 for an empty stratum, as stratifiedMaxLogLik).
 */
function gridColumnMaxLogLik(ttcGrid: Float64Array, ljGrid: Float64Array, idx: Int32Array, G: number, g: number): number {
  const count = idx.length;
  if (count === 0) return 0;
  let sw = 0;
  let swx = 0;
  for (let i = 0; i < count; i++) {
    const q = idx[i] * G + g;
    const w = 1 / (ljGrid[q] * ljGrid[q]);
    sw += w;
    swx += w * ttcGrid[q];
  }
  const mean = swx / sw;
  let ss = 0;
  for (let i = 0; i < count; i++) {
    const q = idx[i] * G + g;
    const d = ttcGrid[q] - mean;
    ss += (d * d) / (ljGrid[q] * ljGrid[q]);
  }
  const v = Math.max(ss / count, SPREAD_FLOOR_S * SPREAD_FLOOR_S);
  return -0.5 * count * (Math.log(2 * Math.PI * v) + 1);
}
