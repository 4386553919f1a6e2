/**
 * Kalman filter for a {@link StateSpaceModel} with per-step time steps and missing observations.
 */
import { NotPositiveDefiniteError } from '../errors';
import type { ObservationPart, StateSpaceModel } from './stateSpaceModel';
import { checkFilterInputs } from './filterInputs';
import { choleskyLower, choleskySolveInPlace, logDetFromCholesky, matMul, matMulTransB, symmetrize } from './denseLinalg';
import { filterAxis2, filterAxis3 } from './axisFilter';
import { DiscretizationCache } from './discretizationCache';

/** Output of {@link kalmanFilter}: predicted and filtered moments for every sample, plus fit statistics. */
export interface FilterResult {
  /** Number of states. */
  n: number;
  /** Number of observed components per sample. */
  m: number;
  /** Number of samples T. */
  length: number;
  /** Sample times in seconds (the input array, not a copy). */
  timesS: Float64Array;
  /** Predicted means E[x_k | z_0..z_{k-1}], T*n (row k is x0 for k = 0). */
  xPred: Float64Array;
  /** Predicted covariances, T*n*n (block 0 is P0). */
  PPred: Float64Array;
  /** Filtered means E[x_k | z_0..z_k], T*n. */
  xFilt: Float64Array;
  /** Filtered covariances, T*n*n. */
  PFilt: Float64Array;
  /** Gaussian log-likelihood of the observed values, sum over steps of -(d log 2pi + log|S| + v'S^-1 v)/2 (natural log). */
  logLik: number;
  /** Normalized innovation squared v' S^-1 v per sample, NaN where nothing was observed. */
  nis: Float64Array;
  /** Degrees of freedom of each NIS value: the number of components observed at that sample (0..m). */
  nisDof: Int32Array;
  /** Number of observed scalar values used (sum of nisDof). */
  nObserved: number;
}

/** Options of {@link kalmanFilter}. */
export interface KalmanFilterOptions {
  /**
   * 'auto' (default) runs the scalar kernels for n = 2 or 3 with m = 1 and the general dense code
   * otherwise; 'general' always runs the general code (used to cross-check the kernels).
   */
  kernel?: 'auto' | 'general';
}

const LOG_2PI = Math.log(2 * Math.PI);

function allFinite(a: Float64Array, off = 0, len = a.length): boolean {
  for (let i = off; i < off + len; i++) if (!Number.isFinite(a[i])) return false;
  return true;
}

/**
 * Allocates the per-sample output arrays of a filter run (zero-filled, logLik 0).
 * @param n - number of states
 * @param m - number of observed components
 * @param timesS - sample times, s (kept by reference; its length is T)
 * @returns an empty {@link FilterResult} for T samples
 */
export function allocateFilterResult(n: number, m: number, timesS: Float64Array): FilterResult {
  const T = timesS.length;
  return {
    n, m, length: T, timesS,
    xPred: new Float64Array(T * n),
    PPred: new Float64Array(T * n * n),
    xFilt: new Float64Array(T * n),
    PFilt: new Float64Array(T * n * n),
    logLik: 0,
    nis: new Float64Array(T),
    nisDof: new Int32Array(T),
    nObserved: 0,
  };
}

/**
 * Runs the Kalman filter over all samples. The model's x0, P0 are the prior of the state at the first
 * sample time (so the first prediction is x0, P0 and the first update uses z_0).
 *
 * Predict: x_k|k-1 = F x_k-1 + u, P_k|k-1 = F P F' + Q (skipped at k = 0, where the prediction is x0, P0).
 * Update (observed components only; NaN components are dropped by removing their rows of H and rows
 * and columns of R): v = z - H x, S = H P H' + R, K = P H' S^-1 by a Cholesky solve of S,
 * x = x + K v, Joseph form P = (I - K H) P (I - K H)' + K R K', symmetrised.
 * Log-likelihood from the innovations with log|S| from the Cholesky factor; NIS = v' S^-1 v.
 *
 * @param model - the state-space model (n states, m observed components)
 * @param z - observations, T*m row-major (sample-major), NaN marks a missing component
 * @param timesS - sample times in seconds, length T, strictly increasing
 * @param opts - kernel choice (see {@link KalmanFilterOptions})
 * @returns predicted and filtered means/covariances per sample, log-likelihood and NIS
 * @throws RangeError on zero-length input, non-increasing or non-finite times, infinite observations,
 *   non-finite model entries, or a `discretize` that yields non-finite F, u or Q
 * @throws DimensionMismatchError when array sizes do not match the model
 * @throws NotPositiveDefiniteError when an innovation covariance S is not positive definite
 * @see Kalman (1960), J. Basic Eng. 82:35-45; Joseph form: Bucy & Joseph (1968); Bar-Shalom, Li &
 *   Kirubarajan (2001), Estimation with Applications to Tracking and Navigation, ch. 5 (chapter from memory)
 */
