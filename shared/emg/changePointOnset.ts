/**
 * Detector 4: statistical change point (approximated generalized likelihood ratio for a variance increase).
 */
import { fitAutoregressive, whiten } from './arWhiten';
import { constantBaselineOutput, type DetectorOutput, type OnsetContext } from './onsetContext';

/**
 * Change-point onset by an approximated generalized likelihood ratio (GLR) test on the whitened, band-passed
 * signal, modelled as zero-mean Gaussian whose variance rises from the baseline value sigma0^2 at the onset.
 * 1. Detection: CUSUM of the log-likelihood ratio for the variance ratio rho,
 *    l(n) = -ln(rho)/2 + (x(n)^2 / sigma0^2)(1 - 1/rho)/2,  g(n) = max(0, g(n-1) + l(n)); alarm when g > h.
 * 2. Estimation: over the `estimationSpanS` before the alarm, the change time j maximises the two-segment
 *    log-likelihood with known baseline variance before j and the maximum-likelihood variance after it:
 *    L(j) = -1/2 sum_{i<j} x_i^2 / sigma0^2 - (N2 / 2)(1 + ln(S_j / N2)), S_j = sum_{i>=j} x_i^2 / sigma0^2 over
 *    the N2 samples up to `postChangeS` after the alarm.
 * No offset is estimated (offsetS is null).
 * @param ctx - conditioned span and indices (settings.changePoint: varianceRatio, threshold, estimationSpanS,
 *   postChangeS; settings.whiteningOrder)
 * @returns detector output in indices of ctx's arrays
 * @see Micera S., Sabatini A.M. & Dario P. (1998) Med Eng Phys 20:211-215 (GLR onset detection); Staude G. &
 *   Wolf W. (1999) (approximated GLR: detection by a fixed-ratio test, change time by maximum likelihood);
 *   Basseville M. & Nikiforov I.V. (1993) Detection of Abrupt Changes, Prentice-Hall (CUSUM and GLR)
 */
export function changePointOnset(ctx: OnsetContext): DetectorOutput {
  const s = ctx.settings.changePoint;
  const label = 'CUSUM log-likelihood ratio';
  if (!(s.varianceRatio > 1)) throw new RangeError(`change point: varianceRatio must be above 1, got ${s.varianceRatio}`);
  if (!(s.threshold > 0)) throw new RangeError(`change point: threshold must be positive, got ${s.threshold}`);
  const coef = fitAutoregressive(ctx.conditioned, ctx.baseFrom, ctx.baseTo, ctx.settings.whiteningOrder);
  const w = whiten(ctx.conditioned, coef);
  let var0 = 0;
  let cnt = 0;
  for (let i = ctx.baseFrom + coef.length; i < ctx.baseTo; i++) if (w[i] === w[i]) { var0 += w[i] * w[i]; cnt++; }
  var0 = cnt > 0 ? var0 / cnt : NaN;
  if (!(var0 > 0)) return constantBaselineOutput(label, 0);
  const rho = s.varianceRatio;
  const c0 = -0.5 * Math.log(rho);
  const c1 = (0.5 * (1 - 1 / rho)) / var0;
  let g = 0;
  let alarm = -1;
  let lastZero = ctx.searchFrom;
  for (let i = ctx.searchFrom; i < ctx.searchTo; i++) {
    const v = w[i];
    if (v !== v) continue;
    g += c0 + c1 * v * v;
    if (g <= 0) {
      g = 0;
      lastZero = i + 1;
    } else if (g > s.threshold) {
      alarm = i;
      break;
    }
  }
  const base = { baselineMean: 0, baselineSd: 0, threshold: s.threshold, statistic: label, constantBaseline: false, offset: -1 };
  if (alarm < 0) return { detection: -1, onset: -1, activeAtStart: false, ...base };
  const a = Math.max(ctx.searchFrom, Math.min(lastZero, alarm - Math.round(s.estimationSpanS * ctx.rateHz)));
  const b = Math.min(w.length, alarm + 1 + Math.round(s.postChangeS * ctx.rateHz));
  // Suffix sums of the normalised energy q = x^2 / sigma0^2 over [a, b) (NaN samples count as their expectation, 1).
  let pre = 0;
  let post = 0;
  let nPost = 0;
  for (let i = a; i < b; i++) {
    const v = w[i];
    post += v === v ? (v * v) / var0 : 1;
    nPost++;
  }
  let best = a;
  let bestLl = -Infinity;
  for (let j = a; j <= alarm; j++) {
    const ll = -0.5 * pre - 0.5 * nPost * (1 + Math.log(post / nPost));
    if (ll > bestLl) {
      bestLl = ll;
      best = j;
    }
    const v = w[j];
    const q = v === v ? (v * v) / var0 : 1;
    pre += q;
    post -= q;
    nPost--;
  }
  return { detection: alarm, onset: best, activeAtStart: best === ctx.searchFrom, ...base };
}
