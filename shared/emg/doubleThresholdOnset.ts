/**
 * Detector 2: double threshold on the raw (band-passed, whitened) signal.
 */
import { fitAutoregressive, whiten } from './arWhiten';
import { constantBaselineOutput, type DetectorOutput, type OnsetContext } from './onsetContext';

/** log C(m, j) */
function logChoose(m: number, j: number): number {
  let s = 0;
  for (let i = 1; i <= j; i++) s += Math.log((m - j + i) / i);
  return s;
}

/** P(at least r0 of m independent Bernoulli(p) successes). */
function tailProbability(p: number, m: number, r0: number): number {
  let s = 0;
  for (let j = r0; j <= m; j++) s += Math.exp(logChoose(m, j) + j * Math.log(p) + (m - j) * Math.log1p(-p));
  return s;
}

/**
 * First threshold zeta of the double-threshold detector for a target false-alarm probability: under white
 * Gaussian baseline noise a pair energy z = (x1^2 + x2^2) / sigma^2 is chi-square with 2 degrees of freedom,
 * so P(z > zeta) = p = exp(-zeta / 2), and one m-pair test false-alarms with
 * Pfa = sum_{j = r0..m} C(m, j) p^j (1 - p)^(m - j); p is found by bisection.
 * @param windowPairs - m
 * @param minAbovePairs - r0 (1 <= r0 <= m)
 * @param falseAlarmProbability - target Pfa in (0, 1)
 * @returns zeta (in units of the baseline variance) and the per-pair probability p
 * @throws RangeError for m, r0 or Pfa out of range
 * @see Bonato P., D'Alessio T. & Knaflitz M. (1998) IEEE Trans Biomed Eng 45:287-299
 */
export function doubleThresholdLevels(windowPairs: number, minAbovePairs: number, falseAlarmProbability: number): { zeta: number; pairProbability: number } {
  const m = windowPairs;
  const r0 = minAbovePairs;
  if (!Number.isInteger(m) || !(m >= 1) || !Number.isInteger(r0) || !(r0 >= 1 && r0 <= m)) {
    throw new RangeError(`double threshold: need integers 1 <= r0 <= m, got r0 = ${r0}, m = ${m}`);
  }
  if (!(falseAlarmProbability > 0 && falseAlarmProbability < 1)) {
    throw new RangeError(`double threshold: false-alarm probability must be in (0, 1), got ${falseAlarmProbability}`);
  }
  let lo = -60;
  let hi = 0;
  for (let it = 0; it < 200; it++) {
    const mid = (lo + hi) / 2;
    if (tailProbability(Math.exp(mid), m, r0) > falseAlarmProbability) hi = mid;
    else lo = mid;
  }
  const p = Math.exp((lo + hi) / 2);
  return { zeta: -2 * Math.log(p), pairProbability: p };
}

/**
 * Double-threshold onset: the band-passed signal is whitened by an AR prediction-error filter fitted on the
 * baseline and normalised by the baseline variance; consecutive sample pairs give energies
 * z_k = (x_2k^2 + x_2k+1^2) / sigma^2 (chi-square, 2 degrees of freedom, under baseline noise). The first
 * threshold zeta (set from the false-alarm probability) marks pairs; activity is declared when at least r0 of
 * m successive pairs exceed it, and the onset is the first marked pair of that run. Offset: the last marked pair
 * before the first m-pair window that no longer holds r0 marks.
 * @param ctx - conditioned span and indices (settings.doubleThreshold: windowPairs, minAbovePairs,
 *   falseAlarmProbability; settings.whiteningOrder)
 * @returns detector output in indices of ctx's arrays
 * @see Bonato P., D'Alessio T. & Knaflitz M. (1998) IEEE Trans Biomed Eng 45:287-299
 */
export function doubleThresholdOnset(ctx: OnsetContext): DetectorOutput {
  const s = ctx.settings.doubleThreshold;
  const label = 'pair energy / baseline variance';
  const { zeta } = doubleThresholdLevels(s.windowPairs, s.minAbovePairs, s.falseAlarmProbability);
  const coef = fitAutoregressive(ctx.conditioned, ctx.baseFrom, ctx.baseTo, ctx.settings.whiteningOrder);
  const w = whiten(ctx.conditioned, coef);
  let var0 = 0;
  let cnt = 0;
  for (let i = ctx.baseFrom + coef.length; i < ctx.baseTo; i++) if (w[i] === w[i]) { var0 += w[i] * w[i]; cnt++; }
  var0 = cnt > 0 ? var0 / cnt : NaN;
  if (!(var0 > 0)) return constantBaselineOutput(label, 0);
  const m = s.windowPairs;
  const r0 = s.minAbovePairs;
  const nPairs = Math.floor((w.length - ctx.searchFrom) / 2);
  const candidatePairs = Math.ceil((ctx.searchTo - ctx.searchFrom) / 2);
  // marks[k] = 1 where pair k's energy exceeds zeta (a NaN pair is never marked)
  const marks = new Uint8Array(nPairs);
  for (let k = 0; k < nPairs; k++) {
    const i = ctx.searchFrom + 2 * k;
    const z = (w[i] * w[i] + w[i + 1] * w[i + 1]) / var0;
    marks[k] = z > zeta ? 1 : 0;
  }
  let count = 0;
  for (let k = 0; k < Math.min(m, nPairs); k++) count += marks[k];
  let start = -1;
  for (let k = 0; k + m <= nPairs && k < candidatePairs; k++) {
    if (k > 0) count += marks[k + m - 1] - marks[k - 1];
    if (count >= r0) {
      start = k;
      break;
    }
  }
  const base = { baselineMean: 2, baselineSd: 2, threshold: zeta, statistic: label, constantBaseline: false };
  if (start < 0) return { detection: -1, onset: -1, offset: -1, activeAtStart: false, ...base };
  let first = start;
  while (!marks[first]) first++;
  const onset = ctx.searchFrom + 2 * first;
  // Offset: slide on until a window holds fewer than r0 marks; take the last mark of the window before it.
  let offset = -1;
  const lastPair = Math.min(nPairs, candidatePairs);
  for (let k = start + 1; k + m <= nPairs && k < lastPair; k++) {
    count += marks[k + m - 1] - marks[k - 1];
    if (count < r0) {
      let last = k + m - 2;
      while (last > k - 1 && !marks[last]) last--;
      offset = ctx.searchFrom + 2 * last + 2;
      break;
    }
  }
  return { detection: onset, onset, offset, activeAtStart: start === 0, ...base };
}
