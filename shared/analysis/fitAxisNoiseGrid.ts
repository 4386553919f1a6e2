import { createAxisLogLik, nelderMead2, type AxisLogLik, type HypothesisSpec } from '../ssm';

/** Noise levels fitted for one axis. */
export interface AxisNoiseFit {
  /** Process-noise spectral density (m^2/s^5 for white jerk, m^2/s^3 for [p, v] models). */
  qIntensity: number;
  /** Measurement variance, m^2. */
  measurementVarM2: number;
  /** Kalman-filter log-likelihood at the fit. */
  logLik: number;
  /** Filter runs used. */
  iterations: number;
}

/**
 * Maximum-likelihood noise levels of a per-axis model by a coarse log grid over (q, r) (every second decade,
 * q 1e-2..1e6, r 1e-10..1e-4) followed by a one-decade step around the best point, which reaches q 1e7 and
 * r 1e-3 (the innovations log-likelihood of the Kalman filter is the objective); 28 filter runs. It finds
 * the basin; {@link refineAxisNoiseNewton} or {@link refineAxisNoiseMle} then finish the fit.
 * A dependable bounded search for short trials (a few hundred samples); the engine's EM/MLE estimators
 * are the general tool.
 *
 * @param spec - hypothesis of the reconstruction model
 * @param z - observed heights, m (NaN = missing), length T
 * @param timesS - sample times, s, strictly increasing
 * @param x0 - prior state mean
 * @param P0 - prior state covariance
 * @param logLik - evaluator from {@link createAxisLogLik} for these inputs (made here when absent)
 * @returns the fitted noise levels
 * @throws RangeError / DimensionMismatchError for bad inputs (as kalmanFilter)
 * @see Harvey 1989, Forecasting, Structural Time Series Models and the Kalman Filter, sec. 3.4
 *   (prediction-error decomposition of the likelihood)
 */
export function fitAxisNoiseGrid(
  spec: HypothesisSpec, z: Float64Array, timesS: Float64Array, x0: Float64Array, P0: Float64Array,
  logLik: AxisLogLik = createAxisLogLik(spec, z, timesS, x0, P0),
): AxisNoiseFit {
  let best = { lq: 2, lr: -6, ll: -Infinity };
  let runs = 0;
  const evalAt = (lq: number, lr: number): number => {
    runs++;
    return logLik(10 ** lq, 10 ** lr);
  };
  for (let lq = -2; lq <= 6; lq += 2) {
    for (let lr = -10; lr <= -4; lr += 2) {
      const ll = evalAt(lq, lr);
      if (ll > best.ll) best = { lq, lr, ll };
    }
  }
  for (const step of [1]) {
    const c = best;
    for (let i = -1; i <= 1; i++) {
      for (let j = -1; j <= 1; j++) {
        if (i === 0 && j === 0) continue;
        const lq = c.lq + i * step;
        const lr = c.lr + j * step;
        const ll = evalAt(lq, lr);
        if (ll > best.ll) best = { lq, lr, ll };
      }
    }
  }
  return { qIntensity: 10 ** best.lq, measurementVarM2: 10 ** best.lr, logLik: best.ll, iterations: runs };
}

/**
 * Refines noise levels by Nelder-Mead on (ln q, ln R) over the filter log-likelihood, from a unit simplex
 * at the start values: the same search as the engine's `fitNoiseMle` (same start, tolerance and
 * evaluation cap give the same result), run on a likelihood-only evaluator.
 *
 * @param logLik - evaluator from {@link createAxisLogLik}
 * @param qInit - starting process-noise intensity, > 0
 * @param rInit - starting measurement variance, m^2, > 0
 * @param tol - relative tolerance on the log-likelihood spread of the simplex
 * @param maxEvaluations - cap on filter runs
 * @returns the best point found, its log-likelihood and the runs used
 * @throws RangeError when a start value is not finite and > 0
 * @see Nelder & Mead (1965), Computer J. 7:308-313
 */
