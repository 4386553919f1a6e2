/**
 * What every onset detector receives: the conditioned span around the search window, with index ranges.
 */
import type { OnsetSettings } from './onsetTypes';

/** A conditioned stretch of one channel and the baseline and search spans inside it (indices into the arrays). */
export interface OnsetContext {
  rateHz: number;
  /** Recording-clock time of index 0 of the arrays, s. */
  t0S: number;
  /** Raw samples of the stretch (a view into the channel). */
  raw: Float64Array | Float32Array;
  /** Band-passed (and notched) samples; NaN where the raw sample was not finite. */
  conditioned: Float64Array;
  /** Envelope of the conditioned samples; NaN where the raw sample was not finite. */
  envelope: Float64Array;
  /** Baseline span [baseFrom, baseTo). */
  baseFrom: number;
  baseTo: number;
  /** Search span [searchFrom, searchTo); onsets are looked for only here (runs may extend past searchTo). */
  searchFrom: number;
  searchTo: number;
  settings: OnsetSettings;
}

/** A detector's answer in indices of the context's arrays (-1 = none). */
export interface DetectorOutput {
  /** Index where the detector's rule first held, before any refinement. */
  detection: number;
  /** Onset index after refinement. */
  onset: number;
  offset: number;
  /** The rule already held at the first search sample. */
  activeAtStart: boolean;
  /** The baseline statistic has zero spread: no threshold could be set. */
  constantBaseline: boolean;
  baselineMean: number;
  baselineSd: number;
  threshold: number;
  statistic: string;
}

/**
 * A detector output for a baseline whose spread is zero (nothing can be detected).
 * @param statistic - name of the detection statistic
 * @param mean - baseline mean of the statistic
 * @returns an output with no detection and constantBaseline set
 */
export function constantBaselineOutput(statistic: string, mean: number): DetectorOutput {
  return {
    detection: -1,
    onset: -1,
    offset: -1,
    activeAtStart: false,
    constantBaseline: true,
    baselineMean: mean,
    baselineSd: 0,
    threshold: NaN,
    statistic,
  };
}
