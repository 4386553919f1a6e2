import { arrivalTimeS } from '../analysis/arrivalTime';
import { railContactS, railStateAt, type RailMotion, type RailState } from './railTrajectory';

/** A simulated catcher (invented): times muscle onset by a time-to-contact threshold with internal gravity. */
export interface SimulatedSubject {
  id: string;
  /** Internal gravity magnitude the subject extrapolates with, m/s^2 (0 = constant velocity). */
  internalGMps2: number;
  /** Time-to-contact threshold at onset, s (e.g. 0.20). */
  ttcThresholdS: number;
  /** Visuomotor delay: the subject acts on the state this long before onset, s (e.g. 0.10). */
  delayS: number;
  /** Motor noise: SD of the onset time, s (e.g. 0.010). */
  motorNoiseSdS: number;
}

/**
 * Noise-free onset of a simulated subject: the first instant t (1 ms steps, then refined linearly) at which
 * the time-to-contact the subject computes from the true state at t - delay under internal gravity G,
 *   ttc(t) = (t - delay) + arrival(p, v, -G) - t,
 * drops to the threshold.
 *
 * @param subject - the simulated subject
 * @param motion - the rail motion
 * @returns onset time, s (recording clock); NaN when the threshold is never reached before contact
 */
export function subjectOnsetS(subject: SimulatedSubject, motion: RailMotion): number {
  const tc = railContactS(motion);
  const st: RailState = { heightM: 0, velMps: 0, accMps2: 0 };
  const ttcAt = (t: number): number => {
    railStateAt(motion, t - subject.delayS, st);
    return -subject.delayS + arrivalTimeS(st.heightM, st.velMps, -subject.internalGMps2, motion.catchHeightM);
  };
  const step = 0.001;
  let prevT = NaN;
  let prev = NaN;
  for (let t = motion.releaseS + subject.delayS + step; t < tc; t += step) {
    const v = ttcAt(t);
    if (v <= subject.ttcThresholdS) {
      if (Number.isFinite(prev)) return prevT + ((prev - subject.ttcThresholdS) / (prev - v)) * (t - prevT);
      return t;
    }
    if (Number.isFinite(v)) {
      prev = v;
      prevT = t;
    }
  }
  return NaN;
}