export function refineAxisNoiseMle(logLik: AxisLogLik, qInit: number, rInit: number, tol: number, maxEvaluations: number): AxisNoiseFit {
  if (!(qInit > 0 && Number.isFinite(qInit))) throw new RangeError(`refineAxisNoiseMle: qInit must be finite and > 0, got ${qInit}`);
  if (!(rInit > 0 && Number.isFinite(rInit))) throw new RangeError(`refineAxisNoiseMle: rInit must be finite and > 0, got ${rInit}`);
  let runs = 0;
  const negLl = (lq: number, lr: number): number => {
    runs++;
    const ll = logLik(Math.exp(lq), Math.exp(lr));
    return Number.isFinite(ll) ? -ll : Infinity;
  };
  const res = nelderMead2(negLl, Math.log(qInit), Math.log(rInit), tol, maxEvaluations);
  return { qIntensity: Math.exp(res.x[0]), measurementVarM2: Math.exp(res.x[1]), logLik: -res.fx, iterations: runs };
}

/**
 * Refines noise levels by Newton steps on (ln q, ln R): each step fits a quadratic to the log-likelihood
 * at the current point and five neighbours (central differences, spacing h <= 0.05, shrinking with the
 * step), moves to its maximum (at most 1 in each log unit, halved up to 6 times until the likelihood does
 * not drop), and stops when a step is below 1e-5 or after 8 steps. Near the maximum it converges in a
 * few steps where Nelder-Mead needs about 60 runs for the same accuracy.
 *
 * @param logLik - evaluator from {@link createAxisLogLik}
 * @param qInit - starting process-noise intensity, > 0 (e.g. from {@link fitAxisNoiseGrid})
 * @param rInit - starting measurement variance, m^2, > 0
 * @returns the refined fit, or null when the surface is not concave there or no step raises the
 *   likelihood (the caller then falls back to {@link refineAxisNoiseMle})
 * @throws RangeError when a start value is not finite and > 0
 * @see Nocedal & Wright 2006, Numerical Optimization, 2nd ed., ch. 3 (line search Newton) and
 *   sec. 8.1 (finite-difference derivatives) (chapters from memory)
 */
export function refineAxisNoiseNewton(logLik: AxisLogLik, qInit: number, rInit: number): AxisNoiseFit | null {
  if (!(qInit > 0 && Number.isFinite(qInit))) throw new RangeError(`refineAxisNoiseNewton: qInit must be finite and > 0, got ${qInit}`);
  if (!(rInit > 0 && Number.isFinite(rInit))) throw new RangeError(`refineAxisNoiseNewton: rInit must be finite and > 0, got ${rInit}`);
  let runs = 0;
  const f = (a: number, b: number): number => {
    runs++;
    return logLik(Math.exp(a), Math.exp(b));
  };
  let a = Math.log(qInit);
  let b = Math.log(rInit);
  let fc = f(a, b);
  if (!Number.isFinite(fc)) return null;
  let h = 0.05;
  for (let it = 0; it < 8; it++) {
    const fa = f(a + h, b), fA = f(a - h, b), fb = f(a, b + h), fB = f(a, b - h), fab = f(a + h, b + h);
    const ga = (fa - fA) / (2 * h), gb = (fb - fB) / (2 * h);
    const haa = (fa - 2 * fc + fA) / (h * h), hbb = (fb - 2 * fc + fB) / (h * h), hab = (fab - fa - fb + fc) / (h * h);
    const det = haa * hbb - hab * hab;
    if (!(haa < 0 && det > 0)) return null;
    let da = -(hbb * ga - hab * gb) / det;
    let db = -(haa * gb - hab * ga) / det;
    const len = Math.hypot(da, db);
    if (len > 1) {
      da /= len;
      db /= len;
    }
    let fn = f(a + da, b + db);
    for (let k = 0; k < 6 && !(fn >= fc); k++) {
      da /= 2;
      db /= 2;
      fn = f(a + da, b + db);
    }
    const stepLen = Math.hypot(da, db);
    if (!(fn >= fc)) {
      if (stepLen < 1e-5) break;
      return null;
    }
    a += da;
    b += db;
    fc = fn;
    if (stepLen < 1e-5) break;
    h = Math.min(0.05, Math.max(1e-3, stepLen));
  }
  return { qIntensity: Math.exp(a), measurementVarM2: Math.exp(b), logLik: fc, iterations: runs };
}
