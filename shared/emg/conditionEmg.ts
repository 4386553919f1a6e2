/**
 * The EMG conditioning chain: offset removal, band-pass, optional mains notch, full-wave rectification and
 * linear envelope (or moving RMS), over one channel.
 */
import { butterworthSos } from './butterworthSos';
import { fillGaps } from './fillGaps';
import { filtFiltFrom } from './filtFiltFrom';
import { mainsNotchSos } from './iirNotch';
import { movingRms } from './movingRms';
import { sosFilt } from './sosFilt';
import { sosFiltZi } from './sosFilt';
import { defaultPadLength, sosFiltFilt } from './sosFiltFilt';
import { sosFiltFiltMapped } from './sosFiltFiltMapped';
import { validateConditioning, type EmgConditioningSettings } from './emgConditioningSettings';
import type { Sos } from './zpkToSos';

/** Output of {@link conditionEmg}. NaN where the input was not finite. */
export interface ConditionedEmg {
  /** Offset-removed, band-passed (and notched) signal, same units as the input. */
  conditioned: Float64Array;
  /** Linear envelope (or moving RMS) of the conditioned signal, same units. */
  envelope: Float64Array;
  /** Number of non-finite input samples (bridged by interpolation for filtering, NaN again in the outputs). */
  nanCount: number;
}

/** The filters a settings object designs at a given sample rate (design errors surface here). */
export interface ConditioningFilters {
  bandPass: Sos | null;
  notch: Sos | null;
  envelope: Sos | null;
  /** Minimum signal length (samples) the zero-phase filters need. */
  minSamples: number;
}

/**
 * Designs the filters of a conditioning chain for one sample rate.
 * @param rateHz - sample rate, Hz
 * @param settings - conditioning settings
 * @returns the sections of each enabled filter
 * @throws RangeError when a cutoff is at or above the Nyquist frequency (names cutoff, Nyquist and sample rate) or a setting is out of range
 */
export function designConditioningFilters(rateHz: number, settings: EmgConditioningSettings): ConditioningFilters {
  validateConditioning(settings);
  if (!(rateHz > 0) || !Number.isFinite(rateHz)) throw new RangeError(`conditionEmg: sample rate must be a positive number of Hz, got ${rateHz}`);
  const passes = settings.zeroPhase && settings.correctCutoffForPasses ? 2 : 1;
  const bp = settings.bandPass;
  const bandPass = bp.enabled
    ? butterworthSos(bp.order, [bp.lowHz, bp.highHz], rateHz, 'bandpass', { correctForPasses: passes })
    : null;
  const notch = settings.notch.enabled ? mainsNotchSos(settings.notch.mainsHz, settings.notch.harmonics, settings.notch.q, rateHz) : null;
  const env = settings.envelope;
  const envelope = env.kind === 'low-pass' ? butterworthSos(env.order, env.lowPassHz, rateHz, 'lowpass', { correctForPasses: passes }) : null;
  let minSamples = 3;
  if (settings.zeroPhase) {
    for (const f of [bandPass, notch, envelope]) if (f) minSamples = Math.max(minSamples, defaultPadLength(f) + 1);
  }
  return { bandPass, notch, envelope, minSamples };
}

/** Sum of the samples in four interleaved partial sums (not finite when any sample is not). */
function finiteSum(x: Float64Array | Float32Array): number {
  const n = x.length;
  let s0 = 0, s1 = 0, s2 = 0, s3 = 0;
  let i = 0;
  for (; i + 3 < n; i += 4) {
    s0 += x[i];
    s1 += x[i + 1];
    s2 += x[i + 2];
    s3 += x[i + 3];
  }
  for (; i < n; i++) s0 += x[i];
  return s0 + s1 + (s2 + s3);
}

function applyFilter(sos: Sos, y: Float64Array, zeroPhase: boolean): void {
  if (zeroPhase) sosFiltFilt(sos, y, { out: y });
  else sosFilt(sos, y, sosFiltZi(sos).map((v) => v * y[0]), y);
}

