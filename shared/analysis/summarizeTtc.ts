import type { RowGroup } from './groups';
import type { TtcSummary } from './types';

/**
 * Descriptive statistics of ttc at onset in one group for one hypothesis: n, mean and sample SD (ms),
 * and the least-squares line ttc_ms = intercept + slope * duration_s with Pearson's r. A hypothesis that
 * matches the subject's strategy gives a flat, tight relation.
 *
 * @param group - row group
 * @param hypothesis - hypothesis id
 * @param ttcS - ttc per row, s
 * @param durationS - motion duration per row, s
 * @returns the summary (NaN where n is too small)
 */
export function summarizeTtc(group: RowGroup, hypothesis: string, ttcS: Float64Array, durationS: Float64Array): TtcSummary {
  const idx = group.rows;
  const n = idx.length;
  let sx = 0;
  let sy = 0;
  for (let i = 0; i < n; i++) {
    sx += durationS[idx[i]];
    sy += ttcS[idx[i]] * 1000;
  }
  const mx = sx / n;
  const my = sy / n;
  let sxx = 0;
  let syy = 0;
  let sxy = 0;
  for (let i = 0; i < n; i++) {
    const dx = durationS[idx[i]] - mx;
    const dy = ttcS[idx[i]] * 1000 - my;
    sxx += dx * dx;
    syy += dy * dy;
    sxy += dx * dy;
  }
  const slope = sxx > 0 ? sxy / sxx : NaN;
  return {
    subject: group.subject,
    condition: group.condition,
    muscle: group.muscle,
    hypothesis,
    n,
    ttcMeanMs: n > 0 ? my : NaN,
    ttcSdMs: n > 1 ? Math.sqrt(syy / (n - 1)) : NaN,
    slopeMsPerS: slope,
    interceptMs: my - slope * mx,
    r: sxx > 0 && syy > 0 ? sxy / Math.sqrt(sxx * syy) : NaN,
  };
}
