import type { MarkerTrajectory, Recording, SignalChannel } from '../recording/types';
import type { SeededRandom } from '../analysis/seededRandom';
import { bandNoise } from './bandNoise';
import { railContactS, railStateAt, type RailMotion, type RailState } from './railTrajectory';
import { subjectOnsetS, type SimulatedSubject } from './simulatedSubject';

/** Recording options of the simulated rail lab (all invented). */
export interface RailRecordingOptions {
  /** Marker rate, Hz (default 200). */
  markerRateHz: number;
  /** EMG rate, Hz (default 2000). */
  emgRateHz: number;
  /** Marker noise SD per axis, m (default 0.001). */
  markerNoiseM: number;
  /** Number of dropout gaps in the ball marker (default 2), each 2-8 frames. */
  dropouts: number;
  /** Muscles recorded (channel label = muscle name); default ['FCR']. Later muscles fire 5-15 ms later. */
  muscles: string[];
  /** EMG baseline RMS, uV (default 5) and burst RMS, uV (default 80). */
  emgBaselineUv: number;
  emgBurstUv: number;
  /** Rest before release, s (default 0.5) and recording after contact, s (default 0.3). */
  preS: number;
  postS: number;
  /** When false, the subject never activates (no onset): a bad trial. Default true. */
  emgActive: boolean;
}

/** Defaults of {@link RailRecordingOptions}. */
export const DEFAULT_RAIL_RECORDING: RailRecordingOptions = {
  markerRateHz: 200,
  emgRateHz: 2000,
  markerNoiseM: 0.001,
  dropouts: 2,
  muscles: ['FCR'],
  emgBaselineUv: 5,
  emgBurstUv: 80,
  preS: 0.5,
  postS: 0.3,
  emgActive: true,
};

/** Ground truth of a simulated trial. */
export interface RailTrialTruth {
  releaseS: number;
  contactS: number;
  /** Onset per muscle (with motor noise), s; NaN when the subject did not activate. */
  onsetS: Record<string, number>;
}

/**
 * Simulates one trial of the rail lab: ball and hand markers (lab z up, metres) with noise and dropouts,
 * and forearm EMG (uV) with a burst starting at the subject's onset.
 *
 * @param motion - rail motion (release time sets the clock; preS is added before it by the caller)
 * @param subject - simulated subject
 * @param rng - seeded generator (consumed)
 * @param opts - recording options (defaults {@link DEFAULT_RAIL_RECORDING})
 * @returns the Recording (format 'c3d', source `sim`) and the truth
 */
export function simulateRailTrial(
  motion: RailMotion,
  subject: SimulatedSubject,
  rng: SeededRandom,
  opts: Partial<RailRecordingOptions> = {},
): { recording: Recording; truth: RailTrialTruth } {
  const o = { ...DEFAULT_RAIL_RECORDING, ...opts };
  const contactS = railContactS(motion);
  const endS = contactS + o.postS;
  const T = Math.floor(endS * o.markerRateHz) + 1;
  const ball: MarkerTrajectory = { label: 'ball', x: new Float64Array(T), y: new Float64Array(T), z: new Float64Array(T) };
  const hand: MarkerTrajectory = { label: 'hand', x: new Float64Array(T), y: new Float64Array(T), z: new Float64Array(T) };
  const st: RailState = { heightM: 0, velMps: 0, accMps2: 0 };
  for (let i = 0; i < T; i++) {
    railStateAt(motion, i / o.markerRateHz, st);
    ball.x[i] = 0.3 + o.markerNoiseM * rng.normal();
    ball.y[i] = 0.2 + o.markerNoiseM * rng.normal();
    ball.z[i] = st.heightM + o.markerNoiseM * rng.normal();
    hand.x[i] = 0.3 + o.markerNoiseM * rng.normal();
    hand.y[i] = 0.25 + o.markerNoiseM * rng.normal();
    // the hand waits at the catch height and moves down with the ball once it has it
    hand.z[i] = Math.min(motion.catchHeightM, st.heightM) + o.markerNoiseM * rng.normal();
  }
  // dropouts of the ball marker while it moves
  const i0 = Math.ceil(motion.releaseS * o.markerRateHz);
  const i1 = Math.floor(contactS * o.markerRateHz);
  for (let d = 0; d < o.dropouts && i1 - i0 > 20; d++) {
    const len = 2 + rng.int(7);
    const at = i0 + rng.int(Math.max(1, i1 - i0 - len));
    for (let i = at; i < Math.min(at + len, T); i++) ball.x[i] = ball.y[i] = ball.z[i] = NaN;
  }
  const onsetBase = o.emgActive ? subjectOnsetS(subject, motion) : NaN;
  const onsetS: Record<string, number> = {};
  // whole marker frames of EMG samples when the rates allow it (so a C3D file can hold both)
  const ratio = o.emgRateHz / o.markerRateHz;
  const E = Number.isInteger(ratio) ? T * ratio : Math.floor(endS * o.emgRateHz) + 1;
  const signals: SignalChannel[] = [];
  o.muscles.forEach((muscle, mi) => {
    const lag = mi === 0 ? 0 : 0.005 + 0.01 * rng.uniform();
    const on = Number.isFinite(onsetBase) ? onsetBase + lag + subject.motorNoiseSdS * rng.normal() : NaN;
    onsetS[muscle] = on;
    const base = bandNoise(E, o.emgRateHz, 90, 0.7, rng);
    const burst = bandNoise(E, o.emgRateHz, 110, 0.8, rng);
    const values = new Float32Array(E);
    for (let i = 0; i < E; i++) {
      const t = i / o.emgRateHz;
      let env = 0;
      if (t >= on) env = Math.min(1, (t - on) / 0.02); // 20 ms rise
      values[i] = o.emgBaselineUv * base[i] + o.emgBurstUv * env * burst[i];
    }
    signals.push({ label: muscle, units: 'uV', rateHz: o.emgRateHz, startS: 0, values });
  });
  const recording: Recording = {
    source: 'sim',
    format: 'c3d',
    markers: { rateHz: o.markerRateHz, startS: 0, frameCount: T, sourceUnits: 'm', markers: [ball, hand] },
    signals,
    events: [],
    warnings: [],
    meta: { simulated: true, scenario: 'Forecatch motorised rail lab (invented data)' },
  };
  return { recording, truth: { releaseS: motion.releaseS, contactS, onsetS } };
}
