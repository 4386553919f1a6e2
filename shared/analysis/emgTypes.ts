/**
 * The EMG types the analysis settings and prepared trials refer to, in one place (contract D, shared/emg).
 * Where shared/emg exports the real type it is re-exported under the name used here.
 */
import { DEFAULT_EMG_CONDITIONING, type EmgConditioningSettings } from '../emg/emgConditioningSettings';
import { DEFAULT_ONSET_SETTINGS } from '../emg/onsetSettings';
import type { OnsetResult, OnsetSettings } from '../emg/onsetTypes';
import type { OnsetEdit, OnsetJournal } from '../emg/onsetJournal';

/** EMG conditioning settings (band-pass, notch, rectification, envelope); shared/emg. */
export type EmgConditioningSettingsLike = EmgConditioningSettings;

/** Defaults of the conditioning chain (shared/emg DEFAULT_EMG_CONDITIONING). */
export const DEFAULT_EMG_CONDITIONING_SETTINGS: EmgConditioningSettings = DEFAULT_EMG_CONDITIONING as EmgConditioningSettings;

/** Onset detector settings (method, conditioning, baseline and per-method parameters); shared/emg. */
export type OnsetSettingsLike = OnsetSettings;

/** Default onset detector settings (shared/emg DEFAULT_ONSET_SETTINGS). */
export const DEFAULT_ONSET_DETECTION_SETTINGS: OnsetSettings = DEFAULT_ONSET_SETTINGS as OnsetSettings;

/** Result of one automatic onset detection (shared/emg detectOnset). */
export type OnsetResultLike = OnsetResult;

/** One manual edit of an onset (shared/emg/onsetJournal.ts OnsetEdit). */
export type OnsetEditLike = OnsetEdit;

/** The onset edit journal (shared/emg/onsetJournal.ts OnsetJournal: edits in order, cursor for undo/redo). */
export type OnsetJournalLike = OnsetJournal;
