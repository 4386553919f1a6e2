/**
 * The data of a Forecatch timing analysis: settings, per-trial cached work, per-hypothesis evaluations and
 * the study-level statistics the desktop views and the CLI outputs render.
 *
 * Flow: `prepareTrial(trial, recording, settings) -> PreparedTrial` (expensive, cached) then
 * `evaluateStudy(prepared[], settings, journal) -> StudyEvaluation` (cheap, closed form).
 *
 * Conventions: times are seconds on the trial's recording clock (`_s`/`S`) unless a name ends in `Ms`;
 * heights are metres along the lab's up axis (up positive); accelerations are m/s^2 with the sign of the
 * up axis (free fall is about -9.81); `gMps2` values are magnitudes (positive = downward pull).
 */
import type {
  EmgConditioningSettingsLike,
  OnsetJournalLike,
  OnsetResultLike,
  OnsetSettingsLike,
} from './emgTypes';

export type { OnsetJournalLike, OnsetResultLike, OnsetSettingsLike, EmgConditioningSettingsLike };

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

/** A problem found while preparing or evaluating a trial; the trial keeps going where it can. */
export interface TrialFlag {
  /** Stable code: `missing-file`, `read-error`, `no-object-marker`, `no-release`, `no-contact`,
   *  `no-onset`, `onset-outside-window`, `too-many-gaps`, `noise-fit-failed`, `no-emg-channel`, ... */
  code: string;
  message: string;
  /** Muscle the flag is about, when it is about one. */
  muscle?: string;
  /** `error`: the trial (or that muscle) yields no timing; `warning`: result usable but note it. */
  severity: 'error' | 'warning';
}

/** The expensive part of one trial, cached; all series share `timesS`. */
export interface PreparedTrial {
  trial: TrialSpec;
  /** Sample times of the object's trajectory, s (recording clock), length T. */
  timesS: Float64Array;
  /** Raw measured height of the object (NaN where missing), m, length T. */
  heightM: Float64Array;
  /** RTS-smoothed state, T x 3 row-major: height m, velocity m/s, acceleration m/s^2. */
  smoothedState: Float64Array;
  /** Smoothed covariance, T x 3 x 3 row-major (m^2, m^2/s, ...). */
  smoothedCov: Float64Array;
  /** Causal Kalman-filtered state, T x 3 (same units). */
  filteredState: Float64Array;
  /** Filtered covariance, T x 3 x 3. */
  filteredCov: Float64Array;
  /** Target height per sample, m, length T (constant for a fixed catch height). */
  targetHeightM: Float64Array;
  /** Noise used for reconstruction: process spectral density (m^2/s^5) and measurement variance (m^2). */
  noise: { qIntensity: number; measurementVarM2: number; logLik: number; fitted: boolean };
  /** Motion start, s; null when not found (then the trial yields no timing). */
  releaseS: number | null;
  /** Measured contact (target reached or impact), s; null when never reached. */
  contactS: number | null;
  /** Constant acceleration fitted over release..contact (for `fitted-gravity`), m/s^2 (signed, up positive). */
  fittedAccMps2: number;
  /** Its standard error, m/s^2. */
  fittedAccSdMps2: number;
  /** Motion duration contact - release, s (NaN when either is missing). */
  motionDurationS: number;
  /** Object speed at contact, m/s (NaN when missing). */
  contactSpeedMps: number;
  /** Automatic onsets per muscle (as from shared/emg detectOnset), keyed by muscle name. */
  onsets: Record<string, OnsetResultLike>;
  /** EMG envelope per muscle for views (decimated to <= 4000 samples), with its own time axis, s. */
  envelopes: Record<string, { timesS: Float64Array; values: Float64Array }>;
  flags: TrialFlag[];
}

/** A trial that could not be prepared at all (missing or unreadable file...). */
export interface FailedTrial {
  trial: TrialSpec;
  /** File that failed (relative path as in the study). */
  file: string;
  code: string;
  reason: string;
}

/** One trial x muscle x hypothesis. */
export interface HypothesisEvaluation {
  hypothesis: string;
  /** Information cutoff, s (NaN when no onset). */
  cutoffS: number;
  /** State used at the cutoff: height m, velocity m/s, acceleration used for extrapolation m/s^2. */
  stateHeightM: number;
  stateVelMps: number;
  accUsedMps2: number;
  /** Target height used for the prediction, m. */
  targetHeightM: number;
  /** Predicted arrival at the target, s (NaN when unreachable under the hypothesis). */
  predictedContactS: number;
  /** SD of the predicted arrival (delta method from the state covariance), ms. */
  predictedContactSdMs: number;
  /** Time-to-contact at onset under the hypothesis: predictedContactS - onsetS, ms. */
  ttcMs: number;
  /** predictedContactS - measured contactS, ms (positive = predicted late). */
  predictionErrorMs: number;
  /** Bayesian observer only: weight on the prior (0..1). */
  priorWeight?: number;
}

/** One trial x muscle, with its onset and its hypothesis evaluations. */
export interface TrialMuscleEvaluation {
  trialId: string;
  subject: string;
  condition: string;
  muscle: string;
  releaseS: number | null;
  /** Effective onset (journal applied), s; null when none or invalidated. */
  onsetS: number | null;
  /** Automatic onset before edits, s. */
  automaticOnsetS: number | null;
  onsetEdited: boolean;
  onsetInvalid: boolean;
  contactS: number | null;
  motionDurationS: number;
  excluded: boolean;
  excludeReason?: string;
  /** True when it enters the across-trial statistics (not excluded, onset and contact present, finite ttc). */
  usable: boolean;
  covariates: Record<string, number | string>;
  hypotheses: HypothesisEvaluation[];
}

