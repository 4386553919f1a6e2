import type { OnsetJournalLike, StudySettings, TrialSpec } from '../analysis/types';

/** Current schema version of the study file. */
export const STUDY_SCHEMA_VERSION = 2;

/**
 * A Forecatch study file (JSON): the trial list, the settings and the onset edit journal. Recording paths
 * are relative to the study file's folder; recordings are never modified.
 */
export interface StudyFile {
  /** Schema version; older files are migrated on load (see migrateStudy). */
  schemaVersion: typeof STUDY_SCHEMA_VERSION;
  /** Free-text study name. */
  name: string;
  /** Free-text description (e.g. "invented demo data"). */
  description?: string;
  settings: StudySettings;
  trials: TrialSpec[];
  journal: OnsetJournalLike;
  /** Forecatch version that last saved the file. */
  savedWith?: string;
}

/**
 * Serialises a study file as pretty-printed JSON (2-space indent, final newline), with the schema
 * version first.
 *
 * @param study - the study
 * @returns JSON text
 */
export function serializeStudy(study: StudyFile): string {
  const { schemaVersion, name, description, savedWith, settings, trials, journal } = study;
  return JSON.stringify({ schemaVersion, name, description, savedWith, settings, trials, journal }, null, 2) + '\n';
}
