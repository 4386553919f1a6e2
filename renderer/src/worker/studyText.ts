/**
 * Study files as the renderer opens and saves them, through the shared study format (shared/study): a
 * JSON study file (settings, trials, onset journal; older versions migrated) or a trial-list CSV. A study
 * made from the generated demo also records the demo's size and seed, so reopening it regenerates the
 * same invented recordings.
 */
import type { OnsetJournalLike, StudySettings, TrialSpec } from '../../../shared/analysis/types';
import { defaultStudySettings } from '../../../shared/analysis/defaultSettings';
import { parseStudyFile } from '../../../shared/study/parseStudyFile';
import { serializeStudy, STUDY_SCHEMA_VERSION } from '../../../shared/study/studyFile';
import { importTrialList } from '../../../shared/study/importTrialList';
import { FORECATCH_VERSION } from '../../../shared/version';
import type { DemoSpec } from './protocol';

/** An opened study: what the worker needs to prepare it. */
export interface ParsedStudy {
  name: string;
  settings: StudySettings;
  trials: TrialSpec[];
  journal: OnsetJournalLike;
  demo?: DemoSpec;
}

function demoSpecOf(value: unknown): DemoSpec | undefined {
  const d = value as Partial<DemoSpec> | undefined;
  const ok = (v: unknown, max: number) => typeof v === 'number' && Number.isFinite(v) && v > 0 && v <= max;
  if (d?.standard === true) return { standard: true, subjects: 3, trialsPerSubject: 24, muscles: 2, postS: 0.3, seed: 20260101 };
  return d && ok(d.subjects, 50) && ok(d.trialsPerSubject, 500) && ok(d.muscles, 32) && ok(d.postS, 600) && ok(d.seed, 2 ** 31)
    ? { subjects: d.subjects!, trialsPerSubject: d.trialsPerSubject!, muscles: d.muscles!, postS: d.postS!, seed: d.seed! }
    : undefined;
}

/**
 * Parses a study file (`.json`) or a trial list (`.csv`, `.tsv`, `.txt`).
 * @param fileName - the file's name (decides the format and names the file in errors)
 * @param text - its content
 * @throws ParseError / StudyFileError naming the file and the place
 */
export function parseStudyText(fileName: string, text: string): ParsedStudy {
  if (/\.(csv|tsv|txt)$/i.test(fileName)) {
    return { name: fileName, settings: defaultStudySettings(), trials: importTrialList(text, fileName), journal: { edits: [], cursor: 0 } };
  }
  const study = parseStudyFile(text, fileName);
  let demo: DemoSpec | undefined;
  try {
    demo = demoSpecOf((JSON.parse(text) as { demo?: unknown }).demo);
  } catch {
    demo = undefined;
  }
  return { name: study.name, settings: study.settings, trials: study.trials, journal: study.journal, demo };
}

/**
 * The study file text (edits past the journal's cursor, i.e. undone ones, are dropped).
 * @param name - study name
 * @param demo - the demo's size and seed when the study is the generated demo
 */
export function studyFileText(name: string, settings: StudySettings, trials: TrialSpec[], journal: OnsetJournalLike, demo?: DemoSpec): string {
  const text = serializeStudy({
    schemaVersion: STUDY_SCHEMA_VERSION,
    name,
    description: demo ? 'Invented demo data from the Forecatch rail-lab simulator' : undefined,
    savedWith: FORECATCH_VERSION,
    settings,
    trials,
    journal: { edits: journal.edits.slice(0, journal.cursor), cursor: journal.cursor },
  });
  if (!demo) return text;
  return JSON.stringify({ ...(JSON.parse(text) as object), demo }, null, 2) + '\n';
}
