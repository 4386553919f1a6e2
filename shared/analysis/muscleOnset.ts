import type { SignalChannel } from '../recording/types';
import { conditionEmg } from '../emg/conditionEmg';
import { detectOnset } from '../emg/detectOnset';
import type { OnsetResultLike, StudySettings } from './types';

/**
 * Onset of one muscle in a search window with shared/emg's detector (settings.onset), the baseline taken
 * from the 0.4 s before the window (the object still at rest), plus the envelope of the whole channel for
 * views (settings.conditioning).
 *
 * The channel is conditioned once when that gives the detector exactly what it would compute itself: the
 * detector conditions the span baseline .. window end widened by its conditioning margin, so when that span
 * is the whole channel and both use the same conditioning settings, the whole-channel result is handed to
 * it (bit-identical onsets); otherwise the detector conditions its span as usual.
 *
 * @param channel - raw EMG channel
 * @param offsetS - added to the channel's clock to put it on the kinematics clock, s
 * @param settings - study settings (conditioning, onset)
 * @param searchWindow - search window on the kinematics clock, s
 * @returns the onset result (recording clock of the kinematics), the envelope and its start time
 * @throws RangeError from detectOnset when the window lies outside the channel
 */
export function muscleOnset(
  channel: SignalChannel,
  offsetS: number,
  settings: StudySettings,
  searchWindow: { fromS: number; toS: number },
): { result: OnsetResultLike; envelope: Float64Array; startS: number } {
  const startS = channel.startS + offsetS;
  const baselineFromS = Math.max(startS, searchWindow.fromS - 0.4);
  const whole = conditionEmg(channel.values, channel.rateHz, settings.conditioning);
  const reuse = detectorSpanIsWholeChannel(channel, startS, baselineFromS, searchWindow.toS, settings) && sameConditioning(settings);
  const result = detectOnset(channel.values, channel.rateHz, startS, settings.onset, {
    fromS: searchWindow.fromS,
    toS: searchWindow.toS,
    baselineFromS,
    baselineToS: searchWindow.fromS,
  }, reuse ? whole : undefined);
  return { result, envelope: whole.envelope, startS };
}

/** Whether settings.onset.conditioning equals settings.conditioning (same values; compared afresh every call). */
function sameConditioning(settings: StudySettings): boolean {
  return settings.onset.conditioning === settings.conditioning || JSON.stringify(settings.onset.conditioning) === JSON.stringify(settings.conditioning);
}

/**
 * True when detectOnset's conditioning span (from the baseline start to the window end, each widened by
 * settings.onset.conditioningMarginS, clipped to the channel) is certainly the whole channel; mirrors the
 * detector's sample indexing, and answers false when in doubt.
 */
function detectorSpanIsWholeChannel(channel: SignalChannel, startS: number, baselineFromS: number, toS: number, settings: StudySettings): boolean {
  const n = channel.values.length;
  const rateHz = channel.rateHz;
  if (!(rateHz > 0) || !Number.isFinite(startS) || !Number.isFinite(baselineFromS) || !Number.isFinite(toS)) return false;
  const index = (tS: number): number => Math.min(n, Math.max(0, Math.ceil((tS - startS) * rateHz - 1e-9)));
  const marginSamples = Math.round(settings.onset.conditioningMarginS * rateHz);
  if (!(marginSamples >= 0)) return false;
  return index(baselineFromS) <= marginSamples && index(toS) + marginSamples >= n;
}
