/**
 * Undoable onset edits: the journal keeps every edit in order and a cursor (edits in effect). A new edit
 * drops the undone ones after the cursor; undo and redo only move the cursor. Pure and immutable.
 */
import type { OnsetJournalLike } from '../../../shared/analysis/types';

type Edit = OnsetJournalLike['edits'][number];

/** The journal with `edit` appended after the cursor (redo history past the cursor is dropped). */
export function appendEdit(journal: OnsetJournalLike, edit: Edit): OnsetJournalLike {
  return { edits: [...journal.edits.slice(0, journal.cursor), edit], cursor: journal.cursor + 1 };
}

/** One edit undone (no change when nothing is in effect). */
export function undoEdit(journal: OnsetJournalLike): OnsetJournalLike {
  return journal.cursor > 0 ? { edits: journal.edits, cursor: journal.cursor - 1 } : journal;
}

/** One undone edit redone (no change when none is undone). */
export function redoEdit(journal: OnsetJournalLike): OnsetJournalLike {
  return journal.cursor < journal.edits.length ? { edits: journal.edits, cursor: journal.cursor + 1 } : journal;
}

let counter = 0;
/** A new edit record with a unique id and the current time. */
export function makeEdit(trialId: string, muscle: string, action: Edit['action'], fromS: number | null, toS: number | null, reason?: string): Edit {
  counter += 1;
  return { id: `e${Date.now().toString(36)}-${counter}`, trialId, muscle, action, fromS, toS, reason, atIso: new Date().toISOString() };
}
