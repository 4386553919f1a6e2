import type { SignalChannel } from '../recording/types';
import { conditionEmg } from '../emg/conditionEmg';
import { detectOnset } from '../emg/detectOnset';
import type { OnsetResultLike, StudySettings } from './types';

/**
 * Onset of one muscle in a search window with shared/emg's detector (settings.onset), the baseline taken
 * from the 0.4 s before the window (the object still at rest), plus the envelope of the whole channel for
 * views (settings.conditioning).
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
  const result = detectOnset(channel.values, channel.rateHz, startS, settings.onset, {
    fromS: searchWindow.fromS,
    toS: searchWindow.toS,
    baselineFromS,
    baselineToS: searchWindow.fromS,
  });
  const { envelope } = conditionEmg(channel.values, channel.rateHz, settings.conditioning);
  return { result, envelope, startS };
}
