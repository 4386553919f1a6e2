/**
 * One-call filter + RTS smoother for a per-axis model, with reusable output storage: the fast path for
 * repeated runs on the same trajectory (noise estimation, hypothesis sweeps, benchmarks).
 */
import { DimensionMismatchError } from '../errors';
import type { StateSpaceModel } from './stateSpaceModel';
import { allocateFilterResult, kalmanFilter, type FilterResult } from './kalmanFilter';
import { allocateSmoothResult, rtsSmooth, type SmoothResult } from './rtsSmooth';
import { checkFilterInputs } from './filterInputs';
import { filterAxis2, filterAxis3 } from './axisFilter';
import { smoothAxis2, smoothAxis3 } from './axisSmoother';

/** Preallocated output storage for {@link filterSmoothAxis}, reusable across calls of up to `capacity` samples. */
export interface AxisWorkspace {
  /** Number of states the storage is laid out for. */
  readonly n: number;
  /** Largest number of samples it holds. */
  readonly capacity: number;
  /** Backing arrays (capacity-sized). */
  readonly buffers: {
    xPred: Float64Array; PPred: Float64Array; xFilt: Float64Array; PFilt: Float64Array;
    nis: Float64Array; nisDof: Int32Array; xSmooth: Float64Array; PSmooth: Float64Array; PLag: Float64Array;
  };
}

/**
 * Allocates storage for {@link filterSmoothAxis}.
 * @param n - number of states (2 or 3 for the per-axis models; any n works)
 * @param capacity - largest number of samples
 * @returns the workspace
 * @throws RangeError for a non-positive n or capacity
 */
export function createAxisWorkspace(n: number, capacity: number): AxisWorkspace {
  if (!Number.isInteger(n) || !(n >= 1)) throw new RangeError(`createAxisWorkspace: n must be a positive integer, got ${n}`);
  if (!Number.isInteger(capacity) || !(capacity >= 1)) throw new RangeError(`createAxisWorkspace: capacity must be a positive integer, got ${capacity}`);
  const nn = n * n;
  return {
    n, capacity,
    buffers: {
      xPred: new Float64Array(capacity * n), PPred: new Float64Array(capacity * nn),
      xFilt: new Float64Array(capacity * n), PFilt: new Float64Array(capacity * nn),
      nis: new Float64Array(capacity), nisDof: new Int32Array(capacity),
      xSmooth: new Float64Array(capacity * n), PSmooth: new Float64Array(capacity * nn), PLag: new Float64Array(capacity * nn),
    },
  };
}

/**
 * Kalman filter then RTS smoother in one call. For n = 2 or 3 with m = 1 it runs the scalar kernels
 * directly; other shapes go through {@link kalmanFilter} and {@link rtsSmooth}. With a workspace the
 * outputs are views into its buffers (overwritten by the next call) and nothing per-sample is allocated.
 * @param model - the model
 * @param z - observations, T*m, NaN for missing
 * @param timesS - sample times, s, strictly increasing
 * @param workspace - optional reusable storage from {@link createAxisWorkspace}
 * @returns the filter and smoother results
 * @throws as {@link kalmanFilter} and {@link rtsSmooth}; DimensionMismatchError when the workspace is too small or laid out for another n
 */
export function filterSmoothAxis(
  model: StateSpaceModel, z: Float64Array, timesS: Float64Array, workspace?: AxisWorkspace,
): { filtered: FilterResult; smoothed: SmoothResult } {
  const T = checkFilterInputs(model, z, timesS);
  const { n, m } = model;
  const fast = m === 1 && (n === 2 || n === 3);
  if (!fast) {
    const filtered = kalmanFilter(model, z, timesS);
    return { filtered, smoothed: rtsSmooth(model, filtered) };
  }
  let filtered: FilterResult;
  let smoothed: SmoothResult;
  if (workspace) {
    if (workspace.n !== n) throw new DimensionMismatchError(`workspace is for n=${workspace.n}, model has n=${n}`);
    if (workspace.capacity < T) throw new DimensionMismatchError(`workspace holds ${workspace.capacity} samples, input has ${T}`);
    const b = workspace.buffers;
    const nn = n * n;
    filtered = {
      n, m, length: T, timesS,
      xPred: b.xPred.subarray(0, T * n), PPred: b.PPred.subarray(0, T * nn),
      xFilt: b.xFilt.subarray(0, T * n), PFilt: b.PFilt.subarray(0, T * nn),
      logLik: 0, nis: b.nis.subarray(0, T), nisDof: b.nisDof.subarray(0, T), nObserved: 0,
    };
    smoothed = { xSmooth: b.xSmooth.subarray(0, T * n), PSmooth: b.PSmooth.subarray(0, T * nn), PLag: b.PLag.subarray(0, T * nn) };
    smoothed.PLag.fill(NaN, 0, nn);
  } else {
    filtered = allocateFilterResult(n, m, timesS);
    smoothed = allocateSmoothResult(n, T);
  }
  if (n === 2) {
    filterAxis2(model, z, timesS, filtered);
    smoothAxis2(model, filtered, smoothed);
  } else {
    filterAxis3(model, z, timesS, filtered);
    smoothAxis3(model, filtered, smoothed);
  }
  return { filtered, smoothed };
}
