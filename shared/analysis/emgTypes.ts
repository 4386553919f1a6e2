/**
 * The EMG types the analysis settings and prepared trials refer to, in one place.
 *
 * These mirror contract D (shared/emg). Until that module lands they are declared structurally here;
 * afterwards this file re-exports the real ones, so `shared/analysis/types.ts` never changes.
 */

/** EMG conditioning settings (band-pass, rectification, envelope low-pass); see shared/emg conditionEmg. */
export interface EmgConditioningSettingsLike {
  [key: string]: unknown;
}

/** Onset detector settings; `method` names the published detector. See shared/emg detectOnset. */
export interface OnsetSettingsLike {
  method: 'baseline-threshold' | 'double-threshold' | 'tkeo-threshold' | 'change-point';
  [key: string]: unknown;
}

/** Result of one automatic onset detection. See shared/emg detectOnset. */
export interface OnsetResultLike {
  /** Onset time on the recording clock, s; null when none was found. */
  onsetS: number | null;
  /** Offset time on the recording clock, s; null when none was found. */
  offsetS: number | null;
  /** Quality flags raised by the detector (strings, e.g. 'no-onset', 'saturated'). */
  flags: readonly string[];
  /** Detector name. */
  method: string;
  /** Detector-specific details (threshold, baseline statistics, ...). */
  detail?: unknown;
}

/** One manual edit of an onset; see shared/emg/onsetJournal.ts. */
export interface OnsetEditLike {
  id: string;
  trialId: string;
  muscle: string;
  action: 'accept' | 'move' | 'invalidate' | 'restore';
  /** Onset before the edit, s (recording clock). */
  fromS: number | null;
  /** Onset after the edit, s (recording clock). */
  toS: number | null;
  reason?: string;
  atIso: string;
}

/** The onset edit journal (edits in order; `cursor` = number of edits in effect, for undo/redo). */
export interface OnsetJournalLike {
  edits: readonly OnsetEditLike[];
  cursor: number;
}
