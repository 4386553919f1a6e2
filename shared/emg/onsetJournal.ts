/**
 * The onset review journal: every person's decision on an automatic onset (accept, move, invalidate,
 * restore) kept as an append-only list with an undo/redo cursor. Pure and immutable: every function returns
 * a new journal and never touches the automatic results, so re-running detection with other settings keeps
 * every edit, and an edited onset keeps showing as edited.
 */
import type { OnsetResult } from './onsetTypes';

/** What a reviewer did to one onset. */
export type OnsetEditAction = 'accept' | 'move' | 'invalidate' | 'restore';

/** One reviewer decision: what changed, from what to what, when, and why. */
export interface OnsetEdit {
  /** Unique id of the edit. */
  id: string;
  trialId: string;
  /** Muscle (channel) label. */
  muscle: string;
  action: OnsetEditAction;
  /** Effective onset before the edit, s on the recording clock (null: none). */
  fromS: number | null;
  /** Onset after the edit, s: the accepted or moved-to value; null for invalidate and restore. */
  toS: number | null;
  /** Why (required for invalidate). */
  reason?: string;
  /** When, ISO 8601. */
  atIso: string;
}

/** Edits in order; the first `cursor` are in effect, the rest can be redone. */
export interface OnsetJournal {
  readonly edits: readonly OnsetEdit[];
  readonly cursor: number;
}

/** The onset to use after review. */
export interface EffectiveOnset {
  onsetS: number | null;
  /** The value differs from what the detector gives now (moved, invalidated, or accepted at another value). */
  edited: boolean;
  /** Marked invalid by a reviewer (onsetS is then null). */
  invalid: boolean;
  /** Reason of the last edit in effect, if it gave one. */
  reason?: string;
  /** A reviewer accepted or set this value. */
  reviewed: boolean;
  /** The detector's onset, unchanged. */
  automaticS: number | null;
  /** The last edit in effect for this onset, if any. */
  lastEdit?: OnsetEdit;
}

const ACTIONS: readonly OnsetEditAction[] = ['accept', 'move', 'invalidate', 'restore'];

/**
 * An empty journal.
 * @returns a journal with no edits and the cursor at 0
 */
export function emptyJournal(): OnsetJournal {
  return { edits: [], cursor: 0 };
}

/**
 * Checks one edit's fields.
 * @param e - edit
 * @returns a description of the first problem (field and what was expected), or null when the edit is valid
 */
export function onsetEditProblem(e: OnsetEdit): string | null {
  if (!e || typeof e !== 'object') return 'an edit object';
  if (typeof e.id !== 'string' || e.id === '') return 'id to be a non-empty string';
  if (typeof e.trialId !== 'string' || e.trialId === '') return 'trialId to be a non-empty string';
  if (typeof e.muscle !== 'string' || e.muscle === '') return 'muscle to be a non-empty string';
  if (!ACTIONS.includes(e.action)) return `action to be one of ${ACTIONS.join(', ')}`;
  const timeOk = (v: unknown): boolean => v === null || (typeof v === 'number' && Number.isFinite(v));
  if (!timeOk(e.fromS)) return 'fromS to be a finite number or null';
  if (!timeOk(e.toS)) return 'toS to be a finite number or null';
  if (e.action === 'move' && e.toS === null) return 'toS (the new onset) for a move';
  if ((e.action === 'invalidate' || e.action === 'restore') && e.toS !== null) return `toS to be null for ${e.action}`;
  if (e.reason !== undefined && typeof e.reason !== 'string') return 'reason to be a string';
  if (e.action === 'invalidate' && !(e.reason && e.reason.trim() !== '')) return 'a reason for invalidate';
  if (typeof e.atIso !== 'string' || Number.isNaN(Date.parse(e.atIso))) return 'atIso to be an ISO 8601 time';
  return null;
}

/**
 * Appends an edit at the cursor: edits after the cursor (undone ones) are dropped, the cursor moves past the new edit.
 * @param journal - current journal (not modified)
 * @param edit - the new edit
 * @returns the new journal
 * @throws RangeError when the edit is malformed (message names the field) or its id is already used
 */
