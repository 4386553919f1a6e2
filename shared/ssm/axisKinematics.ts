/**
 * Maps a per-axis state estimate of a hypothesis model to the (position, velocity, acceleration)
 * triple and 3x3 covariance that {@link predictArrival} takes.
 */
import { DimensionMismatchError } from '../errors';
import type { ArrivalInput } from './arrival';
import { axisStateLayout, STANDARD_GRAVITY_MPS2, type HypothesisSpec } from './hypotheses';

/** Kinematics of one axis at one instant (the state part of {@link ArrivalInput}). */
export type AxisKinematics = Pick<ArrivalInput, 'posM' | 'velMps' | 'accMps2' | 'cov'>;

/**
 * Reads sample `k` of a state sequence (e.g. `xFilt`/`PFilt` or `xSmooth`/`PSmooth`) of a model built by
 * `makeAxisModel(spec, { axis })` and returns position, velocity, the hypothesis' acceleration and
 * their covariance: constant velocity a = 0; gravity a = -g (fixed, zero variance) on the vertical axis;
 * fitted gravity a = -g_hat with its variance; free acceleration a = a_hat.
 * @param spec - the hypothesis the model was built from
 * @param axis - the axis the model was built for
 * @param x - means, T*n
 * @param P - covariances, T*n*n
 * @param k - sample index
 * @returns kinematics ready for predictArrival (add the target)
 * @throws DimensionMismatchError when x/P do not fit the hypothesis layout; RangeError for a bad k or kind 'drag'
 */
export function axisKinematics(
  spec: HypothesisSpec, axis: 'vertical' | 'horizontal', x: Float64Array, P: Float64Array, k: number,
): AxisKinematics {
  if (spec.kind === 'drag') {
    throw new RangeError('axisKinematics: a drag model has no constant acceleration; predict its arrival by integrating the drag dynamics');
  }
  const n = axisStateLayout(spec, axis).length;
  if (x.length % n !== 0 || P.length !== (x.length / n) * n * n) {
    throw new DimensionMismatchError(`axisKinematics: x (${x.length}) and P (${P.length}) do not fit ${n} states`);
  }
  const T = x.length / n;
  if (!Number.isInteger(k) || !(k >= 0 && k < T)) throw new RangeError(`axisKinematics: sample ${k} outside 0..${T - 1}`);
  const xo = k * n, po = k * n * n;
  const cov = new Float64Array(9);
  for (let i = 0; i < 2; i++) for (let j = 0; j < 2; j++) cov[i * 3 + j] = P[po + i * n + j];
  let acc = 0;
  if (n === 3) {
    // third state: a (free acceleration) or g (fitted gravity, a = -g)
    const s = spec.kind === 'fitted-gravity' ? -1 : 1;
    acc = s * x[xo + 2];
    for (let i = 0; i < 2; i++) {
      cov[i * 3 + 2] = s * P[po + i * n + 2];
      cov[2 * 3 + i] = s * P[po + 2 * n + i];
    }
    cov[8] = P[po + 8];
  } else if (spec.kind === 'gravity' && axis === 'vertical') {
    acc = -(spec.gMps2 ?? STANDARD_GRAVITY_MPS2);
  }
  return { posM: x[xo], velMps: x[xo + 1], accMps2: acc, cov };
}
