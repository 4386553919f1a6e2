/**
 * Results of a Forecatch timing analysis: prepared trials (cached) and evaluations (see types.ts).
 */
import type { OnsetResultLike } from './emgTypes';
import type { TrialSpec } from './studySettings';

/** A problem found while preparing or evaluating a trial; the trial keeps going where it can. */
export interface TrialFlag {
  /**
   * Stable code. Errors: `no-release`, `no-contact`, `no-impact-channel`, `no-onset`, `no-emg-channel`,
   * `emg-error`. Warnings: `many-gaps` (over 20% of object samples missing), `onset-<detector flag>` (e.g.
   * `onset-baseline-too-active`, `onset-clipped`, `onset-onset-at-window-edge`). Trials that cannot be
   * prepared at all are FailedTrial (codes `IO_ERROR`, `PARSE_ERROR`, `no-markers`, `no-object-marker`,
   * `no-target-marker`, `too-few-samples`).
   */
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
