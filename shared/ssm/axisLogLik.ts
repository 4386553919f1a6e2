/**
 * The Kalman-filter log-likelihood of one per-axis trajectory as a function of the noise levels, for noise
 * searches that evaluate it many times.
 */
import { filterAxis2, filterAxis3 } from './axisFilter';
import { checkFilterInputs } from './filterInputs';
import { makeAxisModel, type HypothesisSpec } from './hypotheses';
import { allocateFilterResult } from './kalmanFilter';

/** Kalman-filter log-likelihood of one trajectory as a function of the noise levels (q, R). */
export type AxisLogLik = (qIntensity: number, measurementVarM2: number) => number;

/**
 * Likelihood-only evaluator of a per-axis model on one trajectory: the inputs are checked once, and every
 * call runs the engine's scalar filter kernel into one reused output buffer (no smoother, no per-call
 * allocation of per-sample arrays), which is what a noise search over many (q, R) needs. The value is
 * exactly the `logLik` of `kalmanFilter(makeAxisModel(spec, ...), z, timesS)`.
 *
 * @param spec - hypothesis of the model (2 or 3 states, one observed component)
 * @param z - observed heights, m (NaN = missing), length T
 * @param timesS - sample times, s, strictly increasing
 * @param x0 - prior state mean
 * @param P0 - prior state covariance
 * @returns (q, R) -> log-likelihood (natural log), -Infinity where the filter fails (S not positive...)
 * @throws RangeError / DimensionMismatchError for bad inputs (as kalmanFilter)
 * @see Harvey 1989, Forecasting, Structural Time Series Models and the Kalman Filter, sec. 3.4
 *   (prediction-error decomposition of the likelihood)
 */
export function createAxisLogLik(spec: HypothesisSpec, z: Float64Array, timesS: Float64Array, x0: Float64Array, P0: Float64Array): AxisLogLik {
  const probe = makeAxisModel(spec, { axis: 'vertical', qIntensity: 1, measurementVarM2: 1, x0, P0 });
  checkFilterInputs(probe, z, timesS);
  if (probe.m !== 1 || (probe.n !== 2 && probe.n !== 3)) throw new RangeError(`createAxisLogLik: needs a 2- or 3-state model with one observed component, got n = ${probe.n}, m = ${probe.m}`);
  const res = allocateFilterResult(probe.n, 1, timesS);
  const kernel = probe.n === 2 ? filterAxis2 : filterAxis3;
  return (qIntensity, measurementVarM2) => {
    try {
      const model = makeAxisModel(spec, { axis: 'vertical', qIntensity, measurementVarM2, x0, P0 });
      kernel(model, z, timesS, res);
      return res.logLik;
    } catch {
      return -Infinity;
    }
  };
}
