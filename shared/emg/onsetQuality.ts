/**
 * Data-quality checks run on the analysed span before any detector: non-finite samples, clipping,
 * constant signal and an active baseline.
 */

/** Counts of what the quality checks found. */
export interface SpanQuality {
  nanCount: number;
  clipped: boolean;
  constant: boolean;
}

/**
 * Non-finite samples, saturation (a run of at least 3 equal samples at the span's maximum or minimum, or a
 * sample at or beyond saturationLevel) and zero variance over raw[from..to).
 * @param raw - raw samples
 * @param from - span start (inclusive)
 * @param to - span end (exclusive)
 * @param saturationLevel - absolute level counted as saturated, or null
 * @returns what was found
 */
export function checkSpanQuality(raw: Float64Array | Float32Array, from: number, to: number, saturationLevel: number | null): SpanQuality {
  // Common case first, without data-dependent branches: Math.min/max carry any NaN or infinity into lo/hi, and
  // with no two equal neighbours there is no run of 3 equal samples. Otherwise the full pass below decides.
  if (!(to > from)) return fullSpanQuality(raw, from, to, saturationLevel);
  let before = raw[from];
  let lo = before;
  let hi = before;
  let equalPairs = 0;
  for (let i = from + 1; i < to; i++) {
    const v = raw[i];
    equalPairs += v === before ? 1 : 0;
    before = v;
    lo = Math.min(lo, v);
    hi = Math.max(hi, v);
  }
  if (equalPairs === 0 && lo - lo === 0 && hi - hi === 0) {
    return { nanCount: 0, clipped: saturatedSpan(raw, from, to, saturationLevel), constant: !(hi > lo) };
  }
  return fullSpanQuality(raw, from, to, saturationLevel);
}

/** Whether any sample of raw[from..to) is at or beyond the saturation level (false when it is null). */
function saturatedSpan(raw: Float64Array | Float32Array, from: number, to: number, saturationLevel: number | null): boolean {
  let saturated = false;
  if (saturationLevel !== null) {
    for (let i = from; i < to && !saturated; i++) saturated = Math.abs(raw[i]) >= saturationLevel;
  }
  return saturated;
}

/** checkSpanQuality's full pass: NaN count, extremes, runs of equal samples. */
function fullSpanQuality(raw: Float64Array | Float32Array, from: number, to: number, saturationLevel: number | null): SpanQuality {
  let nanCount = 0;
  let lo = Infinity;
  let hi = -Infinity;
  // Extreme values among runs of >= 3 equal samples, compared with the span's extremes at the end (one pass;
  // a repeated value cannot change the extremes, so only a new value is compared with them).
  let runLo = Infinity;
  let runHi = -Infinity;
  let run = 0;
  let prev = NaN;
  for (let i = from; i < to; i++) {
    const v = raw[i];
    if (v === prev) {
      run++;
      if (run >= 3) {
        if (v > runHi) runHi = v;
        if (v < runLo) runLo = v;
      }
    } else if (v - v === 0) {
      run = 1;
      prev = v;
      if (v < lo) lo = v;
      if (v > hi) hi = v;
    } else {
      nanCount++;
      run = 0;
      prev = NaN;
    }
  }
  const saturated = saturatedSpan(raw, from, to, saturationLevel);
  const constant = !(hi > lo);
  const clipped = saturated || (!constant && (runHi === hi || runLo === lo));
  return { nanCount, clipped, constant };
}

function blockRms(x: Float64Array, from: number, to: number): number {
  // Common case, without a branch per sample: the plain sum of squares is NaN exactly when a sample is NaN (the
  // same additions in the same order as below otherwise).
  let all = 0;
  for (let i = from; i < to; i++) all += x[i] * x[i];
  if (all === all) return to > from ? Math.sqrt(all / (to - from)) : NaN;
  let s = 0;
  let n = 0;
  for (let i = from; i < to; i++) {
    const v = x[i];
    if (v === v) {
      s += v * v;
      n++;
    }
  }
  return n > 0 ? Math.sqrt(s / n) : NaN;
}

/**
 * Whether the baseline probably holds activity: its four quarters differ in RMS by more than a factor 2
 * (not stationary), or its RMS is more than twice that of the quietest 50 ms block of the search span.
 * @param conditioned - band-passed samples
 * @param baseFrom - baseline start index
 * @param baseTo - baseline end index (exclusive)
 * @param searchFrom - search start index
 * @param searchTo - search end index (exclusive)
 * @param rateHz - sample rate, Hz
 * @returns true when the baseline looks active
 */
export function baselineLooksActive(conditioned: Float64Array, baseFrom: number, baseTo: number, searchFrom: number, searchTo: number, rateHz: number): boolean {
  const len = baseTo - baseFrom;
  if (len < 8) return false;
  let qMin = Infinity;
  let qMax = 0;
  for (let q = 0; q < 4; q++) {
    const r = blockRms(conditioned, baseFrom + Math.floor((q * len) / 4), baseFrom + Math.floor(((q + 1) * len) / 4));
    if (r < qMin) qMin = r;
    if (r > qMax) qMax = r;
  }
  if (qMax > 2 * qMin) return true;
  const block = Math.max(4, Math.round(0.05 * rateHz));
  let quietest = Infinity;
  for (let b = searchFrom; b + block <= searchTo; b += block) {
    const r = blockRms(conditioned, b, b + block);
    if (r < quietest) quietest = r;
  }
  const baseRms = blockRms(conditioned, baseFrom, baseTo);
  return Number.isFinite(quietest) && baseRms > 2 * quietest;
}
