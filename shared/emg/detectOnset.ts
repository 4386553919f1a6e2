/**
 * The one entry point of onset detection: resolves the search and baseline windows on the recording clock,
 * conditions the span, runs the quality checks and the chosen detector, and reports times and flags.
 */
import { baselineThresholdOnset } from './baselineThresholdOnset';
import { changePointOnset } from './changePointOnset';
import { conditionEmg, type ConditionedEmg } from './conditionEmg';
import { doubleThresholdOnset } from './doubleThresholdOnset';
import type { DetectorOutput, OnsetContext } from './onsetContext';
import { baselineLooksActive, checkSpanQuality } from './onsetQuality';
import { validateOnsetSettings } from './onsetSettings';
import type { OnsetFlag, OnsetResult, OnsetSearchWindow, OnsetSettings } from './onsetTypes';
import { tkeoThresholdOnset } from './tkeoThresholdOnset';

const MIN_BASELINE_SAMPLES = 20;

// The conditioned span lives only during one call (results hold times, not samples): one pair of scratch
// buffers, grown as needed, serves every call, so batch work does not claim fresh memory per channel.
let scratchConditioned = new Float64Array(0);
let scratchEnvelope = new Float64Array(0);

function spanBuffers(n: number): { conditioned: Float64Array; envelope: Float64Array } {
  if (scratchConditioned.length < n) {
    scratchConditioned = new Float64Array(n);
    scratchEnvelope = new Float64Array(n);
  }
  return { conditioned: scratchConditioned.subarray(0, n), envelope: scratchEnvelope.subarray(0, n) };
}

function detector(ctx: OnsetContext): DetectorOutput {
  switch (ctx.settings.method) {
    case 'baseline-threshold':
      return baselineThresholdOnset(ctx);
    case 'double-threshold':
      return doubleThresholdOnset(ctx);
    case 'tkeo-threshold':
      return tkeoThresholdOnset(ctx);
    case 'change-point':
      return changePointOnset(ctx);
  }
}

/**
 * Detects the onset (and offset where the method defines one) of muscle activity in one EMG channel.
 * The baseline is `searchWindow.baselineFromS..baselineToS` when given, otherwise the first
 * `settings.baselineDurationS` of the search window, and the onset is searched after it. Only the span
 * around the windows (plus `conditioningMarginS` each side) is conditioned. Samples are taken as evenly spaced
 * (sample i at startS + i / rateHz); a channel with explicit `timesS` (discontinuous EDF+) must be split into
 * its continuous records first.
 * @param signal - raw samples of the channel
 * @param rateHz - sample rate, Hz
 * @param startS - recording-clock time of sample 0, s
 * @param settings - method, conditioning and parameters (see DEFAULT_ONSET_SETTINGS)
 * @param searchWindow - search span and optional baseline on the recording clock, s
 * @param preconditioned - optional output of conditionEmg(signal, rateHz, settings.conditioning) over the whole
 *   signal: when given, its samples are used instead of conditioning the span again (for batch work on whole
 *   channels; near the ends of the signal filter edge effects then differ slightly from span conditioning)
 * @returns onset/offset in s on the recording clock (null when none), quality flags and detection details
 * @throws RangeError for an empty signal, preconditioned arrays of another length, a bad sample rate or start time, a window that is empty or lies
 *   wholly outside the recording (message names window and recording span), a sample rate too low for the
 *   conditioning band, or settings out of range; TypeError for an unknown method
 * @see the detector functions for references: baselineThresholdOnset (Hodges & Bui 1996), doubleThresholdOnset
 *   (Bonato et al. 1998), tkeoThresholdOnset (Li et al. 2007; Solnik et al. 2010), changePointOnset (Micera et al.
 *   1998; Staude & Wolf 1999)
 */
