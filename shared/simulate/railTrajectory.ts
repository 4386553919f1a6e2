/**
 * Motion of the ball on Forecatch's motorised vertical rail (an invented lab scenario): the ball rests at
 * the top, the rail launches it downward at `launchAccMps2` until it reaches the programmed initial speed,
 * then drives it at the programmed constant downward acceleration until it reaches the catch height, where
 * the hand takes it and brings it to rest over `stopDistanceM` with constant deceleration. Heights are up positive, m; velocities m/s; accelerations m/s^2.
 */
export interface RailMotion {
  /** Height of the ball's start above the catch height, m (> 0). */
  dropM: number;
  /** Catch height, m. */
  catchHeightM: number;
  /** Speed reached at the end of the launch, m/s (>= 0; > 0 when the programmed acceleration is 0). */
  initialSpeedMps: number;
  /** Programmed downward acceleration magnitude after the launch, m/s^2 (>= 0). */
  accMps2: number;
  /** Launch acceleration magnitude, m/s^2 (default 40). */
  launchAccMps2: number;
  /** Release (start of the launch) on the recording clock, s. */
  releaseS: number;
  /** Distance over which the hand stops the ball after contact, m (default 0.04). */
  stopDistanceM?: number;
}

/** True kinematic state at one instant. */
export interface RailState {
  heightM: number;
  velMps: number;
  accMps2: number;
}

/**
 * Duration of the launch phase and where it ends.
 *
 * @param m - the motion
 * @returns launch duration s, distance fallen during it m
 */
export function launchPhase(m: RailMotion): { durationS: number; distanceM: number } {
  const durationS = m.initialSpeedMps / m.launchAccMps2;
  return { durationS, distanceM: 0.5 * m.launchAccMps2 * durationS * durationS };
}

/**
 * Time of contact (ball at the catch height), s on the recording clock.
 *
 * @param m - the motion
 * @returns contact time, s; throws when the ball never arrives
 * @throws RangeError when the launch alone overshoots the drop, or the ball never moves
 */
export function railContactS(m: RailMotion): number {
  const L = launchPhase(m);
  if (L.distanceM >= m.dropM) throw new RangeError(`rail: launch (${L.distanceM.toFixed(3)} m) overshoots the drop ${m.dropM} m`);
  const d = m.dropM - L.distanceM;
  const v = m.initialSpeedMps;
  const a = m.accMps2;
  // d = v t + a t^2 / 2
  let t: number;
  if (a === 0) {
    if (!(v > 0)) throw new RangeError('rail: the ball never moves (no initial speed, no acceleration)');
    t = d / v;
  } else t = (-v + Math.sqrt(v * v + 2 * a * d)) / a;
  return m.releaseS + L.durationS + t;
}

/**
 * True state of the ball at time tS (before release: at rest at the top; after contact: decelerated to rest
 * over the stop distance below the catch height).
 *
 * @param m - the motion
 * @param tS - time, s
 * @param out - receives the state
 * @returns out
 */
export function railStateAt(m: RailMotion, tS: number, out: RailState): RailState {
  const top = m.catchHeightM + m.dropM;
  const L = launchPhase(m);
  const tc = railContactS(m);
  const t = tS - m.releaseS;
  if (t <= 0) {
    out.heightM = top;
    out.velMps = 0;
    out.accMps2 = 0;
  } else if (tS >= tc) {
    const vc = m.initialSpeedMps + m.accMps2 * (tc - m.releaseS - L.durationS); // speed at contact
    const stop = m.stopDistanceM ?? 0.04;
    const dec = (vc * vc) / (2 * stop);
    const u = Math.min(tS - tc, vc / dec);
    out.heightM = m.catchHeightM - vc * u + 0.5 * dec * u * u;
    out.velMps = u < vc / dec ? -vc + dec * u : 0;
    out.accMps2 = u < vc / dec ? dec : 0;
  } else if (t < L.durationS) {
    out.heightM = top - 0.5 * m.launchAccMps2 * t * t;
    out.velMps = -m.launchAccMps2 * t;
    out.accMps2 = -m.launchAccMps2;
  } else {
    const u = t - L.durationS;
    out.heightM = top - L.distanceM - m.initialSpeedMps * u - 0.5 * m.accMps2 * u * u;
    out.velMps = -m.initialSpeedMps - m.accMps2 * u;
    out.accMps2 = -m.accMps2;
  }
  return out;
}