export function applyEdit(journal: OnsetJournal, edit: OnsetEdit): OnsetJournal {
  const problem = onsetEditProblem(edit);
  if (problem) throw new RangeError(`onset journal: expected ${problem}`);
  const kept = journal.edits.slice(0, journal.cursor);
  if (kept.some((e) => e.id === edit.id)) throw new RangeError(`onset journal: edit id ${JSON.stringify(edit.id)} is already used`);
  const edits = [...kept, Object.freeze({ ...edit })];
  return Object.freeze({ edits: Object.freeze(edits), cursor: edits.length });
}

/**
 * Whether {@link undo} would change anything.
 * @param journal - journal
 * @returns true when an edit is in effect
 */
export function canUndo(journal: OnsetJournal): boolean {
  return journal.cursor > 0;
}

/**
 * Whether {@link redo} would change anything.
 * @param journal - journal
 * @returns true when an undone edit can be re-applied
 */
export function canRedo(journal: OnsetJournal): boolean {
  return journal.cursor < journal.edits.length;
}

/**
 * Takes back the last edit in effect (it stays in the journal, redoable).
 * @param journal - current journal
 * @returns the journal with the cursor one step back (the same object when nothing can be undone)
 */
export function undo(journal: OnsetJournal): OnsetJournal {
  return canUndo(journal) ? Object.freeze({ edits: journal.edits, cursor: journal.cursor - 1 }) : journal;
}

/**
 * Re-applies the next undone edit.
 * @param journal - current journal
 * @returns the journal with the cursor one step forward (the same object when nothing can be redone)
 */
export function redo(journal: OnsetJournal): OnsetJournal {
  return canRedo(journal) ? Object.freeze({ edits: journal.edits, cursor: journal.cursor + 1 }) : journal;
}

/**
 * Edits in effect for one onset, oldest first (for a history view).
 * @param journal - journal
 * @param trialId - trial
 * @param muscle - muscle label
 * @returns the edits before the cursor for that trial and muscle
 */
export function editsFor(journal: OnsetJournal, trialId: string, muscle: string): OnsetEdit[] {
  return journal.edits.slice(0, journal.cursor).filter((e) => e.trialId === trialId && e.muscle === muscle);
}

/**
 * The onset to use after review: the detector's onset with the edits in effect replayed on top.
 * accept pins the accepted value; move sets a new value; invalidate marks it invalid (onset null);
 * restore returns to the detector's current value. Because accept and move pin values, re-running the detector
 * with other settings leaves reviewed onsets where the reviewer put them, and `edited` shows whether they now
 * differ from the detector.
 * @param automatic - the detector's current result for this trial and muscle (not modified)
 * @param journal - journal
 * @param trialId - trial
 * @param muscle - muscle label
 * @returns the effective onset and its review state
 */
export function effectiveOnset(automatic: OnsetResult, journal: OnsetJournal, trialId: string, muscle: string): EffectiveOnset {
  const auto = automatic.onsetS;
  let onsetS = auto;
  let invalid = false;
  let reviewed = false;
  let reason: string | undefined;
  let lastEdit: OnsetEdit | undefined;
  for (const e of editsFor(journal, trialId, muscle)) {
    lastEdit = e;
    reason = e.reason;
    if (e.action === 'accept' || e.action === 'move') {
      onsetS = e.toS;
      invalid = false;
      reviewed = true;
    } else if (e.action === 'invalidate') {
      onsetS = null;
      invalid = true;
      reviewed = true;
    } else {
      onsetS = auto;
      invalid = false;
      reviewed = false;
    }
  }
  const out: EffectiveOnset = { onsetS, edited: invalid || onsetS !== auto, invalid, reviewed, automaticS: auto };
  if (reason !== undefined) out.reason = reason;
  if (lastEdit) out.lastEdit = lastEdit;
  return out;
}
