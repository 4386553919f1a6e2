/**
 * Arrival prediction under the drag hypothesis, where no closed form exists: numerical integration of
 * the drag dynamics to the target crossing, with the delta-method SD from the variational Jacobian.
 */
import { DimensionMismatchError } from '../errors';
import type { ArrivalPrediction } from './arrival';
import { makeDragAxisModel } from './dragModel';
import { STANDARD_GRAVITY_MPS2 } from './hypotheses';

/** Input of {@link predictArrivalDrag}. */
export interface DragArrivalInput {
  /** Position along the vertical (up-positive) axis, m. */
  posM: number;
  /** Velocity, m/s. */
  velMps: number;
  /** 2x2 row-major covariance of (posM, velMps). */
  cov: Float64Array;
  /** Quadratic drag coefficient k in a = -k |v| v, 1/m. */
  dragPerM: number;
  /** Gravity magnitude, m/s^2 (default standard gravity). */
  gMps2?: number;
  /** Height of the target plane, m. */
  targetHeightM: number;
  /** Give up after this long, s (default 10). */
  horizonS?: number;
}

/**
 * Earliest time at which a body under gravity and quadratic drag reaches the target plane: the drag
 * dynamics are integrated in 1 ms steps (RK4, see `makeDragAxisModel`) until the gap changes sign, then
 * the crossing is refined by bisection on the step to 1e-12 s. The SD uses the delta method with the
 * implicit-function gradient dt/d(p0, v0) = -(dp(t)/d(p0, v0)) / v(t), where dp(t)/d(p0, v0) is the
 * first row of the variational Jacobian Phi(t).
 * @param input - state, covariance, drag and target
 * @returns as {@link predictArrival}: `reachable: false` (status 'never-reaches') when no crossing
 *   within the horizon
 * @throws RangeError for non-finite inputs or a negative drag coefficient; DimensionMismatchError for cov not 2x2
 * @see Taylor (2005), Classical Mechanics, sec. 2.4; delta method: Casella & Berger (2002), sec. 5.5.4
 *   (section numbers from memory)
 */
export function predictArrivalDrag(input: DragArrivalInput): ArrivalPrediction {
  const { posM, velMps, cov, targetHeightM } = input;
  const horizonS = input.horizonS ?? 10;
  for (const [name, v] of [['posM', posM], ['velMps', velMps], ['targetHeightM', targetHeightM], ['horizonS', horizonS]] as const) {
    if (!Number.isFinite(v)) throw new RangeError(`predictArrivalDrag: ${name} must be finite, got ${v}`);
  }
  if (!(horizonS > 0)) throw new RangeError(`predictArrivalDrag: horizonS must be > 0, got ${horizonS}`);
  if (!cov || cov.length !== 4) throw new DimensionMismatchError(`predictArrivalDrag: cov must have 4 entries (2x2), got ${cov?.length}`);
  for (let i = 0; i < 4; i++) if (!Number.isFinite(cov[i])) throw new RangeError(`predictArrivalDrag: cov[${i}] is not finite`);
  const model = makeDragAxisModel(
    { id: 'drag', kind: 'drag', dragPerM: input.dragPerM, gMps2: input.gMps2 ?? STANDARD_GRAVITY_MPS2 },
    { axis: 'vertical', qIntensity: 0, measurementVarM2: 0 },
  );
  const x = Float64Array.of(posM, velMps);
  const y = new Float64Array(2);
  const F = new Float64Array(4);
  const Q = new Float64Array(4);
  const gap0 = posM - targetHeightM;
  if (gap0 === 0) return finish(0, velMps, Float64Array.of(1, 0, 0, 1), cov, 'at-target');
  const h = 0.001;
  let t = 0;
  while (t < horizonS) {
    model.propagate(h, x, 0, y, 0, F, Q);
    const gap = y[0] - targetHeightM;
    if (gap === 0 || gap > 0 !== gap0 > 0) {
      // bisection on the step for the crossing
      let lo = 0, hi = h;
      for (let it = 0; it < 60 && hi - lo > 1e-12; it++) {
        const mid = 0.5 * (lo + hi);
        model.propagate(mid, x, 0, y, 0, F, Q);
        if (y[0] - targetHeightM === 0 || y[0] - targetHeightM > 0 !== gap0 > 0) hi = mid;
        else lo = mid;
      }
      // Jacobian from the original state over the whole time
      const start = Float64Array.of(posM, velMps);
      model.propagate(t + hi, start, 0, y, 0, F, Q);
      return finish(t + hi, y[1], F, cov, 'arrives');
    }
    x[0] = y[0];
    x[1] = y[1];
    t += h;
  }
  return { reachable: false, timeS: NaN, sdS: NaN, impactVelMps: NaN, status: 'never-reaches' };
}

function finish(t: number, vAt: number, F: Float64Array, cov: Float64Array, status: 'arrives' | 'at-target'): ArrivalPrediction {
  let sdS = Infinity;
  if (vAt !== 0) {
    const g0 = -F[0] / vAt, g1 = -F[1] / vAt;
    const v = g0 * g0 * cov[0] + g0 * g1 * (cov[1] + cov[2]) + g1 * g1 * cov[3];
    sdS = Math.sqrt(Math.max(0, v));
  }
  return { reachable: true, timeS: t, sdS, impactVelMps: vAt, status };
}
