/**
 * Finds and reads the study an `analyze` INPUT names: a study file (.json), a folder holding one (or a
 * trial list), or a trial list CSV.
 */
import { readFile, readdir, stat } from 'node:fs/promises';
import { basename, dirname, join, resolve } from 'node:path';
import { ForecatchError } from '../../shared/errors';
import { parseStudyFile } from '../../shared/study/parseStudyFile';
import { importTrialList } from '../../shared/study/importTrialList';
import { STUDY_SCHEMA_VERSION, type StudyFile } from '../../shared/study/studyFile';
import { defaultStudySettings } from '../../shared/analysis/defaultSettings';

/** A loaded study and the folder its recording paths are relative to. */
export interface LoadedStudy {
  study: StudyFile;
  /** Folder the trial file paths are relative to. */
  baseDir: string;
  /** The file the study came from. */
  sourcePath: string;
  /** 'study' (JSON) or 'trial-list' (CSV with default settings). */
  kind: 'study' | 'trial-list';
}

/** Study file names looked for in a folder, in order. */
export const STUDY_FILE_NAMES = ['study.forecatch.json', 'study.json'];
/** Trial list names looked for in a folder when no study file exists. */
export const TRIAL_LIST_NAMES = ['trials.csv', 'trial_list.csv', 'trial-list.csv'];

/**
 * Loads a study from a study file, a folder or a trial list CSV. Files are only read.
 *
 * @param input - path given on the command line
 * @returns the study and its base folder
 * @throws ForecatchError `IO_ERROR` / `NO_STUDY` when nothing usable is found; ParseError for bad content
 */
export async function loadStudy(input: string): Promise<LoadedStudy> {
  const path = resolve(input);
  const st = await stat(path).catch(() => null);
  if (!st) throw new ForecatchError('IO_ERROR', `${input}: no such file or folder`);
  if (st.isDirectory()) {
    const names = await readdir(path);
    const json = STUDY_FILE_NAMES.find((n) => names.includes(n)) ?? names.find((n) => n.endsWith('.forecatch.json'));
    if (json) return loadStudy(join(path, json));
    const csv = TRIAL_LIST_NAMES.find((n) => names.includes(n));
    if (csv) return loadStudy(join(path, csv));
    throw new ForecatchError('NO_STUDY', `${input}: no study file (${STUDY_FILE_NAMES.join(', ')}) or trial list (${TRIAL_LIST_NAMES.join(', ')}) in this folder`);
  }
  const text = await readFile(path, 'utf8').catch((err: NodeJS.ErrnoException) => {
    throw new ForecatchError('IO_ERROR', `${input}: cannot read: ${err.message}`);
  });
  if (/\.csv$/i.test(path) || /\.tsv$/i.test(path)) {
    const trials = importTrialList(text, basename(path));
    return {
      study: { schemaVersion: STUDY_SCHEMA_VERSION, name: basename(path), settings: defaultStudySettings(), trials, journal: { edits: [], cursor: 0 } },
      baseDir: dirname(path),
      sourcePath: path,
      kind: 'trial-list',
    };
  }
  return { study: parseStudyFile(text, basename(path)), baseDir: dirname(path), sourcePath: path, kind: 'study' };
}
