/**
 * Maximum-likelihood estimation of the measurement-noise variance R and the process-noise intensity q
 * of a per-axis model whose process noise has a known shape, Q_k = q Qs(dt_k):
 * by EM (Shumway & Stoffer 1982) or by direct maximisation of the Kalman-filter likelihood.
 */
import { DimensionMismatchError } from '../errors';
import type { StateSpaceModel } from './stateSpaceModel';
import { checkFilterInputs } from './filterInputs';
import { createAxisWorkspace, filterSmoothAxis, type AxisWorkspace } from './filterSmoothAxis';
import { kalmanFilter } from './kalmanFilter';
import { choleskyLower, choleskySolveInPlace } from './denseLinalg';
import { golden1d, nelderMead2 } from './minimize';
import { DiscretizationCache } from './discretizationCache';

/**
 * Builds the model for given noise levels. Its Q must be linear in `qIntensity` (Q = q Qs(dt)), as
 * for every model of `makeAxisModel`; `m` must be 1.
 */
export type NoiseModelBuilder = (qIntensity: number, measurementVar: number) => StateSpaceModel;

/** Options of {@link fitNoiseEm} and {@link fitNoiseMle}. */
export interface NoiseFitOptions {
  /** Starting process-noise intensity (default: per-step position noise equal to the starting R). */
  qInit?: number;
  /** Starting measurement variance (default: mean square of the second differences of z, over 6). */
  rInit?: number;
  /** Keep q fixed at this value (only R is estimated). */
  fixedQ?: number;
  /** Keep R fixed at this value (only q is estimated). */
  fixedR?: number;
  /** Stop when the relative change of the log-likelihood between iterations is below this (default 1e-9). */
  tol?: number;
  /** Iteration cap (default 5000 for EM, 2000 likelihood evaluations for direct maximisation). */
  maxIterations?: number;
}

/** Result of a noise fit. */
export interface NoiseFit {
  /** Process-noise intensity q (units of the model's Q per unit of Qs; m^2/s^3 for [p, v] models). */
  qIntensity: number;
  /** Measurement-noise variance, data units squared (m^2 for positions). */
  measurementVarM2: number;
  /** Log-likelihood at the returned values. */
  logLik: number;
  /** EM iterations or likelihood evaluations used. */
  iterations: number;
  /** True when the tolerance was met before the cap. */
  converged: boolean;
}

interface Prepared {
  T: number;
  n: number;
  qInit: number;
  rInit: number;
  workspace: AxisWorkspace | undefined;
}

function prepare(build: NoiseModelBuilder, z: Float64Array, timesS: Float64Array, opts: NoiseFitOptions): Prepared {
  const probe = build(1, 1);
  if (probe.m !== 1) throw new DimensionMismatchError(`noise fitting needs a model with m = 1 (per axis), got m = ${probe.m}`);
  const T = checkFilterInputs(probe, z, timesS);
  if (T < 3) throw new RangeError(`noise fitting needs at least 3 samples, got ${T}`);
  let observed = 0;
  for (let k = 0; k < T; k++) if (!Number.isNaN(z[k])) observed++;
  if (observed < 3) throw new RangeError(`noise fitting needs at least 3 observed samples, got ${observed}`);
  for (const [name, v] of [['qInit', opts.qInit], ['rInit', opts.rInit], ['fixedQ', opts.fixedQ], ['fixedR', opts.fixedR]] as const) {
    if (v !== undefined && !(v > 0 && Number.isFinite(v))) throw new RangeError(`${name} must be finite and > 0, got ${v}`);
  }
  // Default R: second differences of white noise have variance 6 R.
  let rInit = opts.fixedR ?? opts.rInit;
  if (rInit === undefined) {
    let s = 0, c = 0;
    for (let k = 2; k < T; k++) {
      const d = z[k] - 2 * z[k - 1] + z[k - 2];
      if (d === d) { s += d * d; c++; }
    }
    rInit = c > 0 && s > 0 ? s / c / 6 : 1;
  }
  let qInit = opts.fixedQ ?? opts.qInit;
  if (qInit === undefined) {
    // Per-step position noise q Qs[0,0] about equal to R at the median step.
    const F = new Float64Array(probe.n ** 2), u = new Float64Array(probe.n), Q = new Float64Array(probe.n ** 2);
    probe.discretize(medianStep(timesS), F, u, Q);
    qInit = Q[0] > 0 ? rInit / Q[0] : 1;
  }
  const n = probe.n;
  return { T, n, qInit, rInit, workspace: n === 2 || n === 3 ? createAxisWorkspace(n, T) : undefined };
}

function medianStep(timesS: Float64Array): number {
  const T = timesS.length;
  if (T < 2) return 1;
  const d = new Float64Array(T - 1);
  for (let k = 1; k < T; k++) d[k - 1] = timesS[k] - timesS[k - 1];
  d.sort();
  return d[(T - 1) >> 1];
}

