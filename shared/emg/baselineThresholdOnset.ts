/**
 * Detector 1: envelope above baseline mean + k SD for a minimum duration.
 */
import type { DetectorOutput, OnsetContext } from './onsetContext';
import { thresholdOnStatistic } from './thresholdOnStatistic';

/**
 * Baseline-threshold onset: the linear envelope must exceed the baseline mean + k SD and stay above it for
 * `minDurationS`; with `refineLevelSd` set, the onset is moved back to where that stretch rose through baseline mean + refineLevelSd SD.
 * Offset: first later time the envelope stays at or below the threshold for `minDurationS`.
 * @param ctx - conditioned span and baseline/search indices (settings.baselineThreshold: k, minDurationS)
 * @returns detector output in indices of ctx's arrays
 * @see Hodges P.W. & Bui B.H. (1996) Electroencephalogr Clin Neurophysiol 101:511-519 (threshold k = 1-3 SD,
 *   envelope low-pass and sustained duration compared against visual onsets)
 */
export function baselineThresholdOnset(ctx: OnsetContext): DetectorOutput {
  const s = ctx.settings.baselineThreshold;
  return thresholdOnStatistic(ctx, ctx.envelope, s.k, s.minDurationS, 'envelope');
}
