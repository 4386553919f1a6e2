/**
 * Extended Kalman filter and extended RTS smoother for models with nonlinear dynamics and a linear
 * observation (the drag hypothesis).
 */
import { DimensionMismatchError } from '../errors';
import type { ObservationPart } from './stateSpaceModel';
import { checkFilterInputs } from './filterInputs';
import { allocateFilterResult, filterGeneral, type FilterResult } from './kalmanFilter';
import { allocateSmoothResult, smoothGeneral, type SmoothResult } from './rtsSmooth';

/**
 * A model with nonlinear dynamics x_k = f(x_k-1, dt_k) + w_k, w_k ~ N(0, Q(dt_k)), and the linear
 * observation z_k = H x_k + e_k of {@link StateSpaceModel} (same H, R, x0, P0 shapes).
 */
export interface NonlinearStateSpaceModel extends ObservationPart {
  /**
   * Propagates the state over `dtS` seconds: writes f(x) (n) at `xOut[xOutOff]` from `x[xOff]`, the
   * Jacobian df/dx at x into F (n*n, row-major) and the process-noise covariance into Q (n*n).
   * Must not allocate.
   */
  propagate(dtS: number, x: Float64Array, xOff: number, xOut: Float64Array, xOutOff: number, F: Float64Array, Q: Float64Array): void;
}

/**
 * Extended Kalman filter: the prediction is x_k|k-1 = f(x_k-1|k-1), P_k|k-1 = F P F' + Q with F the
 * Jacobian at x_k-1|k-1; the update is the linear one of {@link kalmanFilter} (Joseph form, Cholesky
 * gain, missing components dropped, NIS, log-likelihood of the linearised model).
 * @param model - nonlinear dynamics, linear observation
 * @param z - observations, T*m, NaN for missing
 * @param timesS - sample times, s, strictly increasing
 * @returns the same {@link FilterResult} as the linear filter
 * @throws as {@link kalmanFilter}
 * @see (chapter and section numbers from memory) Jazwinski (1970), Stochastic Processes and Filtering Theory, ch. 8; Särkkä (2013), Bayesian
 *   Filtering and Smoothing, sec. 5.2
 */
export function extendedKalmanFilter(model: NonlinearStateSpaceModel, z: Float64Array, timesS: Float64Array): FilterResult {
  checkFilterInputs(model, z, timesS);
  const res = allocateFilterResult(model.n, model.m, timesS);
  filterGeneral(model, z, timesS, res, (dt, xPrev, xPrevOff, xOut, xOutOff, F, Q) => model.propagate(dt, xPrev, xPrevOff, xOut, xOutOff, F, Q));
  return res;
}

/**
 * Extended RTS smoother: the RTS recursions of {@link rtsSmooth} with F_k+1 the Jacobian of f at the
 * filtered state x_k|k (the linearisation the filter used) and the stored predictions x_k+1|k.
 * @param model - the model the filter ran with
 * @param filtered - output of {@link extendedKalmanFilter}
 * @returns smoothed means, covariances and lag-one covariances (of the linearised model)
 * @throws DimensionMismatchError when the result does not fit the model; NotPositiveDefiniteError as rtsSmooth
 * @see Särkkä (2013), Bayesian Filtering and Smoothing, sec. 9.1 (extended RTS smoother; section from memory)
 */
export function extendedRtsSmooth(model: NonlinearStateSpaceModel, filtered: FilterResult): SmoothResult {
  const { n, length: T } = filtered;
  if (filtered.n !== model.n || filtered.m !== model.m) {
    throw new DimensionMismatchError(`filter result is for n=${filtered.n}, m=${filtered.m}; model has n=${model.n}, m=${model.m}`);
  }
  if (T === 0) throw new RangeError('extendedRtsSmooth: zero-length filter result');
  const out = allocateSmoothResult(n, T);
  const scratchX = new Float64Array(n);
  smoothGeneral({}, filtered, out, (k, dt, F, Q) => model.propagate(dt, filtered.xFilt, k * n, scratchX, 0, F, Q));
  return out;
}
