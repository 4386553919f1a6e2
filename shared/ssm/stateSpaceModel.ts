/**
 * The linear-Gaussian state-space model description used by the whole engine.
 *
 *   x_k = F(dt_k) x_{k-1} + u(dt_k) + w_k,   w_k ~ N(0, Q(dt_k))
 *   z_k = H x_k + e_k,                        e_k ~ N(0, R)
 *   x_0 ~ N(x0, P0)   (the prior of the state at the first sample time)
 *
 * dt_k = timesS[k] - timesS[k-1] varies per step, so the model gives its transition, input term and
 * process noise through `discretize(dtS, ...)`. All matrices are row-major Float64Arrays.
 */
import { DimensionMismatchError } from '../errors';

/**
 * A linear-Gaussian state-space model with a time step that may change from sample to sample.
 * Shapes: n states, m observed components; F n*n, u n, Q n*n, H m*n, R m*m, x0 n, P0 n*n (row-major).
 */
export interface StateSpaceModel {
  /** Number of states. */
  n: number;
  /** Number of observed components per sample. */
  m: number;
  /**
   * Fills the transition F (n*n), input term u (n) and process-noise covariance Q (n*n) for a step of
   * `dtS` seconds, in place (no allocation). Must be a pure function of `dtS`: the filter and smoother
   * cache its results by exact step.
   */
  discretize(dtS: number, F: Float64Array, u: Float64Array, Q: Float64Array): void;
  /** Observation matrix, m*n. */
  H: Float64Array;
  /** Measurement-noise covariance, m*m. */
  R: Float64Array;
  /** Prior mean of the state at the first sample time, n. */
  x0: Float64Array;
  /** Prior covariance of the state at the first sample time, n*n. */
  P0: Float64Array;
}

/** The parts of a model that do not depend on the dynamics: sizes, observation and prior. */
export type ObservationPart = Pick<StateSpaceModel, 'n' | 'm' | 'H' | 'R' | 'x0' | 'P0'>;

/**
 * Checks the array sizes of a model against its `n` and `m`.
 * @param model - the model to check
 * @throws DimensionMismatchError naming the first array whose length disagrees
 * @throws RangeError when n or m is not a positive integer, or an entry of H, R, x0, P0 is not finite
 */
export function validateModel(model: ObservationPart): void {
  const { n, m } = model;
  if (!Number.isInteger(n) || !(n >= 1)) throw new RangeError(`state dimension n must be a positive integer, got ${n}`);
  if (!Number.isInteger(m) || !(m >= 1)) throw new RangeError(`observation dimension m must be a positive integer, got ${m}`);
  const want: Array<[string, Float64Array, number]> = [
    ['H', model.H, m * n],
    ['R', model.R, m * m],
    ['x0', model.x0, n],
    ['P0', model.P0, n * n],
  ];
  for (const [name, arr, len] of want) {
    if (!(arr instanceof Float64Array)) throw new TypeError(`model.${name} must be a Float64Array`);
    if (arr.length !== len) {
      throw new DimensionMismatchError(`model.${name} has ${arr.length} entries, expected ${len} for n=${n}, m=${m}`);
    }
    for (let i = 0; i < len; i++) {
      if (!Number.isFinite(arr[i])) throw new RangeError(`model.${name}[${i}] is not finite (${arr[i]})`);
    }
  }
}

/** Matrices of a model whose transition and noise do not depend on the time step (e.g. a local-level model). */
export interface TimeInvariantModelSpec {
  /** Transition, n*n. */
  F: ArrayLike<number>;
  /** Input term, n (zeros when omitted). */
  u?: ArrayLike<number>;
  /** Process-noise covariance, n*n. */
  Q: ArrayLike<number>;
  /** Observation matrix, m*n. */
  H: ArrayLike<number>;
  /** Measurement-noise covariance, m*m. */
  R: ArrayLike<number>;
  /** Prior mean, n. */
  x0: ArrayLike<number>;
  /** Prior covariance, n*n. */
  P0: ArrayLike<number>;
}

/**
 * Builds a {@link StateSpaceModel} whose F, u and Q are the same for every step (time step ignored),
 * as in discrete-time series models such as the local-level model.
 * @param spec - the matrices (copied)
 * @returns the model
 * @throws DimensionMismatchError when the sizes are inconsistent (n from x0, m from H)
 */
export function timeInvariantModel(spec: TimeInvariantModelSpec): StateSpaceModel {
  const n = spec.x0.length;
  if (n < 1 || spec.H.length % n !== 0) {
    throw new DimensionMismatchError(`H has ${spec.H.length} entries, not a multiple of n=${n}`);
  }
  const m = spec.H.length / n;
  const F = Float64Array.from(spec.F);
  const Q = Float64Array.from(spec.Q);
  const u = spec.u ? Float64Array.from(spec.u) : new Float64Array(n);
  if (F.length !== n * n) throw new DimensionMismatchError(`F has ${F.length} entries, expected ${n * n}`);
  if (Q.length !== n * n) throw new DimensionMismatchError(`Q has ${Q.length} entries, expected ${n * n}`);
  if (u.length !== n) throw new DimensionMismatchError(`u has ${u.length} entries, expected ${n}`);
  const model: StateSpaceModel = {
    n,
    m,
    discretize(_dtS, Fo, uo, Qo) {
      Fo.set(F);
      uo.set(u);
      Qo.set(Q);
    },
    H: Float64Array.from(spec.H),
    R: Float64Array.from(spec.R),
    x0: Float64Array.from(spec.x0),
    P0: Float64Array.from(spec.P0),
  };
  validateModel(model);
  return model;
}

/**
 * The local-level (random walk plus noise) model: level_k = level_{k-1} + w_k, z_k = level_k + e_k.
 * @param levelVar - variance of the level disturbance w (data units squared)
 * @param obsVar - variance of the observation noise e (data units squared)
 * @param x0 - prior mean of the first level
 * @param P0 - prior variance of the first level (large for a vague start)
 * @returns the model (n = m = 1)
 * @see Durbin & Koopman (2012), Time Series Analysis by State Space Methods, 2nd ed., ch. 2
 */
export function localLevelModel(levelVar: number, obsVar: number, x0: number, P0: number): StateSpaceModel {
  if (!(levelVar >= 0) || !(obsVar >= 0) || !(P0 >= 0) || !Number.isFinite(x0)) {
    throw new RangeError(`localLevelModel: variances must be >= 0 and x0 finite (got ${levelVar}, ${obsVar}, ${x0}, ${P0})`);
  }
  return timeInvariantModel({ F: [1], Q: [levelVar], H: [1], R: [obsVar], x0: [x0], P0: [P0] });
}
