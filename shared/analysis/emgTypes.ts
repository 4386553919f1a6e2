/**
 * The EMG types the analysis settings and prepared trials refer to, in one place (contract D, shared/emg).
 * Where shared/emg exports the real type it is re-exported under the name used here.
 */
import { DEFAULT_EMG_CONDITIONING, type EmgConditioningSettings } from '../emg/emgConditioningSettings';

/** EMG conditioning settings (band-pass, notch, rectification, envelope); shared/emg. */
export type EmgConditioningSettingsLike = EmgConditioningSettings;

/** Defaults of the conditioning chain (shared/emg DEFAULT_EMG_CONDITIONING). */
export const DEFAULT_EMG_CONDITIONING_SETTINGS: EmgConditioningSettings = DEFAULT_EMG_CONDITIONING as EmgConditioningSettings;

/** Onset detector settings; `method` names the published detector. See shared/emg detectOnset. */
export interface OnsetSettingsLike {
  method: 'baseline-threshold' | 'double-threshold' | 'tkeo-threshold' | 'change-point';
  [key: string]: unknown;
}

/** Default onset detector settings (placeholder until shared/emg exports DEFAULT_ONSET_SETTINGS). */
export const DEFAULT_ONSET_DETECTION_SETTINGS: OnsetSettingsLike = { method: 'baseline-threshold' };

/** Result of one automatic onset detection. See shared/emg detectOnset. */
export interface OnsetResultLike {
  /** Onset time on the recording clock, s; null when none was found. */
  onsetS: number | null;
  /** Offset time on the recording clock, s; null when none was found. */
  offsetS: number | null;
  /** Quality flags raised by the detector (e.g. 'no-onset', 'saturated'). */
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
