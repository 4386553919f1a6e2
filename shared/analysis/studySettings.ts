/**
 * Settings of a Forecatch timing analysis and the trial list entries (see types.ts for the overview).
 */
import type { EmgConditioningSettingsLike, OnsetSettingsLike } from './emgTypes';

/** Lab axis pointing up, with its sign. */
export type UpAxis = '+x' | '-x' | '+y' | '-y' | '+z' | '-z';

/** Dynamics hypothesis kinds: the engine's (shared/ssm/hypotheses.ts) plus the Bayesian observer. */
export type AnalysisHypothesisKind =
  | 'constant-velocity'
  | 'gravity'
  | 'fitted-gravity'
  | 'free-acceleration'
  | 'drag'
  | 'bayesian-observer';

/**
 * One hypothesis about the acceleration an observer extrapolates with, from the state at the cutoff.
 * - `constant-velocity`: a = 0.
 * - `gravity`: a = -gMps2 (default 9.80665 m/s^2).
 * - `fitted-gravity`: a = the trial's constant acceleration fitted over the whole motion (release..contact).
 * - `free-acceleration`: a = the reconstruction's acceleration estimate at the cutoff (what is seen).
 * - `drag`: a = -g + dragPerM * v^2 (quadratic drag opposing a downward motion), integrated numerically.
 * - `bayesian-observer`: a = precision-weighted mean of a Gaussian prior N(-priorGMps2, sigma_prior^2) and
 *   the causal filter's acceleration estimate at the cutoff; sigma_prior fitted per subject.
 */
export interface AnalysisHypothesis {
  /** Stable id used in tables (`hypothesis` column), e.g. `gravity`, `g-half`, `cv`. */
  id: string;
  kind: AnalysisHypothesisKind;
  /** Gravity magnitude for `gravity` and `drag`, m/s^2 (default 9.80665). */
  gMps2?: number;
  /** Quadratic drag coefficient for `drag`, 1/m (acceleration = dragPerM * v^2). */
  dragPerM?: number;
  /** Prior centre for `bayesian-observer`, m/s^2 magnitude (default 9.80665). */
  priorGMps2?: number;
  /** Human-readable name for views and methods text. */
  label?: string;
}

/** Where the moving target is: a marker (e.g. the hand) or a fixed catch height. */
export type TargetSpec =
  | { kind: 'marker'; marker: string; /** added to the marker's height, m (e.g. palm above the marker) */ offsetM?: number }
  | { kind: 'height'; /** catch height along the up axis, m */ heightM: number };

/**
 * The information cutoff: the instant whose state the observer is assumed to act on.
 * - `onset-minus-delay`: onset minus a visuomotor delay (default 100 ms).
 * - `after-release`: a fixed time after release.
 * - `onset`: the onset itself.
 */
export type CutoffRule =
  | { kind: 'onset-minus-delay'; /** visuomotor delay, ms (default 100) */ delayMs: number }
  | { kind: 'after-release'; /** time after release, ms */ afterMs: number }
  | { kind: 'onset' };

/** One EMG channel of the recordings and the muscle it records. */
export interface EmgChannelSpec {
  /** Channel label as in the recording (e.g. `EMG1`, `FCR`). */
  channel: string;
  /** Muscle name used in tables (e.g. `flexor_carpi_radialis`). */
  muscle: string;
}

/** An impact/contact channel (switch, accelerometer, force) mapped to contact detection. */
export interface ImpactChannelSpec {
  /** Channel label as in the recording. */
  channel: string;
  /** Contact = first sample whose absolute value exceeds this, in the channel's units. */
  threshold: number;
}

/** How the object trajectory is reconstructed before evaluation. */
export interface ReconstructionSettings {
  /** Reconstruction model kind along the vertical axis (default `free-acceleration`: [p, v, a], white jerk). */
  kind: 'free-acceleration' | 'fitted-gravity' | 'gravity';
  /** Noise: fitted per trial by the engine's estimator (default), or fixed values. */
  noise:
    | { kind: 'fitted' }
    | { kind: 'fixed'; /** process noise spectral density, m^2/s^5 (jerk) or m^2/s^3 */ qIntensity: number; /** measurement variance, m^2 */ measurementVarM2: number };
}

/** Release (motion start) detection. */
export interface ReleaseSettings {
  /** Downward speed that counts as moving, m/s (default 0.10). */
  speedThresholdMps: number;
  /** The speed must stay above the threshold this long, ms (default 30). */
  sustainMs: number;
}

/** Everything the analysis needs to know; stored in the study file, hashed into every output header. */
export interface StudySettings {
  /** Marker label of the moving object (ball). */
  objectMarker: string;
  /** The target the object arrives at (hand marker or catch height). */
  target: TargetSpec;
  /** Lab axis that points up. */
  upAxis: UpAxis;
  /** EMG channels and their muscle names; empty = kinematics only (no onsets, no timing). */
  emgChannels: EmgChannelSpec[];
  /** Optional impact channel; when present it defines measured contact instead of the target height. */
  impactChannel?: ImpactChannelSpec;
  /** EMG conditioning (shared/emg). */
  conditioning: EmgConditioningSettingsLike;
  /** EMG onset detector (shared/emg). */
  onset: OnsetSettingsLike;
  /** Onset search window: from release minus `onsetLeadMs` to contact plus `onsetMarginMs`, ms. */
  onsetLeadMs: number;
  /** See `onsetLeadMs`; default 50 ms. */
  onsetMarginMs: number;
  /** Hypotheses compared, in table order. */
  hypotheses: AnalysisHypothesis[];
  /** Information cutoff rule. */
  cutoff: CutoffRule;
  /** State used at the cutoff: RTS-smoothed (best physical estimate, default) or causal filtered. */
  stateSource: 'smoothed' | 'filtered';
  reconstruction: ReconstructionSettings;
  release: ReleaseSettings;
  /** Internal-gravity profile grid: `points` values evenly from 0 to `maxG` * 9.80665 m/s^2 (default 81, 2). */
  gravityGrid: { points: number; maxG: number };
  /** Bayesian-observer prior width grid: `points` log-spaced values from `minMps2` to `maxMps2`. */
  priorWidthGrid: { points: number; minMps2: number; maxMps2: number };
  /** Delays for the sensitivity sweep, ms (default 0, 25, ..., 200). */
  delaySweepMs: number[];
  /** Bootstrap of log-likelihood differences: replicates and seed. */
  bootstrap: { replicates: number; seed: number };
}

/** One trial as listed in the study. */
export interface TrialSpec {
  /** Trial id, unique in the study. */
  id: string;
  subject: string;
  condition: string;
  /** Kinematics recording, path relative to the study file's folder. */
  file: string;
  /** EMG recording when separate from `file`, relative path. */
  emgFile?: string;
  /** Offset added to the EMG file's clock to put it on the kinematics clock, s (default 0). */
  emgOffsetS?: number;
  excluded: boolean;
  /** Why the trial is excluded (user-entered or automatic). */
  excludeReason?: string;
  note?: string;
  /** Extra columns of the trial list (drop height, programmed acceleration, ...). */
  covariates: Record<string, number | string>;
}

