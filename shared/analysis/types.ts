/**
 * The data of a Forecatch timing analysis: settings, per-trial cached work, per-hypothesis evaluations and
 * the study-level statistics the desktop views and the CLI outputs render.
 *
 * Flow: `prepareTrial(trial, recording, settings) -> PreparedTrial` (expensive, cached) then
 * `evaluateStudy(prepared[], settings, journal) -> StudyEvaluation` (cheap, closed form).
 *
 * Conventions: times are seconds on the trial's recording clock (`_s`/`S`) unless a name ends in `Ms`;
 * heights are metres along the lab's up axis (up positive); accelerations are m/s^2 with the sign of the
 * up axis (free fall is about -9.81); `gMps2` values are magnitudes (positive = downward pull).
 */
import type {
  EmgConditioningSettingsLike,
  OnsetJournalLike,
  OnsetResultLike,
  OnsetSettingsLike,
} from './emgTypes';

export type { OnsetJournalLike, OnsetResultLike, OnsetSettingsLike, EmgConditioningSettingsLike };
export * from './studySettings';
export * from './evaluationTypes';