export function kalmanFilter(
  model: StateSpaceModel, z: Float64Array, timesS: Float64Array, opts: KalmanFilterOptions = {},
): FilterResult {
  checkFilterInputs(model, z, timesS);
  const kernel = opts.kernel ?? 'auto';
  if (kernel !== 'auto' && kernel !== 'general') throw new TypeError(`kalmanFilter: kernel must be 'auto' or 'general', got ${String(kernel)}`);
  const res = allocateFilterResult(model.n, model.m, timesS);
  if (kernel === 'auto' && model.m === 1) {
    if (model.n === 2) {
      filterAxis2(model, z, timesS, res);
      return res;
    }
    if (model.n === 3) {
      filterAxis3(model, z, timesS, res);
      return res;
    }
  }
  filterGeneral(model, z, timesS, res);
  return res;
}

/**
 * Prediction of one step for the general filter: writes the predicted mean (n) at `xOut[xOutOff]` from
 * the previous filtered mean at `xPrev[xPrevOff]`, and the step's transition (or Jacobian) F and
 * process noise Q. Used by the extended Kalman filter; internal to `shared/ssm/`.
 */
export type PredictHook = (
  dtS: number, xPrev: Float64Array, xPrevOff: number, xOut: Float64Array, xOutOff: number, F: Float64Array, Q: Float64Array,
) => void;

/**
 * The general dense filter (any n, m); fills `res` in place. Without `predict`, the step is the
 * linear x = F x + u of `model.discretize` (through a {@link DiscretizationCache}).
 * Internal to `shared/ssm/` (inputs already checked).
 * @param model - sizes, observation, prior, and `discretize` unless `predict` is given
 * @param z - observations, T*m, NaN for missing
 * @param timesS - sample times, s
 * @param res - output storage
 * @param predict - optional nonlinear prediction (extended filter)
 * @throws NotPositiveDefiniteError / RangeError as {@link kalmanFilter}
 */