/**
 * Conditions one EMG channel: offset removal, band-pass, optional notch (all zero-phase by default),
 * full-wave rectification and envelope. Non-finite samples are bridged by linear interpolation for the
 * filters and set back to NaN in both outputs.
 * @param signal - raw samples (any units)
 * @param rateHz - sample rate, Hz
 * @param settings - conditioning settings (see DEFAULT_EMG_CONDITIONING)
 * @param out - optional output buffers of the signal's length, reused across calls in batch work
 * @returns conditioned signal, envelope and the count of non-finite input samples
 * @throws RangeError for an empty signal, a signal without a finite sample, a signal shorter than the
 *   filters' padding, a sample rate too low for the band (message names the numbers), or out buffers of another length
 * @see Hermens H.J. et al. (2000) J Electromyogr Kinesiol 10:361-374 (SENIAM); Winter D.A. (2009) p. 69
 */
export function conditionEmg(
  signal: Float64Array | Float32Array,
  rateHz: number,
  settings: EmgConditioningSettings,
  out?: { conditioned: Float64Array; envelope: Float64Array },
): ConditionedEmg {
  const filters = designConditioningFilters(rateHz, settings);
  const n = signal.length;
  if (n === 0) throw new RangeError('conditionEmg: the signal is empty');
  if (n < filters.minSamples) {
    throw new RangeError(`conditionEmg: the signal has ${n} samples; the zero-phase filters need at least ${filters.minSamples}`);
  }
  if (out && (out.conditioned.length !== n || out.envelope.length !== n || out.conditioned === out.envelope)) {
    throw new RangeError(`conditionEmg: out buffers must be two distinct arrays of ${n} samples`);
  }
  const conditioned = out ? out.conditioned : new Float64Array(n);
  // One read of the input: the sum (for the offset) is finite only when every sample is. Four partial sums
  // keep the additions independent of each other (the mean may differ from a sequential sum in the last bit).
  let sum = finiteSum(signal);
  const finite = sum - sum === 0;
  const mean = finite && settings.removeOffset ? sum / n : 0;
  // Zero-phase band-pass of a finite Float64Array: copy and offset removal in the filter's one loading loop (the
  // padding is taken from signal - mean directly); the same arithmetic as removing the offset in place and filtering.
  const direct =
    finite && filters.bandPass !== null && settings.zeroPhase && signal instanceof Float64Array && (signal === conditioned || signal.buffer !== conditioned.buffer);
  if (direct) filtFiltFrom(filters.bandPass as Sos, signal as Float64Array, mean, conditioned, defaultPadLength(filters.bandPass as Sos));
  else if (finite && settings.removeOffset) {
    // Copy and offset removal in one pass.
    for (let i = 0; i < n; i++) conditioned[i] = signal[i] - mean;
  } else conditioned.set(signal);
  const mask = new Uint8Array(finite ? 0 : n);
  const nanCount = finite ? 0 : fillGaps(conditioned, mask);
  if (nanCount === n) throw new RangeError(`conditionEmg: none of the ${n} samples is finite`);
  if (!finite && settings.removeOffset) {
    sum = finiteSum(conditioned);
    const mean = sum / n;
    for (let i = 0; i < n; i++) conditioned[i] -= mean;
  }
  if (filters.bandPass && !direct) applyFilter(filters.bandPass, conditioned, settings.zeroPhase);
  if (filters.notch) applyFilter(filters.notch, conditioned, settings.zeroPhase);
  let envelope: Float64Array;
  if (filters.envelope) {
    envelope = out ? out.envelope : new Float64Array(n);
    // Zero-phase: rectification happens as the envelope filter's forward pass reads (when that path applies).
    if (!(settings.zeroPhase && sosFiltFiltMapped(filters.envelope, conditioned, envelope, 'abs'))) {
      for (let i = 0; i < n; i++) envelope[i] = Math.abs(conditioned[i]);
      applyFilter(filters.envelope, envelope, settings.zeroPhase);
    }
  } else {
    envelope = movingRms(conditioned, 2 * Math.max(1, Math.round((settings.envelope.rmsWindowS * rateHz) / 2)) + 1, out?.envelope);
  }
  if (nanCount > 0) {
    for (let i = 0; i < n; i++) {
      if (mask[i]) {
        conditioned[i] = NaN;
        envelope[i] = NaN;
      }
    }
  }
  return { conditioned, envelope, nanCount };
}
