import type { SignalChannel } from '../recording/types';
import { conditionEmg } from '../emg/conditionEmg';
import type { OnsetResultLike, StudySettings } from './types';

/**
 * Onset of one muscle in a search window: conditions the raw channel with the study's EMG conditioning
 * and runs the onset detector.
 *
 * LOCAL STAND-IN DETECTOR until shared/emg detectOnset (contract D) lands: baseline threshold on the
 * envelope (mean + 3 SD of the 0.5 s before the window, sustained 25 ms; Hodges & Bui 1996,
 * Electroencephalogr Clin Neurophysiol 101:511-519).
 *
 * @param channel - raw EMG channel
 * @param offsetS - added to the channel's clock to put it on the kinematics clock, s
 * @param settings - study settings (conditioning, onset)
 * @param window - search window on the kinematics clock, s
 * @returns the onset result and the envelope (for views)
 */
export function muscleOnset(
  channel: SignalChannel,
  offsetS: number,
  settings: StudySettings,
  window: { fromS: number; toS: number },
): { result: OnsetResultLike; envelope: Float64Array; startS: number } {
  const { envelope } = conditionEmg(channel.values, channel.rateHz, settings.conditioning);
  const startS = channel.startS + offsetS;
  const rate = channel.rateHz;
  const idx = (t: number): number => Math.min(envelope.length, Math.max(0, Math.round((t - startS) * rate)));
  const b0 = idx(window.fromS - 0.5);
  const b1 = idx(window.fromS);
  const flags: string[] = [];
  if (b1 - b0 < 10) {
    return { result: { onsetS: null, offsetS: null, flags: ['no-baseline'], method: 'baseline-threshold' }, envelope, startS };
  }
  let m = 0;
  for (let i = b0; i < b1; i++) m += envelope[i];
  m /= b1 - b0;
  let ss = 0;
  for (let i = b0; i < b1; i++) ss += (envelope[i] - m) ** 2;
  const sd = Math.sqrt(ss / (b1 - b0 - 1));
  const k = 3;
  const threshold = m + k * sd;
  const sustain = Math.max(1, Math.round(0.025 * rate));
  const w0 = idx(window.fromS);
  const w1 = idx(window.toS);
  let run = 0;
  let onsetS: number | null = null;
  for (let i = w0; i < w1; i++) {
    if (envelope[i] > threshold) {
      run++;
      if (run >= sustain) {
        onsetS = startS + (i - run + 1) / rate;
        break;
      }
    } else run = 0;
  }
  if (onsetS === null) flags.push('no-onset');
  return {
    result: { onsetS, offsetS: null, flags, method: 'baseline-threshold', detail: { baselineMean: m, baselineSd: sd, k, thresholdValue: threshold } },
    envelope,
    startS,
  };
}