export function filterGeneral(
  model: ObservationPart & { discretize?: StateSpaceModel['discretize'] }, z: Float64Array, timesS: Float64Array, res: FilterResult,
  predict?: PredictHook,
): void {
  const { n, m, H, R } = model;
  const T = timesS.length;
  const nn = n * n;
  const { xPred, PPred, xFilt, PFilt, nis, nisDof } = res;
  // Workspace, allocated once per call.
  const F = new Float64Array(nn);
  const u = new Float64Array(n);
  const Q = new Float64Array(nn);
  const FP = new Float64Array(nn);
  const Hs = new Float64Array(m * n);
  const Rs = new Float64Array(m * m);
  const S = new Float64Array(m * m);
  const L = new Float64Array(m * m);
  const PHt = new Float64Array(n * m);
  const Kt = new Float64Array(m * n);
  const K = new Float64Array(n * m);
  const A = new Float64Array(nn);
  const AP = new Float64Array(nn);
  const KR = new Float64Array(n * m);
  const v = new Float64Array(m);
  const w = new Float64Array(m);
  const obs = new Int32Array(m);
  const cache = model.discretize ? new DiscretizationCache({ n, discretize: model.discretize }) : undefined;
  let lastDt = NaN;
  let logLik = 0;
  let nObserved = 0;

  for (let k = 0; k < T; k++) {
    const xo = k * n;
    const po = k * nn;
    if (k === 0) {
      xPred.set(model.x0, 0);
      PPred.set(model.P0, 0);
      symmetrize(PPred, 0, n);
    } else {
      const dt = timesS[k] - timesS[k - 1];
      const xp = xo - n;
      const pp = po - nn;
      if (predict) {
        // extended filter: x_k|k-1 = f(x_k-1|k-1), F = df/dx there
        predict(dt, xFilt, xp, xPred, xo, F, Q);
        if (!allFinite(F) || !allFinite(Q) || !allFinite(xPred, xo, n)) {
          throw new RangeError(`extendedKalmanFilter: propagation over ${dt} s gave a non-finite state, Jacobian or Q (step to sample ${k})`);
        }
      } else {
        if (dt !== lastDt) {
          const sl = cache!.slot(dt);
          for (let i = 0; i < nn; i++) {
            F[i] = cache!.F[sl * nn + i];
            Q[i] = cache!.Q[sl * nn + i];
          }
          for (let i = 0; i < n; i++) u[i] = cache!.u[sl * n + i];
          if (!allFinite(F) || !allFinite(u) || !allFinite(Q)) {
            throw new RangeError(`kalmanFilter: model.discretize(${dt}) gave a non-finite F, u or Q (step to sample ${k})`);
          }
          lastDt = dt;
        }
        // x_k|k-1 = F x_k-1|k-1 + u
        for (let i = 0; i < n; i++) {
          let s = u[i];
          for (let j = 0; j < n; j++) s += F[i * n + j] * xFilt[xp + j];
          xPred[xo + i] = s;
        }
      }
      // P_k|k-1 = F P F' + Q
      matMul(F, 0, PFilt, pp, FP, 0, n, n, n);
      matMulTransB(FP, 0, F, 0, PPred, po, n, n, n);
      for (let i = 0; i < nn; i++) PPred[po + i] += Q[i];
      symmetrize(PPred, po, n);
    }

    let d = 0;
    for (let i = 0; i < m; i++) if (!Number.isNaN(z[k * m + i])) obs[d++] = i;
    nisDof[k] = d;
    if (d === 0) {
      for (let i = 0; i < n; i++) xFilt[xo + i] = xPred[xo + i];
      for (let i = 0; i < nn; i++) PFilt[po + i] = PPred[po + i];
      nis[k] = NaN;
      continue;
    }
    // Reduced H and R over the observed components.
    for (let a = 0; a < d; a++) {
      const ra = obs[a];
      for (let j = 0; j < n; j++) Hs[a * n + j] = H[ra * n + j];
      for (let b = 0; b < d; b++) Rs[a * d + b] = R[ra * m + obs[b]];
    }
    // v = z - H x_k|k-1
    for (let a = 0; a < d; a++) {
      let s = z[k * m + obs[a]];
      for (let j = 0; j < n; j++) s -= Hs[a * n + j] * xPred[xo + j];
      v[a] = s;
    }
    // S = H P H' + R
    matMulTransB(PPred, po, Hs, 0, PHt, 0, n, n, d);
    matMul(Hs, 0, PHt, 0, S, 0, d, n, d);
    for (let i = 0; i < d * d; i++) S[i] += Rs[i];
    symmetrize(S, 0, d);
    if (!choleskyLower(S, 0, d, L)) {
      throw new NotPositiveDefiniteError(
        `kalmanFilter: innovation covariance S is not positive definite at sample ${k} (t = ${timesS[k]} s); check R and P0`,
      );
    }
    // K' = S^-1 (P H')' by Cholesky solve
    for (let a = 0; a < d; a++) for (let j = 0; j < n; j++) Kt[a * n + j] = PHt[j * d + a];
    choleskySolveInPlace(L, d, Kt, n);
    for (let j = 0; j < n; j++) for (let a = 0; a < d; a++) K[j * d + a] = Kt[a * n + j];
    // NIS = v' S^-1 v; log-likelihood term
    for (let a = 0; a < d; a++) w[a] = v[a];
    choleskySolveInPlace(L, d, w, 1);
    let q = 0;
    for (let a = 0; a < d; a++) q += v[a] * w[a];
    nis[k] = q;
    logLik -= 0.5 * (d * LOG_2PI + logDetFromCholesky(L, d) + q);
    nObserved += d;
    // x_k|k = x_k|k-1 + K v
    for (let i = 0; i < n; i++) {
      let s = xPred[xo + i];
      for (let a = 0; a < d; a++) s += K[i * d + a] * v[a];
      xFilt[xo + i] = s;
    }
    // Joseph form: P_k|k = (I - K H) P (I - K H)' + K R K'
    for (let i = 0; i < n; i++) {
      for (let j = 0; j < n; j++) {
        let s = i === j ? 1 : 0;
        for (let a = 0; a < d; a++) s -= K[i * d + a] * Hs[a * n + j];
        A[i * n + j] = s;
      }
    }
    matMul(A, 0, PPred, po, AP, 0, n, n, n);
    matMulTransB(AP, 0, A, 0, PFilt, po, n, n, n);
    matMul(K, 0, Rs, 0, KR, 0, n, d, d);
    for (let i = 0; i < n; i++) {
      for (let j = 0; j < n; j++) {
        let s = 0;
        for (let a = 0; a < d; a++) s += KR[i * d + a] * K[j * d + a];
        PFilt[po + i * n + j] += s;
      }
    }
    symmetrize(PFilt, po, n);
  }
  res.logLik = logLik;
  res.nObserved = nObserved;
}