/**
 * EM estimate of (q, R) for a per-axis model with Q_k = q Qs(dt_k), x0 and P0 held fixed.
 *
 * E-step: Kalman filter and RTS smoother with lag-one covariances. M-step (exact for this
 * parameterisation):
 *   R = (1/N) sum over observed k of [(z_k - H x_k|T)^2 + H P_k|T H'],
 *   q = sum_k tr(Qs_k^+ E_k) / sum_k rank(Qs_k), with
 *   E_k = E[w_k w_k' | all] = e e' + P_k|T - P_k,k-1|T F' - F P_k,k-1|T' + F P_k-1|T F', e = x_k|T - F x_k-1|T - u,
 * where Qs^+ inverts Qs on the states that receive noise (states with zero noise, such as a fitted
 * gravity, are left out). The q update maximises the expected complete-data log-likelihood
 * sum_k [-(r_k/2) log q - tr(Qs_k^+ E_k) / (2 q)], r_k = rank(Qs_k); with full-rank Qs it is the mean
 * over steps of tr(Qs_k^-1 E_k) / n. Iterates until the relative change of the log-likelihood is below `tol`.
 *
 * @param build - model for given (q, R); Q linear in q, m = 1
 * @param z - observations, T, NaN for missing
 * @param timesS - sample times, s, strictly increasing
 * @param opts - starting values, fixed values, tolerance, iteration cap
 * @returns the estimates, final log-likelihood, iterations and whether the tolerance was met
 * @throws RangeError / DimensionMismatchError for bad input (as kalmanFilter), fewer than 3 observed samples,
 *   or a model whose Qs is zero everywhere
 * @see Shumway & Stoffer (1982), J. Time Series Anal. 3:253-264; Shumway & Stoffer (2017), Time Series
 *   Analysis and Its Applications, 4th ed., sec. 6.3
 */
export function fitNoiseEm(build: NoiseModelBuilder, z: Float64Array, timesS: Float64Array, opts: NoiseFitOptions = {}): NoiseFit {
  const { T, n, qInit, rInit, workspace } = prepare(build, z, timesS, opts);
  const tol = opts.tol ?? 1e-9;
  const maxIt = opts.maxIterations ?? 5000;
  const nn = n * n;
  const F = new Float64Array(nn), u = new Float64Array(n), Qs = new Float64Array(nn);
  const E = new Float64Array(nn), FP = new Float64Array(nn), e = new Float64Array(n);
  const L = new Float64Array(nn), sub = new Float64Array(nn), rhs = new Float64Array(nn);
  const support = new Int32Array(n);
  const unitCache = new DiscretizationCache(build(1, rInit));
  let q = qInit, r = rInit;
  let prevLl = -Infinity;
  let ll = -Infinity;
  let it = 0;
  let converged = false;
  for (;;) {
    const model = build(q, r);
    const { filtered: f, smoothed: s } = filterSmoothAxis(model, z, timesS, workspace);
    const xS = s.xSmooth, PS = s.PSmooth, PL = s.PLag;
    ll = f.logLik;
    if (it > 0 && Math.abs(ll - prevLl) <= tol * Math.abs(ll)) {
      converged = true;
      break;
    }
    if (it >= maxIt) break;
    prevLl = ll;
    it++;
    // M-step for R (m = 1)
    const H = model.H;
    let rs = 0, cnt = 0;
    for (let k = 0; k < T; k++) {
      const zk = z[k];
      if (zk !== zk) continue;
      let hx = 0, hph = 0;
      for (let i = 0; i < n; i++) {
        hx += H[i] * xS[k * n + i];
        for (let j = 0; j < n; j++) hph += H[i] * PS[k * nn + i * n + j] * H[j];
      }
      rs += (zk - hx) * (zk - hx) + hph;
      cnt++;
    }
    // M-step for q
    let trSum = 0, rankSum = 0, lastDt = NaN, d = 0;
    for (let k = 1; k < T; k++) {
      const dt = timesS[k] - timesS[k - 1];
      if (dt !== lastDt) {
        const sl = unitCache.slot(dt);
        for (let i = 0; i < nn; i++) {
          F[i] = unitCache.F[sl * nn + i];
          Qs[i] = unitCache.Q[sl * nn + i];
        }
        for (let i = 0; i < n; i++) u[i] = unitCache.u[sl * n + i];
        d = 0;
        for (let i = 0; i < n; i++) if (Qs[i * n + i] > 0) support[d++] = i;
        for (let a = 0; a < d; a++) for (let b = 0; b < d; b++) sub[a * d + b] = Qs[support[a] * n + support[b]];
        if (d > 0 && !choleskyLower(sub, 0, d, L)) d = -1;
        lastDt = dt;
      }
      if (d <= 0) continue;
      const xo = k * n, po = k * nn;
      // e = x_k|T - F x_k-1|T - u
      for (let i = 0; i < n; i++) {
        let v = xS[xo + i] - u[i];
        for (let j = 0; j < n; j++) v -= F[i * n + j] * xS[xo - n + j];
        e[i] = v;
      }
      // FP = F P_k-1|T
      for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) {
        let v = 0;
        for (let l = 0; l < n; l++) v += F[i * n + l] * PS[po - nn + l * n + j];
        FP[i * n + j] = v;
      }
      for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) {
        let v = e[i] * e[j] + PS[po + i * n + j];
        for (let l = 0; l < n; l++) {
          v -= PL[po + i * n + l] * F[j * n + l] + F[i * n + l] * PL[po + j * n + l];
          v += FP[i * n + l] * F[j * n + l];
        }
        E[i * n + j] = v;
      }
      // tr(Qs_sub^-1 E_sub) by a Cholesky solve
      for (let a = 0; a < d; a++) for (let b = 0; b < d; b++) rhs[a * d + b] = E[support[a] * n + support[b]];
      choleskySolveInPlace(L, d, rhs, d);
      for (let a = 0; a < d; a++) trSum += rhs[a * d + a];
      rankSum += d;
    }
    if (rankSum === 0) throw new RangeError('fitNoiseEm: the model has no process noise to estimate (Qs is zero at every step)');
    if (opts.fixedR === undefined) r = Math.max(rs / cnt, Number.MIN_VALUE);
    if (opts.fixedQ === undefined) q = Math.max(trSum / rankSum, Number.MIN_VALUE);
  }
  return { qIntensity: q, measurementVarM2: r, logLik: ll, iterations: it, converged };
}

