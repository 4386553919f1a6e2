import type { OnsetJournalLike, OnsetResultLike } from './types';
import { effectiveOnset } from '../emg/onsetJournal';

/** Effective onset of one trial x muscle after the journal's edits (shared/emg effectiveOnset). */
export interface EffectiveOnset {
  onsetS: number | null;
  edited: boolean;
  invalid: boolean;
  reason?: string;
}

/**
 * Applies the onset journal's edits in effect for one trial x muscle on top of the automatic onset, with
 * shared/emg's effectiveOnset; a muscle without an automatic result (channel missing) counts as no onset.
 *
 * @param automatic - the detector's result (undefined when the muscle was not analysed)
 * @param journal - edits and cursor
 * @param trialId - trial id
 * @param muscle - muscle name
 * @returns the effective onset and whether it was edited or invalidated
 */
export function journalOnset(
  automatic: OnsetResultLike | undefined,
  journal: OnsetJournalLike,
  trialId: string,
  muscle: string,
): EffectiveOnset {
  const auto = automatic ?? ({ onsetS: null, offsetS: null, flags: ['no-onset'], method: 'baseline-threshold' } as unknown as OnsetResultLike);
  const e = effectiveOnset(auto, journal, trialId, muscle);
  return { onsetS: e.onsetS, edited: e.edited, invalid: e.invalid, reason: e.reason };
}
