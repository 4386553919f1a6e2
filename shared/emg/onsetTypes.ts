/**
 * Types of EMG onset detection: methods, settings, search window, quality flags and results.
 */
import type { EmgConditioningSettings } from './emgConditioningSettings';

/** The onset detectors Forecatch offers. */
export type OnsetMethod = 'baseline-threshold' | 'double-threshold' | 'tkeo-threshold' | 'change-point';

/**
 * Quality flags attached to every onset result.
 * - `no-onset`: nothing in the search window met the detector's rule (onsetS is null).
 * - `baseline-too-short`: the baseline is shorter than `minBaselineS` (or has too few finite samples to estimate its spread).
 * - `baseline-too-active`: the baseline is not stationary or is louder than the quietest part of the search
 *   window; its mean and SD probably include muscle activity or artefact.
 * - `onset-at-window-edge`: the onset lies within `edgeMarginS` of either end of the search span.
 * - `active-at-window-start`: the detector's rule already holds at the first search sample; the true onset is
 *   earlier than the window, so onsetS is null.
 * - `clipped`: the raw signal sits at its extreme value for several samples in a row (or reaches
 *   `saturationLevel`) inside the analysed span.
 * - `nan-in-window`: non-finite samples inside the analysed span (bridged for filtering, never counted as activity).
 * - `constant-signal`: the baseline (or the whole span) has zero variance; no threshold can be set.
 * - `window-truncated`: part of the requested window lies outside the recording and was cut off.
 */
export type OnsetFlag =
  | 'no-onset'
  | 'baseline-too-short'
  | 'baseline-too-active'
  | 'onset-at-window-edge'
  | 'active-at-window-start'
  | 'clipped'
  | 'nan-in-window'
  | 'constant-signal'
  | 'window-truncated';

/** Where to search, on the recording clock (seconds). */
export interface OnsetSearchWindow {
  /** Start of the search window, s. */
  fromS: number;
  /** End of the search window, s. */
  toS: number;
  /** Explicit baseline start, s (with baselineToS); default: the first `baselineDurationS` of the search window, after which the onset is searched. */
  baselineFromS?: number;
  /** Explicit baseline end, s. */
  baselineToS?: number;
}

/** Baseline threshold (Hodges & Bui 1996). */
export interface BaselineThresholdSettings {
  /** Threshold = baseline mean + k SD of the envelope. */
  k: number;
  /** The envelope must stay above the threshold this long, s. */
  minDurationS: number;
}

/** Double threshold on the raw (band-passed, whitened) signal (Bonato, D'Alessio & Knaflitz 1998). */
export interface DoubleThresholdSettings {
  /** m: length of the second-threshold window, in pairs of samples. */
  windowPairs: number;
  /** r0: at least this many of the m pairs must exceed the first threshold. */
  minAbovePairs: number;
  /** False-alarm probability of one m-pair test under baseline noise; fixes the first threshold. */
  falseAlarmProbability: number;
}

/** TKEO-conditioned threshold (Li, Zhou & Aruin 2007; Solnik et al. 2010). */
export interface TkeoThresholdSettings {
  /** Threshold = baseline mean + k SD of the smoothed |TKEO|. */
  k: number;
  /** Sustained duration above threshold, s. */
  minDurationS: number;
  /** Low-pass cutoff smoothing |TKEO|, Hz (zero-phase Butterworth order 2). */
  smoothingHz: number;
}

/** Approximated generalized likelihood ratio for a variance increase (Micera et al. 1998; Staude & Wolf 1999). */
export interface ChangePointSettings {
  /** Variance ratio rho after/before the change that the detection statistic is tuned to. */
  varianceRatio: number;
  /** Alarm threshold h on the cumulative log-likelihood ratio. */
  threshold: number;
  /** How far before the alarm the maximum-likelihood change time is looked for, s. */
  estimationSpanS: number;
  /** How far after the alarm the post-change variance is estimated, s. */
  postChangeS: number;
}

/** Everything that decides an onset: method, conditioning, baseline and quality rules, and per-method parameters. */
export interface OnsetSettings {
  method: OnsetMethod;
  /** Conditioning applied to the analysed span before detection. */
  conditioning: EmgConditioningSettings;
  /** Default baseline length (first part of the search window), s. */
  baselineDurationS: number;
  /** Shorter baselines are flagged `baseline-too-short` (and below 20 samples nothing is detected). */
  minBaselineS: number;
  /** Onsets this close to the search window's start or end are flagged `onset-at-window-edge`, s. */
  edgeMarginS: number;
  /** Order of the autoregressive prediction-error filter fitted on the baseline to whiten the signal (double threshold, change point); 0 = none. */
  whiteningOrder: number;
  /**
   * Threshold methods: after detection, walk back along the detection statistic to where it last rose through
   * baseline mean + refineLevelSd x SD (0 = the baseline mean); null = keep the threshold crossing.
   */
  refineLevelSd: number | null;
  /** Raw absolute level at or above which the signal counts as saturated; null = detect runs at the extreme only. */
  saturationLevel: number | null;
  /** Extra signal conditioned on each side of the analysed span so filter transients settle, s. */
  conditioningMarginS: number;
  baselineThreshold: BaselineThresholdSettings;
  doubleThreshold: DoubleThresholdSettings;
  tkeoThreshold: TkeoThresholdSettings;
  changePoint: ChangePointSettings;
}

/** Numbers behind one detection, for review screens and exports. */
export interface OnsetDetail {
  baselineFromS: number;
  baselineToS: number;
  searchFromS: number;
  searchToS: number;
  /** Baseline mean and SD of the detection statistic. */
  baselineMean: number;
  baselineSd: number;
  /** Threshold on the detection statistic (units of that statistic). */
  threshold: number;
  /** What the threshold applies to, e.g. 'envelope', 'smoothed |TKEO|', 'pair energy / baseline variance', 'CUSUM log-likelihood ratio'. */
  statistic: string;
  /** Time the detector's rule first held (before refinement), s; null when it never did. */
  detectionS: number | null;
  /** Number of non-finite raw samples in the analysed span. */
  nanCount: number;
}

/** One detector's answer: times on the recording clock plus flags. */
export interface OnsetResult {
  onsetS: number | null;
  offsetS: number | null;
  flags: OnsetFlag[];
  method: OnsetMethod;
  detail: OnsetDetail;
}
