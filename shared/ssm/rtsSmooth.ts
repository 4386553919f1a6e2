/**
 * Rauch-Tung-Striebel fixed-interval smoother with smoothed covariances and lag-one covariances.
 */
import { DimensionMismatchError, NotPositiveDefiniteError } from '../errors';
import type { StateSpaceModel } from './stateSpaceModel';
import type { FilterResult } from './kalmanFilter';
import { validateModel } from './stateSpaceModel';
import { choleskyLower, choleskySolveInPlace, matMul, matMulTransB, symmetrize } from './denseLinalg';
import { smoothAxis2, smoothAxis3 } from './axisSmoother';
import { DiscretizationCache } from './discretizationCache';

/** Output of {@link rtsSmooth}: moments of the state given all samples. */
export interface SmoothResult {
  /** Smoothed means E[x_k | all], T*n. */
  xSmooth: Float64Array;
  /** Smoothed covariances Cov(x_k | all), T*n*n. */
  PSmooth: Float64Array;
  /**
   * Lag-one covariances Cov(x_k, x_{k-1} | all), T*n*n (block k, row index from x_k, column from
   * x_{k-1}). Block 0 has no predecessor and is filled with NaN.
   */
  PLag: Float64Array;
}

/** Options of {@link rtsSmooth}. */
export interface RtsSmoothOptions {
  /** 'auto' (default) runs the scalar kernels for n = 2 or 3 with m = 1; 'general' the dense code. */
  kernel?: 'auto' | 'general';
}

/**
 * Allocates the per-sample output arrays of a smoother run (PLag block 0 set to NaN: no predecessor).
 * @param n - number of states
 * @param T - number of samples
 * @returns an empty {@link SmoothResult}
 */
export function allocateSmoothResult(n: number, T: number): SmoothResult {
  const PLag = new Float64Array(T * n * n);
  PLag.fill(NaN, 0, n * n);
  return { xSmooth: new Float64Array(T * n), PSmooth: new Float64Array(T * n * n), PLag };
}

/**
 * Runs the RTS smoother backwards over a filter result.
 *
 * C_k = P_k|k F' P_k+1|k^-1 (by a Cholesky solve of P_k+1|k, no explicit inverse),
 * x_k|T = x_k|k + C_k (x_k+1|T - x_k+1|k), P_k|T = P_k|k + C_k (P_k+1|T - P_k+1|k) C_k' evaluated in the
 * equivalent Joseph form (I - C_k F) P_k|k (I - C_k F)' + C_k (Q + P_k+1|T) C_k' (a sum of positive
 * semi-definite terms, so roundoff cannot make it indefinite over long records; the two are equal because
 * C_k P_k+1|k = P_k|k F'), symmetrised,
 * Cov(x_k+1, x_k | T) = P_k+1|T C_k'.
 *
 * @param model - the model the filter ran with (its `discretize` is called again for each step)
 * @param filtered - the output of {@link kalmanFilter} for that model
 * @param opts - kernel choice
 * @returns smoothed means, covariances and lag-one covariances
 * @throws DimensionMismatchError when the filter result does not belong to a model of this shape
 * @throws NotPositiveDefiniteError when a predicted covariance P_k+1|k is singular (e.g. a state with
 *   zero prior variance and zero process noise)
 * @see Rauch, Tung & Striebel (1965), AIAA J. 3:1445-1450; lag-one covariance: Shumway & Stoffer
 *   (1982), J. Time Series Anal. 3:253-264, and de Jong (1989), J. Amer. Statist. Assoc. 84:1085-1088
 *   (journal pages from memory)
 */
export function rtsSmooth(model: StateSpaceModel, filtered: FilterResult, opts: RtsSmoothOptions = {}): SmoothResult {
  validateModel(model);
  const { n, length: T } = filtered;
  if (filtered.n !== model.n || filtered.m !== model.m) {
    throw new DimensionMismatchError(`filter result is for n=${filtered.n}, m=${filtered.m}; model has n=${model.n}, m=${model.m}`);
  }
  if (filtered.xFilt.length !== T * n || filtered.PPred.length !== T * n * n || filtered.timesS.length !== T) {
    throw new DimensionMismatchError('filter result arrays do not match its length and n');
  }
  if (T === 0) throw new RangeError('rtsSmooth: zero-length filter result');
  const kernel = opts.kernel ?? 'auto';
  if (kernel !== 'auto' && kernel !== 'general') throw new TypeError(`rtsSmooth: kernel must be 'auto' or 'general', got ${String(kernel)}`);
  const out = allocateSmoothResult(n, T);
  if (kernel === 'auto' && model.m === 1) {
    if (n === 2) {
      smoothAxis2(model, filtered, out);
      return out;
    }
    if (n === 3) {
      smoothAxis3(model, filtered, out);
      return out;
    }
  }
  smoothGeneral(model, filtered, out);
  return out;
}

