/**
 * Default onset settings and their validation.
 */
import { DEFAULT_EMG_CONDITIONING, validateConditioning } from './emgConditioningSettings';
import type { OnsetMethod, OnsetSettings } from './onsetTypes';

/** The detectors, in the order they are offered. */
export const ONSET_METHODS: readonly OnsetMethod[] = Object.freeze(['baseline-threshold', 'double-threshold', 'tkeo-threshold', 'change-point']);

/**
 * Default onset settings. Method and per-method parameters were chosen on Forecatch's seeded synthetic
 * benchmark (bench/suites/emgAccuracy.ts, invented rail-lab EMG), not on recordings of people; every
 * field can be changed and is written into the methods text.
 */
export const DEFAULT_ONSET_SETTINGS: Readonly<OnsetSettings> = Object.freeze({
  method: 'tkeo-threshold' as OnsetMethod,
  conditioning: DEFAULT_EMG_CONDITIONING,
  baselineDurationS: 0.3,
  minBaselineS: 0.2,
  edgeMarginS: 0.01,
  whiteningOrder: 8,
  refineLevelSd: 0.5,
  saturationLevel: null,
  conditioningMarginS: 0.5,
  baselineThreshold: Object.freeze({ k: 3, minDurationS: 0.1 }),
  doubleThreshold: Object.freeze({ windowPairs: 20, minAbovePairs: 10, falseAlarmProbability: 1e-7 }),
  tkeoThreshold: Object.freeze({ k: 6, minDurationS: 0.025, smoothingHz: 25 }),
  changePoint: Object.freeze({ varianceRatio: 4, threshold: 25, estimationSpanS: 0.2, postChangeS: 0.05 }),
});

/**
 * Checks every field of onset settings.
 * @param s - settings
 * @throws TypeError for a missing part or unknown method, RangeError for a value out of range (names field and value)
 */
export function validateOnsetSettings(s: OnsetSettings): void {
  if (!s || typeof s !== 'object') throw new TypeError('onset settings must be an object');
  if (!ONSET_METHODS.includes(s.method)) throw new TypeError(`onset settings: unknown method ${JSON.stringify(s.method)}; expected one of ${ONSET_METHODS.join(', ')}`);
  if (!s.baselineThreshold || !s.doubleThreshold || !s.tkeoThreshold || !s.changePoint) {
    throw new TypeError('onset settings: baselineThreshold, doubleThreshold, tkeoThreshold and changePoint must all be present');
  }
  validateConditioning(s.conditioning);
  const need = (ok: boolean, what: string, v: unknown): void => {
    if (!ok) throw new RangeError(`onset settings: ${what}, got ${JSON.stringify(v)}`);
  };
  need(s.baselineDurationS > 0, 'baselineDurationS must be positive', s.baselineDurationS);
  need(s.minBaselineS >= 0, 'minBaselineS must be non-negative', s.minBaselineS);
  need(s.edgeMarginS >= 0, 'edgeMarginS must be non-negative', s.edgeMarginS);
  need(Number.isInteger(s.whiteningOrder) && s.whiteningOrder >= 0 && s.whiteningOrder <= 64, 'whiteningOrder must be an integer from 0 to 64', s.whiteningOrder);
  need(s.refineLevelSd === null || s.refineLevelSd >= 0, 'refineLevelSd must be null or non-negative', s.refineLevelSd);
  need(s.saturationLevel === null || s.saturationLevel > 0, 'saturationLevel must be null or positive', s.saturationLevel);
  need(s.conditioningMarginS >= 0, 'conditioningMarginS must be non-negative', s.conditioningMarginS);
  need(s.baselineThreshold.k >= 0, 'baselineThreshold.k must be non-negative', s.baselineThreshold.k);
  need(s.baselineThreshold.minDurationS >= 0, 'baselineThreshold.minDurationS must be non-negative', s.baselineThreshold.minDurationS);
  need(s.tkeoThreshold.k >= 0, 'tkeoThreshold.k must be non-negative', s.tkeoThreshold.k);
  need(s.tkeoThreshold.minDurationS >= 0, 'tkeoThreshold.minDurationS must be non-negative', s.tkeoThreshold.minDurationS);
  need(s.tkeoThreshold.smoothingHz > 0, 'tkeoThreshold.smoothingHz must be positive', s.tkeoThreshold.smoothingHz);
  const d = s.doubleThreshold;
  need(Number.isInteger(d.windowPairs) && d.windowPairs >= 1, 'doubleThreshold.windowPairs must be a positive integer', d.windowPairs);
  need(Number.isInteger(d.minAbovePairs) && d.minAbovePairs >= 1 && d.minAbovePairs <= d.windowPairs, 'doubleThreshold.minAbovePairs must be an integer from 1 to windowPairs', d.minAbovePairs);
  need(d.falseAlarmProbability > 0 && d.falseAlarmProbability < 1, 'doubleThreshold.falseAlarmProbability must be in (0, 1)', d.falseAlarmProbability);
  const c = s.changePoint;
  need(c.varianceRatio > 1, 'changePoint.varianceRatio must be above 1', c.varianceRatio);
  need(c.threshold > 0, 'changePoint.threshold must be positive', c.threshold);
  need(c.estimationSpanS > 0, 'changePoint.estimationSpanS must be positive', c.estimationSpanS);
  need(c.postChangeS > 0, 'changePoint.postChangeS must be positive', c.postChangeS);
}
