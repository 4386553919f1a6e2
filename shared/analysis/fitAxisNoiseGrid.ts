import { kalmanFilter } from '../ssm/kalmanFilter';
import { makeAxisModel, type HypothesisSpec } from '../ssm/hypotheses';

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
 * Maximum-likelihood noise levels of a per-axis model by a coarse log grid over (q, r) followed by a
 * finer grid around the best point (the innovations log-likelihood of the Kalman filter is the objective).
 * A dependable bounded search for short trials (a few hundred samples); the engine's EM/MLE estimators
 * are the general tool.
 *
 * @param spec - hypothesis of the reconstruction model
 * @param z - observed heights, m (NaN = missing), length T
 * @param timesS - sample times, s, strictly increasing
 * @param x0 - prior state mean
 * @param P0 - prior state covariance
 * @returns the fitted noise levels
 * @see Harvey 1989, Forecasting, Structural Time Series Models and the Kalman Filter, sec. 3.4
 *   (prediction-error decomposition of the likelihood)
 */
export function fitAxisNoiseGrid(spec: HypothesisSpec, z: Float64Array, timesS: Float64Array, x0: Float64Array, P0: Float64Array): AxisNoiseFit {
  let best = { lq: 2, lr: -6, ll: -Infinity };
  let runs = 0;
  const evalAt = (lq: number, lr: number): number => {
    runs++;
    const model = makeAxisModel(spec, { axis: 'vertical', qIntensity: 10 ** lq, measurementVarM2: 10 ** lr, x0, P0 });
    try {
      return kalmanFilter(model, z, timesS).logLik;
    } catch {
      return -Infinity;
    }
  };
  for (let lq = -2; lq <= 7; lq += 1) {
    for (let lr = -10; lr <= -3; lr += 1) {
      const ll = evalAt(lq, lr);
      if (ll > best.ll) best = { lq, lr, ll };
    }
  }
  for (const step of [0.5, 0.25, 0.125]) {
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
