/**
 * Study files as the renderer reads and writes them: JSON with the settings, the trial list and the
 * onset edit journal.
 */
import type { OnsetJournalLike, StudySettings, TrialSpec } from '../../../shared/analysis/types';
import { defaultStudySettings } from '../../../shared/analysis/defaultSettings';
import { ParseError } from '../../../shared/errors';
import type { DemoSpec } from './protocol';

/** Format tag written into every study file. */
export const STUDY_FORMAT = 'forecatch-study';

/**
 * Parses a study file.
 * @param name - file name, for error messages
 * @param text - its content
 * @throws ParseError naming the file and what was expected
 */
export function parseStudyText(name: string, text: string): { settings: StudySettings; trials: TrialSpec[]; journal: OnsetJournalLike; demo?: DemoSpec } {
  let raw: unknown;
  try {
    raw = JSON.parse(text);
  } catch (err) {
    throw new ParseError({ file: name, line: 1 }, 'a JSON study file', (err as Error).message);
  }
  const o = raw as { settings?: Partial<StudySettings>; trials?: unknown; journal?: OnsetJournalLike; demo?: DemoSpec };
  if (typeof o !== 'object' || o === null || !Array.isArray(o.trials)) throw new ParseError({ file: name, line: 1 }, 'an object with a "trials" array');
  const trials = (o.trials as Partial<TrialSpec>[]).map((t, i): TrialSpec => {
    if (typeof t?.id !== 'string' || typeof t.file !== 'string') throw new ParseError({ file: name, line: 1, column: `trials[${i}]` }, 'a trial with string "id" and "file"');
    return {
      id: t.id,
      subject: String(t.subject ?? ''),
      condition: String(t.condition ?? ''),
      file: t.file,
      emgFile: t.emgFile,
      emgOffsetS: t.emgOffsetS,
      excluded: t.excluded === true,
      excludeReason: t.excludeReason,
      note: t.note,
      covariates: t.covariates ?? {},
    };
  });
  const journal = o.journal && Array.isArray(o.journal.edits) ? { edits: o.journal.edits, cursor: Math.min(o.journal.cursor ?? o.journal.edits.length, o.journal.edits.length) } : { edits: [], cursor: 0 };
  const demo = o.demo && typeof o.demo.subjects === 'number' && typeof o.demo.seed === 'number' ? o.demo : undefined;
  return { settings: defaultStudySettings(o.settings ?? {}), trials, journal, demo };
}

/**
 * Serialises a study (settings, trials with exclusions, journal) as pretty JSON. A study made from the
 * generated demo records the demo's size and seed so it can be regenerated when reopened.
 */
export function studyFileText(settings: StudySettings, trials: TrialSpec[], journal: OnsetJournalLike, demo?: DemoSpec): string {
  return JSON.stringify({ format: STUDY_FORMAT, version: 1, ...(demo ? { demo } : {}), settings, trials, journal: { edits: journal.edits.slice(0, journal.cursor), cursor: journal.cursor } }, null, 2);
}