/**
 * Direct maximum-likelihood estimate of (q, R): Nelder-Mead on (log q, log R) over the Kalman-filter
 * log-likelihood (golden-section search on one of them when the other is fixed). x0 and P0 held fixed.
 * @param build - model for given (q, R); m = 1
 * @param z - observations, T, NaN for missing
 * @param timesS - sample times, s, strictly increasing
 * @param opts - starting values, fixed values, tolerance (relative, on the log-likelihood spread of
 *   the simplex, and 1e-10 on log-parameters), evaluation cap
 * @returns the estimates and the maximised log-likelihood
 * @throws as {@link fitNoiseEm}
 * @see Nelder & Mead (1965), Computer J. 7:308-313; Harvey (1989, chapter from memory), Forecasting, Structural Time Series
 *   Models and the Kalman Filter, ch. 3 (prediction-error decomposition of the likelihood)
 */
export function fitNoiseMle(build: NoiseModelBuilder, z: Float64Array, timesS: Float64Array, opts: NoiseFitOptions = {}): NoiseFit {
  const { qInit, rInit, workspace } = prepare(build, z, timesS, opts);
  const tol = opts.tol ?? 1e-9;
  const maxEval = opts.maxIterations ?? 2000;
  let evals = 0;
  const negLl = (lq: number, lr: number): number => {
    evals++;
    const model = build(Math.exp(lq), Math.exp(lr));
    try {
      const ll = workspace ? filterSmoothLl(model, z, timesS, workspace) : kalmanFilter(model, z, timesS).logLik;
      return Number.isFinite(ll) ? -ll : Infinity;
    } catch {
      return Infinity;
    }
  };
  const lq0 = Math.log(qInit), lr0 = Math.log(rInit);
  if (opts.fixedQ !== undefined && opts.fixedR !== undefined) {
    const v = negLl(lq0, lr0);
    return { qIntensity: qInit, measurementVarM2: rInit, logLik: -v, iterations: 1, converged: true };
  }
  if (opts.fixedQ !== undefined || opts.fixedR !== undefined) {
    const fixQ = opts.fixedQ !== undefined;
    const g = (x: number) => (fixQ ? negLl(lq0, x) : negLl(x, lr0));
    const { x, fx, converged } = golden1d(g, fixQ ? lr0 : lq0, maxEval);
    return {
      qIntensity: fixQ ? qInit : Math.exp(x), measurementVarM2: fixQ ? Math.exp(x) : rInit,
      logLik: -fx, iterations: evals, converged,
    };
  }
  const res = nelderMead2((a, b) => negLl(a, b), lq0, lr0, tol, maxEval);
  return { qIntensity: Math.exp(res.x[0]), measurementVarM2: Math.exp(res.x[1]), logLik: -res.fx, iterations: evals, converged: res.converged };
}

function filterSmoothLl(model: StateSpaceModel, z: Float64Array, timesS: Float64Array, ws: AxisWorkspace): number {
  return filterSmoothAxis(model, z, timesS, ws).filtered.logLik;
}
