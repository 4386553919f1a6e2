/**
 * Arrival prediction: when an object moving with constant acceleration along one axis reaches a target
 * (a plane at a height, or a target moving with constant velocity), with its uncertainty, and the
 * time-to-contact at a given moment.
 */
import { DimensionMismatchError } from '../errors';

/** Input of {@link predictArrival}: a per-axis kinematic state with its covariance, and the target. */
export interface ArrivalInput {
  /** Position along the axis at the state's instant, m. */
  posM: number;
  /** Velocity along the axis, m/s. */
  velMps: number;
  /** Acceleration along the axis (constant over the prediction), m/s^2; -g for a falling object on an up axis. */
  accMps2: number;
  /** 3x3 row-major covariance of (posM, velMps, accMps2); zeros where a quantity is fixed by the hypothesis. */
  cov: Float64Array;
  /** Target position at the state's instant, m. */
  targetHeightM: number;
  /** Target velocity along the axis (constant), m/s; 0 when omitted. */
  targetVelMps?: number;
}

/** Why an arrival could or could not be predicted. */
export type ArrivalStatus = 'arrives' | 'at-target' | 'never-reaches';

/** Output of {@link predictArrival}. */
export interface ArrivalPrediction {
  /** True when the object reaches the target at some time >= 0. */
  reachable: boolean;
  /** Time from the state's instant until arrival, s; NaN (flagged by `reachable: false`) if unreachable. */
  timeS: number;
  /**
   * Standard deviation of `timeS` by the delta method, s; NaN when unreachable, Infinity when the
   * object only grazes the target (relative velocity zero at arrival, the root is not differentiable).
   */
  sdS: number;
  /** Relative velocity (object minus target) at arrival, m/s; NaN when unreachable. */
  impactVelMps: number;
  /** What happened. */
  status: ArrivalStatus;
}

function checkFinite(name: string, v: number): void {
  if (!Number.isFinite(v)) throw new RangeError(`predictArrival: ${name} must be finite, got ${v}`);
}

/**
 * Earliest t >= 0 with p + v t + a t^2 / 2 = target + vT t, in closed form, and its standard deviation
 * from the state covariance by the delta method: with g(t) = d + w t + a t^2/2 (d = p - target,
 * w = v - vT), the implicit-function gradient is dt/d(p, v, a) = -(1, t, t^2/2) / (w + a t), and
 * var(t) = grad' cov grad.
 *
 * The roots use the cancellation-free form q = -(w + sign(w) sqrt(w^2 - 2 a d)) / 2, roots q / (a/2)
 * and d / q, which also covers a = 0 (linear motion).
 *
 * @param input - state, covariance and target (see {@link ArrivalInput})
 * @returns the arrival time, its SD and a status; unreachable cases are flagged, never a silent NaN
 * @throws RangeError for non-finite inputs; DimensionMismatchError when cov does not have 9 entries
 * @see Delta method: e.g. Casella & Berger (2002), Statistical Inference, 2nd ed., sec. 5.5.4;
 *   stable quadratic roots: Press et al. (2007), Numerical Recipes, 3rd ed., sec. 5.6 (section numbers
 *   from memory)
 */