export function detectOnset(
  signal: Float64Array | Float32Array,
  rateHz: number,
  startS: number,
  settings: OnsetSettings,
  searchWindow: OnsetSearchWindow,
  preconditioned?: ConditionedEmg,
): OnsetResult {
  const n = signal.length;
  if (n === 0) throw new RangeError('detectOnset: the signal is empty');
  if (preconditioned && (preconditioned.conditioned.length !== n || preconditioned.envelope.length !== n)) {
    throw new RangeError(`detectOnset: preconditioned arrays have ${preconditioned.conditioned.length} samples, the signal has ${n}`);
  }
  if (!(rateHz > 0) || !Number.isFinite(rateHz)) throw new RangeError(`detectOnset: sample rate must be a positive number of Hz, got ${rateHz}`);
  if (!Number.isFinite(startS)) throw new RangeError(`detectOnset: start time must be finite, got ${startS}`);
  validateOnsetSettings(settings);
  const { fromS, toS } = searchWindow;
  if (!Number.isFinite(fromS) || !Number.isFinite(toS) || !(toS > fromS)) {
    throw new RangeError(`detectOnset: search window must have finite fromS < toS, got [${fromS}, ${toS}] s`);
  }
  const endS = startS + n / rateHz;
  if (!(toS > startS && fromS < endS)) {
    throw new RangeError(`detectOnset: the search window, [${fromS}, ${toS}] s, lies outside the recording [${startS}, ${endS}] s`);
  }
  const explicitBase = searchWindow.baselineFromS !== undefined || searchWindow.baselineToS !== undefined;
  if (explicitBase) {
    const bf = searchWindow.baselineFromS;
    const bt = searchWindow.baselineToS;
    if (!Number.isFinite(bf) || !Number.isFinite(bt) || !((bt as number) > (bf as number))) {
      throw new RangeError(`detectOnset: baseline needs finite baselineFromS < baselineToS, got [${bf}, ${bt}] s`);
    }
  }
  const flags = new Set<OnsetFlag>();
  if (fromS < startS || toS > endS) flags.add('window-truncated');
  const index = (tS: number): number => Math.min(n, Math.max(0, Math.ceil((tS - startS) * rateHz - 1e-9)));
  let searchFrom = index(fromS);
  const searchTo = index(toS);
  let baseFrom: number;
  let baseTo: number;
  if (explicitBase) {
    baseFrom = index(searchWindow.baselineFromS as number);
    baseTo = index(searchWindow.baselineToS as number);
    if (baseFrom <= searchFrom && searchFrom < baseTo) searchFrom = Math.min(baseTo, searchTo);
  } else {
    baseFrom = searchFrom;
    baseTo = Math.min(searchTo, searchFrom + Math.round(settings.baselineDurationS * rateHz));
    searchFrom = baseTo;
  }
  const segFrom = Math.max(0, Math.min(baseFrom, searchFrom) - Math.round(settings.conditioningMarginS * rateHz));
  const segTo = Math.min(n, Math.max(searchTo, baseTo) + Math.round(settings.conditioningMarginS * rateHz));
  const t0S = startS + segFrom / rateHz;
  const timeOf = (i: number): number => t0S + i / rateHz;
  const result = (onset: number | null, offset: number | null, d: Partial<DetectorOutput>, nanCount: number): OnsetResult => ({
    onsetS: onset,
    offsetS: offset,
    flags: [...flags],
    method: settings.method,
    detail: {
      baselineFromS: startS + baseFrom / rateHz,
      baselineToS: startS + baseTo / rateHz,
      searchFromS: startS + searchFrom / rateHz,
      searchToS: startS + searchTo / rateHz,
      baselineMean: d.baselineMean ?? NaN,
      baselineSd: d.baselineSd ?? NaN,
      threshold: d.threshold ?? NaN,
      statistic: d.statistic ?? '',
      detectionS: d.detection !== undefined && d.detection >= 0 ? timeOf(d.detection) : null,
      nanCount,
    },
  });

  const raw = signal.subarray(segFrom, segTo);
  const lo = Math.min(baseFrom, searchFrom) - segFrom;
  const hi = Math.max(searchTo, baseTo) - segFrom;
  const quality = checkSpanQuality(raw, lo, hi, settings.saturationLevel);
  if (quality.nanCount > 0) flags.add('nan-in-window');
  if (quality.clipped) flags.add('clipped');
  const baseQuality = checkSpanQuality(raw, baseFrom - segFrom, baseTo - segFrom, null);
  const baseFinite = baseTo - baseFrom - baseQuality.nanCount;
  if ((baseTo - baseFrom) / rateHz < settings.minBaselineS || baseFinite < MIN_BASELINE_SAMPLES) flags.add('baseline-too-short');
  if (quality.constant || baseQuality.constant) flags.add('constant-signal');
  if (quality.nanCount === hi - lo || baseFinite < MIN_BASELINE_SAMPLES || quality.constant || baseQuality.constant || searchTo - searchFrom < 2) {
    flags.add('no-onset');
    return result(null, null, {}, quality.nanCount);
  }

  const { conditioned, envelope } = preconditioned
    ? { conditioned: preconditioned.conditioned.subarray(segFrom, segTo), envelope: preconditioned.envelope.subarray(segFrom, segTo) }
    : conditionEmg(raw, rateHz, settings.conditioning, spanBuffers(raw.length));
  const ctx: OnsetContext = {
    rateHz,
    t0S,
    raw,
    conditioned,
    envelope,
    baseFrom: baseFrom - segFrom,
    baseTo: baseTo - segFrom,
    searchFrom: searchFrom - segFrom,
    searchTo: searchTo - segFrom,
    settings,
  };
  if (baselineLooksActive(conditioned, ctx.baseFrom, ctx.baseTo, ctx.searchFrom, ctx.searchTo, rateHz)) flags.add('baseline-too-active');
  const out = detector(ctx);
  if (out.constantBaseline) {
    flags.add('constant-signal');
    flags.add('no-onset');
    return result(null, null, out, quality.nanCount);
  }
  if (out.detection < 0) {
    flags.add('no-onset');
    return result(null, null, out, quality.nanCount);
  }
  if (out.activeAtStart) {
    flags.add('active-at-window-start');
    return result(null, out.offset >= 0 ? timeOf(out.offset) : null, out, quality.nanCount);
  }
  const margin = Math.round(settings.edgeMarginS * rateHz);
  if (out.onset - ctx.searchFrom < margin || ctx.searchTo - 1 - out.onset < margin) flags.add('onset-at-window-edge');
  return result(timeOf(out.onset), out.offset >= 0 ? timeOf(out.offset) : null, out, quality.nanCount);
}
