import { describe, expect, it } from 'vitest';
import { muscleOnset } from '../../shared/analysis/muscleOnset';
import { defaultStudySettings } from '../../shared/analysis/defaultSettings';
import { seededRandom } from '../../shared/analysis/seededRandom';
import { conditionEmg } from '../../shared/emg/conditionEmg';
import { detectOnset } from '../../shared/emg/detectOnset';
import type { SignalChannel } from '../../shared/recording/types';

/**
 * muscleOnset conditions a channel once when the detector's own conditioning span is the whole channel;
 * its onsets must be exactly those of the detector run on its own (shared/emg's detectOnset without
 * preconditioned input). Invented EMG in Forecatch's rail-lab setting: 2 kHz, quiet baseline (sd 4 uV),
 * burst (sd 80 uV) from `burstS`.
 */
function channel(durationS: number, burstS: number, seed: number): SignalChannel {
  const rateHz = 2000;
  const n = Math.round(durationS * rateHz);
  const rng = seededRandom(seed);
  const values = new Float32Array(n);
  for (let i = 0; i < n; i++) values[i] = (i / rateHz >= burstS ? 80 : 4) * rng.normal();
  return { label: 'FCR', units: 'uV', rateHz, startS: 0, values };
}

describe('muscleOnset', () => {
  const settings = defaultStudySettings();
  const cases = [
    { name: 'short channel (detector span = whole channel, conditioned once)', ch: channel(1.6, 0.9, 1), win: { fromS: 0.6, toS: 1.3 } },
    { name: 'long channel (detector conditions its own span)', ch: channel(6, 3.2, 2), win: { fromS: 2.9, toS: 3.6 } },
  ];
  for (const { name, ch, win } of cases) {
    it(`gives exactly the detector's own onset and the whole-channel envelope: ${name}`, () => {
      const got = muscleOnset(ch, 0, settings, win);
      const want = detectOnset(ch.values, ch.rateHz, 0, settings.onset, {
        fromS: win.fromS, toS: win.toS, baselineFromS: Math.max(0, win.fromS - 0.4), baselineToS: win.fromS,
      });
      expect(got.result).toEqual(want);
      expect(want.onsetS).not.toBeNull();
      expect(Math.abs((want.onsetS as number) - (name.startsWith('short') ? 0.9 : 3.2))).toBeLessThan(0.02);
      expect(got.envelope).toEqual(conditionEmg(ch.values, ch.rateHz, settings.conditioning).envelope);
    });
  }
});
