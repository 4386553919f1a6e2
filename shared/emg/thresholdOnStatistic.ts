/**
 * The sustained-threshold rule shared by the baseline-threshold and TKEO detectors.
 */
import { constantBaselineOutput, type DetectorOutput, type OnsetContext } from './onsetContext';
import { firstSustainedAbove, firstSustainedBelow, spanStats, walkBackAbove } from './onsetStatistics';

/**
 * Onset = first sample from which stat stays above baseline mean + k SD for minDurationS (optionally
 * walked back to the last crossing of the baseline mean); offset = first later sample from which it stays
 * at or below the threshold for minDurationS.
 * @param ctx - detection context
 * @param stat - detection statistic, same length as ctx arrays
 * @param k - number of baseline SDs above the baseline mean
 * @param minDurationS - sustained duration, s
 * @param label - name of the statistic for the result detail
 * @returns detector output in indices
 */
export function thresholdOnStatistic(ctx: OnsetContext, stat: Float64Array, k: number, minDurationS: number, label: string): DetectorOutput {
  const { mean, sd } = spanStats(stat, ctx.baseFrom, ctx.baseTo);
  if (!(sd > 0)) return constantBaselineOutput(label, mean);
  const thr = mean + k * sd;
  const run = Math.max(1, Math.round(minDurationS * ctx.rateHz));
  const detection = firstSustainedAbove(stat, ctx.searchFrom, ctx.searchTo, stat.length, thr, run);
  let onset = detection;
  let offset = -1;
  if (detection >= 0) {
    const level = ctx.settings.refineLevelSd;
    if (level !== null) onset = walkBackAbove(stat, detection, ctx.searchFrom, mean + level * sd);
    offset = firstSustainedBelow(stat, detection + run, ctx.searchTo, thr, run);
  }
  return {
    detection,
    onset,
    offset,
    activeAtStart: detection === ctx.searchFrom,
    constantBaseline: false,
    baselineMean: mean,
    baselineSd: sd,
    threshold: thr,
    statistic: label,
  };
}
