/**
 * Detector 3: threshold on the Teager-Kaiser-energy-conditioned signal.
 */
import { butterworthSos } from './butterworthSos';
import { fillGaps } from './fillGaps';
import type { DetectorOutput, OnsetContext } from './onsetContext';
import { sosFiltFilt } from './sosFiltFilt';
import { sosFiltFiltMapped } from './sosFiltFiltMapped';
import { thresholdOnStatistic } from './thresholdOnStatistic';
import { rectify } from './rectify';
import { tkeo } from './tkeo';

/**
 * Smoothed |TKEO| of the conditioned signal: psi[x(n)] = x(n)^2 - x(n+1) x(n-1), full-wave rectified,
 * zero-phase Butterworth low-pass (order 2, corrected for two passes); NaN where the raw signal was not finite.
 * @param conditioned - band-passed samples (NaN allowed)
 * @param rateHz - sample rate, Hz
 * @param smoothingHz - low-pass cutoff, Hz
 * @param out - optional output buffer of the input's length (must not be the input)
 * @returns the statistic
 * @throws RangeError when smoothingHz is not below the Nyquist frequency
 */
export function smoothedTkeo(conditioned: Float64Array, rateHz: number, smoothingHz: number, out?: Float64Array): Float64Array {
  const n = conditioned.length;
  if (n < 3) throw new RangeError(`smoothedTkeo: needs at least 3 samples, got ${n}`);
  if (out && (out.length !== n || out.buffer === conditioned.buffer)) {
    throw new RangeError(`smoothedTkeo: out must be a separate buffer of ${n} samples`);
  }
  const lp = butterworthSos(2, smoothingHz, rateHz, 'lowpass', { correctForPasses: 2 });
  let psi: Float64Array = out ?? new Float64Array(n);
  // |psi| computed as the smoothing filter's forward pass reads it (no separate pass); false when a value
  // is not finite or the signal is too short for that path.
  if (conditioned[0] - conditioned[0] === 0 && conditioned[n - 1] - conditioned[n - 1] === 0 && sosFiltFiltMapped(lp, conditioned, psi, 'tkeo-abs')) {
    return psi;
  }
  // |psi[x(n)]| = |x(n)^2 - x(n+1) x(n-1)| in one pass, noting whether any value was not finite.
  let allFinite = true;
  let a = conditioned[0];
  let b = conditioned[1];
  for (let i = 1; i < n - 1; i++) {
    const c = conditioned[i + 1];
    const v = Math.abs(b * b - c * a);
    psi[i] = v;
    if (!(v < Infinity)) allFinite = false;
    a = b;
    b = c;
  }
  psi[0] = psi[1];
  psi[n - 1] = psi[n - 2];
  if (allFinite && conditioned[0] - conditioned[0] === 0 && conditioned[n - 1] - conditioned[n - 1] === 0) {
    return sosFiltFilt(lp, psi, { out: psi });
  }
  // Non-finite samples: bridge them for the operator and the filter, then mark them NaN again.
  const filled = new Float64Array(conditioned);
  const mask = new Uint8Array(n);
  fillGaps(filled, mask);
  psi = rectify(tkeo(filled, psi), psi);
  sosFiltFilt(lp, psi, { out: psi });
  for (let i = 0; i < n; i++) if (mask[i]) psi[i] = NaN;
  return psi;
}

let scratch = new Float64Array(0);

/**
 * TKEO-threshold onset: the band-passed signal is conditioned by the Teager-Kaiser energy operator, rectified
 * and low-pass filtered; onset where it exceeds the baseline mean + k SD for `minDurationS` (walked back to
 * baseline mean + refineLevelSd SD when that is set). TKEO raises the onset of action potentials against
 * baseline noise because it weighs both amplitude and instantaneous frequency.
 * @param ctx - conditioned span and indices (settings.tkeoThreshold: k, minDurationS, smoothingHz)
 * @returns detector output in indices of ctx's arrays
 * @see Li X., Zhou P. & Aruin A.S. (2007) Ann Biomed Eng 35:1532-1538; Solnik S. et al. (2010) Eur J Appl Physiol
 */
export function tkeoThresholdOnset(ctx: OnsetContext): DetectorOutput {
  const s = ctx.settings.tkeoThreshold;
  const n = ctx.conditioned.length;
  // The statistic lives only during this call: one scratch buffer, grown as needed, serves every call.
  if (scratch.length < n) scratch = new Float64Array(n);
  const stat = smoothedTkeo(ctx.conditioned, ctx.rateHz, s.smoothingHz, scratch.subarray(0, n));
  return thresholdOnStatistic(ctx, stat, s.k, s.minDurationS, 'smoothed |TKEO|');
}
