/**
 * New onset edits for the shared review journal (shared/emg/onsetJournal.ts: applyEdit, undo, redo).
 * The renderer only makes the edit records; appending, undoing and redoing are the shared functions, so the
 * window, the study file and the command line keep one set of rules.
 */
import type { OnsetEdit, OnsetEditAction } from '../../../shared/emg/onsetJournal';

/** Reason recorded when a reviewer marks an onset invalid without giving one (the journal requires one). */
export const DEFAULT_INVALID_REASON = 'marked invalid by the reviewer';

let counter = 0;

/**
 * A new edit record with a unique id and the current time, shaped as the shared journal expects: `toS` is
 * dropped (null) for invalidate and restore, and an invalidate without a reason gets
 * {@link DEFAULT_INVALID_REASON}.
 * @param trialId - trial id
 * @param muscle - muscle label
 * @param action - what the reviewer did
 * @param fromS - effective onset before the edit, s on the recording clock (null: none)
 * @param toS - onset after a move or accept, s (ignored for invalidate and restore)
 * @param reason - why (optional except that invalidate always gets one)
 * @returns the edit, ready for shared/emg/onsetJournal applyEdit
 */
export function makeEdit(trialId: string, muscle: string, action: OnsetEditAction, fromS: number | null, toS: number | null, reason?: string): OnsetEdit {
  counter += 1;
  const given = reason?.trim() ? reason : undefined;
  return {
    id: `e${Date.now().toString(36)}-${counter}`,
    trialId,
    muscle,
    action,
    fromS,
    toS: action === 'invalidate' || action === 'restore' ? null : toS,
    reason: action === 'invalidate' ? given ?? DEFAULT_INVALID_REASON : given,
    atIso: new Date().toISOString(),
  };
}