/**
 * Supplies the transition (or, for the extended smoother, the Jacobian) F and the process noise Q of
 * the step from sample k to k+1. Internal to `shared/ssm/`.
 */
export type TransitionHook = (k: number, dtS: number, F: Float64Array, Q: Float64Array) => void;

/**
 * The general dense smoother; fills `out` in place. Without `transitionAt`, F comes from
 * `model.discretize` (through a {@link DiscretizationCache}). Internal to `shared/ssm/`.
 * @param model - provides `discretize` unless `transitionAt` is given
 * @param f - the filter result
 * @param out - output storage
 * @param transitionAt - optional per-step F and Q (extended smoother)
 * @throws NotPositiveDefiniteError when a predicted covariance is not positive definite
 */
export function smoothGeneral(
  model: { discretize?: StateSpaceModel['discretize'] }, f: FilterResult, out: SmoothResult, transitionAt?: TransitionHook,
): void {
  const { n, length: T, timesS, xPred, PPred, xFilt, PFilt } = f;
  const { xSmooth, PSmooth, PLag } = out;
  const nn = n * n;
  const F = new Float64Array(nn);
  const Q = new Float64Array(nn);
  const L = new Float64Array(nn);
  const Ct = new Float64Array(nn);
  const A = new Float64Array(nn);
  const AP = new Float64Array(nn);
  const W = new Float64Array(nn);
  const CW = new Float64Array(nn);
  const diff = new Float64Array(n);
  const cache = model.discretize ? new DiscretizationCache({ n, discretize: model.discretize }) : undefined;
  let lastDt = NaN;
  const last = (T - 1) * n;
  xSmooth.set(xFilt.subarray(last, last + n), last);
  PSmooth.set(PFilt.subarray(last * n, last * n + nn), last * n);
  for (let k = T - 2; k >= 0; k--) {
    const dt = timesS[k + 1] - timesS[k];
    if (transitionAt) {
      transitionAt(k, dt, F, Q);
    } else if (dt !== lastDt) {
      const sl = cache!.slot(dt);
      for (let i = 0; i < nn; i++) {
        F[i] = cache!.F[sl * nn + i];
        Q[i] = cache!.Q[sl * nn + i];
      }
      lastDt = dt;
    }
    const xo = k * n;
    const po = k * nn;
    const x1 = xo + n;
    const p1 = po + nn;
    if (!choleskyLower(PPred, p1, n, L)) {
      throw new NotPositiveDefiniteError(
        `rtsSmooth: predicted covariance is not positive definite at sample ${k + 1} (t = ${timesS[k + 1]} s)`,
      );
    }
    // C' = P_k+1|k^-1 F P_k|k
    matMul(F, 0, PFilt, po, Ct, 0, n, n, n);
    choleskySolveInPlace(L, n, Ct, n);
    // x_k|T = x_k|k + C (x_k+1|T - x_k+1|k)
    for (let i = 0; i < n; i++) diff[i] = xSmooth[x1 + i] - xPred[x1 + i];
    for (let i = 0; i < n; i++) {
      let s = xFilt[xo + i];
      for (let j = 0; j < n; j++) s += Ct[j * n + i] * diff[j];
      xSmooth[xo + i] = s;
    }
    // Joseph-form RTS covariance, a sum of positive semi-definite terms equal to
    // P_k|k + C (P_k+1|T - P_k+1|k) C':  P_k|T = (I - C F) P_k|k (I - C F)' + C (Q + P_k+1|T) C'
    for (let i = 0; i < n; i++) {
      for (let j = 0; j < n; j++) {
        let s = i === j ? 1 : 0;
        for (let l = 0; l < n; l++) s -= Ct[l * n + i] * F[l * n + j];
        A[i * n + j] = s;
      }
    }
    matMul(A, 0, PFilt, po, AP, 0, n, n, n);
    matMulTransB(AP, 0, A, 0, PSmooth, po, n, n, n);
    for (let i = 0; i < nn; i++) W[i] = Q[i] + PSmooth[p1 + i];
    // CW = C W = Ct' W; P_k|T += CW C'
    for (let i = 0; i < n; i++) {
      for (let j = 0; j < n; j++) {
        let s = 0;
        for (let l = 0; l < n; l++) s += Ct[l * n + i] * W[l * n + j];
        CW[i * n + j] = s;
      }
    }
    for (let i = 0; i < n; i++) {
      for (let j = 0; j < n; j++) {
        let s = 0;
        for (let l = 0; l < n; l++) s += CW[i * n + l] * Ct[l * n + j];
        PSmooth[po + i * n + j] += s;
      }
    }
    symmetrize(PSmooth, po, n);
    // Cov(x_k+1, x_k | T) = P_k+1|T C'
    matMul(PSmooth, p1, Ct, 0, PLag, p1, n, n, n);
  }
}