/** Alias kept for the contract name: one trial's evaluated rows. */
export type TrialResult = TrialMuscleEvaluation;

/** Per subject x condition x hypothesis descriptive statistics of ttc at onset. */
export interface TtcSummary {
  subject: string;
  /** Muscle whose onsets are analysed (each muscle is analysed separately). */
  muscle: string;
  condition: string;
  hypothesis: string;
  n: number;
  ttcMeanMs: number;
  ttcSdMs: number;
  /** Linear regression ttc_ms = intercept + slope * motion duration (s): slope ms/s, intercept ms, r. */
  slopeMsPerS: number;
  interceptMs: number;
  r: number;
}

/**
 * Model comparison: constant time-to-contact threshold model per hypothesis, Gaussian in ttc at onset
 * (threshold and spread fitted by maximum likelihood); `subject` may be `all`, `condition` may be `all`.
 */
export interface ModelComparisonRow {
  subject: string;
  /** Muscle whose onsets are analysed (each muscle is analysed separately). */
  muscle: string;
  condition: string;
  hypothesis: string;
  n: number;
  ttcMeanMs: number;
  ttcSdMs: number;
  /** Maximised log-likelihood of the onset times (ttc in seconds). */
  logLik: number;
  /** Free parameters (2; 3 for the Bayesian observer's fitted prior width). */
  k: number;
  aic: number;
  bic: number;
  /** Posterior model probability with equal priors (from BIC) among the hypotheses of the same group. */
  posterior: number;
  /** logLik minus the best hypothesis' logLik in the group, with a seeded bootstrap 95% CI. */
  dLogLik: number;
  dLogLikLo: number;
  dLogLikHi: number;
  /** Internal gravity for this subject x condition (same in every hypothesis row), m/s^2; NaN when unavailable. */
  internalGMps2: number;
  internalGLoMps2: number;
  internalGHiMps2: number;
}

/** Profile of the threshold-model log-likelihood over internal gravity for one subject x condition. */
export interface InternalGravityProfile {
  subject: string;
  /** Muscle whose onsets are analysed (each muscle is analysed separately). */
  muscle: string;
  condition: string;
  /** Grid of internal gravity magnitudes, m/s^2. */
  gMps2: Float64Array;
  /** Profile log-likelihood at each grid value. */
  logLik: Float64Array;
  /** Maximum-likelihood internal gravity (grid refined by a parabola), m/s^2. */
  bestGMps2: number;
  /** 95% likelihood-ratio interval (logLik >= max - 1.92), m/s^2; at a grid end when open. */
  loMps2: number;
  hiMps2: number;
  n: number;
}

/** Bayesian observer: fitted prior width per subject and effective prior weight per condition. */
export interface PriorWidthFit {
  subject: string;
  /** Muscle whose onsets are analysed (each muscle is analysed separately). */
  muscle: string;
  hypothesis: string;
  /** Grid of prior widths sigma_prior, m/s^2 (log spaced). */
  sigmaMps2: Float64Array;
  logLik: Float64Array;
  bestSigmaMps2: number;
  /** 95% likelihood-ratio interval of sigma_prior, m/s^2. */
  loMps2: number;
  hiMps2: number;
  /** Mean weight on the prior over the subject's usable trials, per condition (0..1). */
  priorWeightByCondition: Record<string, number>;
}

/** How the comparison changes with the visuomotor delay (cutoff = onset - delay). */
export interface DelaySensitivity {
  subject: string;
  /** Muscle whose onsets are analysed (each muscle is analysed separately). */
  muscle: string;
  /** Delays tried, ms. */
  delaysMs: Float64Array;
  /** Hypothesis ids, in settings order. */
  hypotheses: string[];
  /** Posterior probability, delays x hypotheses row-major. */
  posterior: Float64Array;
  /** Maximised log-likelihood, delays x hypotheses row-major. */
  logLik: Float64Array;
}

/** Everything `evaluateStudy` returns. */
export interface StudyEvaluation {
  /** Forecatch version and the stable hash of the canonical settings JSON. */
  version: string;
  settingsHash: string;
  /** Hypothesis ids in order. */
  hypotheses: string[];
  trials: TrialMuscleEvaluation[];
  summaries: TtcSummary[];
  models: ModelComparisonRow[];
  internalGravity: InternalGravityProfile[];
  priorWidth: PriorWidthFit[];
  delaySensitivity: DelaySensitivity[];
  /** Trials that could not be prepared, carried through for reports. */
  failed: FailedTrial[];
  /** Per-trial flags gathered for reports (trial id, flag). */
  flags: { trialId: string; flag: TrialFlag }[];
  /** What the reconstruction used, for the methods text. */
  reconstruction: {
    /** Trials prepared. */
    trials: number;
    /** Median process-noise spectral density over trials (m^2/s^5 for white jerk). */
    qIntensityMedian: number;
    /** Median measurement-noise SD over trials, mm. */
    measurementSdMmMedian: number;
    /** True when the noise was fitted per trial by maximum likelihood. */
    noiseFitted: boolean;
    /** Usable trial x muscle rows entering the statistics, and rows in total. */
    usableRows: number;
    totalRows: number;
    /** Trials excluded by the user (in the study). */
    excludedTrials: number;
  };
}