export function predictArrival(input: ArrivalInput): ArrivalPrediction {
  const { posM, velMps, accMps2, cov, targetHeightM } = input;
  const vT = input.targetVelMps ?? 0;
  checkFinite('posM', posM);
  checkFinite('velMps', velMps);
  checkFinite('accMps2', accMps2);
  checkFinite('targetHeightM', targetHeightM);
  checkFinite('targetVelMps', vT);
  if (!cov || cov.length !== 9) throw new DimensionMismatchError(`predictArrival: cov must have 9 entries (3x3), got ${cov?.length}`);
  for (let i = 0; i < 9; i++) checkFinite(`cov[${i}]`, cov[i]);

  const d = posM - targetHeightM;
  const w = velMps - vT;
  const a = accMps2;
  let t: number;
  if (d === 0) {
    t = 0;
  } else {
    // d + w t + (a/2) t^2 = 0
    const disc = w * w - 2 * a * d;
    if (!(disc >= 0)) return unreachable();
    const q = -0.5 * (w + (w >= 0 ? 1 : -1) * Math.sqrt(disc));
    const r1 = q / (0.5 * a);
    const r2 = d / q;
    t = Infinity;
    if (r1 >= 0 && r1 < t) t = r1;
    if (r2 >= 0 && r2 < t) t = r2;
    if (!Number.isFinite(t)) return unreachable();
  }
  const rate = w + a * t;
  let sdS: number;
  if (rate === 0) {
    sdS = Infinity;
  } else {
    const g0 = -1 / rate, g1 = -t / rate, g2 = (-0.5 * t * t) / rate;
    const g = [g0, g1, g2];
    let varT = 0;
    for (let i = 0; i < 3; i++) for (let j = 0; j < 3; j++) varT += g[i] * cov[i * 3 + j] * g[j];
    sdS = Math.sqrt(Math.max(0, varT));
  }
  return { reachable: true, timeS: t, sdS, impactVelMps: rate, status: d === 0 ? 'at-target' : 'arrives' };
}

function unreachable(): ArrivalPrediction {
  return { reachable: false, timeS: NaN, sdS: NaN, impactVelMps: NaN, status: 'never-reaches' };
}

/** Input of {@link timeToContact}: the kinematic state at the moment of interest and the target. */
export interface TimeToContactInput {
  /** Position at the moment, m. */
  posM: number;
  /** Velocity at the moment, m/s. */
  velMps: number;
  /** Acceleration at the moment, m/s^2 (0 when omitted). */
  accMps2?: number;
  /** Target position at the moment, m. */
  targetHeightM: number;
  /** Target velocity, m/s (0 when omitted). */
  targetVelMps?: number;
}

/** Output of {@link timeToContact}. */
export interface TimeToContact {
  /** Distance to the target, |p - target|, m. */
  distanceM: number;
  /** Closing speed (positive when the gap shrinks), m/s. */
  closingSpeedMps: number;
  /** True when the gap is shrinking (closing speed > 0) or already zero. */
  approaching: boolean;
  /** First-order estimate d / closing speed, s; NaN (flagged by `approaching: false`) when not approaching. */
  firstOrderS: number;
  /** True when the second-order (constant-acceleration) contact exists. */
  reachable: boolean;
  /** Second-order (constant acceleration) time to contact, s; NaN (flagged by `reachable: false`) otherwise. */
  secondOrderS: number;
}

/**
 * Time-to-contact at a given moment: the first-order estimate T1 = d / v (which equals tau =
 * theta / theta-dot under constant closing speed) and the second-order one with constant
 * acceleration, T2 = (-v + sqrt(v^2 + 2 a d)) / a written for signed quantities (the earliest root).
 * @param input - state at the moment and target
 * @returns both estimates with flags
 * @throws RangeError for non-finite inputs
 * @see Lee (1976), Perception 5:437-459 (tau); second order: the constant-acceleration kinematic equation
 */
export function timeToContact(input: TimeToContactInput): TimeToContact {
  const acc = input.accMps2 ?? 0;
  const pred = predictArrival({
    posM: input.posM, velMps: input.velMps, accMps2: acc, cov: new Float64Array(9),
    targetHeightM: input.targetHeightM, targetVelMps: input.targetVelMps,
  });
  const d = input.posM - input.targetHeightM;
  const w = input.velMps - (input.targetVelMps ?? 0);
  const distanceM = Math.abs(d);
  const closingSpeedMps = d > 0 ? -w : d < 0 ? w : Math.abs(w);
  const approaching = d === 0 || closingSpeedMps > 0;
  return {
    distanceM,
    closingSpeedMps,
    approaching,
    firstOrderS: d === 0 ? 0 : approaching ? distanceM / closingSpeedMps : NaN,
    reachable: pred.reachable,
    secondOrderS: pred.timeS,
  };
}
