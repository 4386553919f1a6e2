import type { OnsetJournalLike, OnsetResultLike } from './types';

/** Effective onset of one trial x muscle after the journal's edits (see shared/emg effectiveOnset). */
export interface EffectiveOnset {
  onsetS: number | null;
  edited: boolean;
  invalid: boolean;
  reason?: string;
}

/**
 * Applies the onset journal's edits in effect (the first `cursor` edits) for one trial x muscle on top of
 * the automatic onset: `move` sets the onset, `invalidate` removes it, `restore` returns to the automatic
 * onset, `accept` confirms the current one.
 *
 * LOCAL STAND-IN for shared/emg/onsetJournal.ts effectiveOnset (contract D), with the same semantics;
 * replaced by a re-export when that module lands.
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
  const auto = automatic ? automatic.onsetS : null;
  let onsetS = auto;
  let edited = false;
  let invalid = false;
  let reason: string | undefined;
  const end = Math.min(journal.cursor, journal.edits.length);
  for (let i = 0; i < end; i++) {
    const e = journal.edits[i];
    if (e.trialId !== trialId || e.muscle !== muscle) continue;
    if (e.action === 'move') {
      onsetS = e.toS;
      edited = true;
      invalid = false;
    } else if (e.action === 'invalidate') {
      onsetS = null;
      edited = true;
      invalid = true;
    } else if (e.action === 'restore') {
      onsetS = auto;
      edited = false;
      invalid = false;
    } else if (e.action === 'accept') {
      edited = true;
    }
    reason = e.reason;
  }
  return { onsetS, edited, invalid, reason };
}
