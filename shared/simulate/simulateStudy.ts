import type { Recording } from '../recording/types';
import type { StudySettings, TrialSpec } from '../analysis/types';
import { seededRandom } from '../analysis/seededRandom';
import { defaultStudySettings } from '../analysis/defaultSettings';
import { G0_MPS2 } from '../analysis/hypothesisTtc';
import type { RailMotion } from './railTrajectory';
import { simulateRailTrial, type RailRecordingOptions, type RailTrialTruth } from './simulateRailTrial';
import type { SimulatedSubject } from './simulatedSubject';

/** Options of {@link simulateStudy} (the invented rail lab). */
export interface SimulateStudyOptions {
  subjects: SimulatedSubject[];
  /** Trials per subject, spread evenly over the programmed accelerations. */
  trialsPerSubject: number;
  seed: number;
  /** Programmed accelerations in multiples of g0 (default 0, 0.5, 1); each is one condition `a0`, `a0.5`, `a1`. */
  accG?: number[];
  /** Drop heights above the catch height, m (default 1.5 to 3.0, drawn uniformly). */
  dropRangeM?: [number, number];
  /**
   * Initial speed range after launch for a programmed acceleration (m/s, drawn uniformly); default
   * 1.5-3.5 m/s at 0 g, 0.5-2.5 m/s below 0.75 g, 0.2-1.5 m/s above, so that every motion lasts about
   * 0.5 s or more.
   */
  speedRangeMps?: (accG: number) => [number, number];
  /** Catch height, m (default 1.0). */
  catchHeightM?: number;
  recording?: Partial<RailRecordingOptions>;
  /** Trial ids (e.g. `s1-t07`) that get no muscle activation: bad trials. */
  silentTrials?: string[];
}

/** One simulated trial: its spec in the study, the in-memory recording and the truth. */
export interface SimulatedTrial {
  spec: TrialSpec;
  recording: Recording;
  truth: RailTrialTruth;
  motion: RailMotion;
  subject: SimulatedSubject;
}

/**
 * Condition label of a programmed acceleration.
 *
 * @param accG - acceleration in multiples of g0
 * @returns e.g. `a0.5`
 */
export function conditionLabel(accG: number): string {
  return `a${Number(accG.toFixed(3))}`;
}

/**
 * Simulates a whole study in memory (deterministic for a seed): each subject catches balls driven down the
 * rail at the programmed accelerations from random heights and initial speeds; onsets follow each subject's
 * internal-gravity time-to-contact rule with motor noise. Files: `<subject>/<trial>.c3d` (names only; the CLI
 * writes them).
 *
 * @param opts - subjects, trial count, seed and ranges
 * @returns trials and matching settings (muscles from the recording options)
 * @throws RangeError for a non-positive trial count
 */
export function simulateStudy(opts: SimulateStudyOptions): { trials: SimulatedTrial[]; settings: StudySettings } {
  if (!(opts.trialsPerSubject >= 1)) throw new RangeError(`simulateStudy: trialsPerSubject must be >= 1, got ${opts.trialsPerSubject}`);
  const rng = seededRandom(opts.seed);
  const accG = opts.accG ?? [0, 0.5, 1];
  const [d0, d1] = opts.dropRangeM ?? [1.5, 3.0];
  const speedRange = opts.speedRangeMps ?? ((a: number): [number, number] => (a < 0.25 ? [1.5, 3.5] : a < 0.75 ? [0.5, 2.5] : [0.2, 1.5]));
  const catchHeightM = opts.catchHeightM ?? 1.0;
  const muscles = opts.recording?.muscles ?? ['FCR'];
  const silent = new Set(opts.silentTrials ?? []);
  const trials: SimulatedTrial[] = [];
  for (const subject of opts.subjects) {
    for (let i = 0; i < opts.trialsPerSubject; i++) {
      const a = accG[i % accG.length];
      const [v0, v1] = speedRange(a);
      const motion: RailMotion = {
        dropM: d0 + (d1 - d0) * rng.uniform(),
        catchHeightM,
        initialSpeedMps: v0 + (v1 - v0) * rng.uniform(),
        accMps2: a * G0_MPS2,
        launchAccMps2: 40,
        releaseS: 0.5,
      };
      const id = `${subject.id}-t${String(i + 1).padStart(3, '0')}`;
      const { recording, truth } = simulateRailTrial(motion, subject, rng, { ...opts.recording, emgActive: !silent.has(id) });
      recording.source = `${subject.id}/${id}.c3d`;
      trials.push({
        spec: {
          id,
          subject: subject.id,
          condition: conditionLabel(a),
          file: `${subject.id}/${id}.c3d`,
          excluded: false,
          covariates: {
            drop_m: Number(motion.dropM.toFixed(4)),
            initial_speed_mps: Number(motion.initialSpeedMps.toFixed(4)),
            programmed_acc_g: a,
          },
        },
        recording,
        truth,
        motion,
        subject,
      });
    }
  }
  const settings = defaultStudySettings({
    objectMarker: 'ball',
    target: { kind: 'marker', marker: 'hand' },
    upAxis: '+z',
    emgChannels: muscles.map((m) => ({ channel: m, muscle: m })),
  });
  return { trials, settings };
}
