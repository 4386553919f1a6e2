import { ParseError } from '../errors';
import { STUDY_SCHEMA_VERSION } from './studyFile';
import { STANDARD_HYPOTHESES } from '../analysis/defaultSettings';

type Json = Record<string, unknown>;

/**
 * Schema history of the study file:
 * - 1: settings held `delayMs` (number) and `hypotheses` as a list of ids from the standard set; each trial had
 *   `exclude` (false or a reason string); edits were a top-level `edits` array (all in effect).
 * - 2: settings hold `cutoff` ({kind, delayMs | afterMs}) and full hypothesis objects; trials have `excluded`
 *   and `excludeReason`; edits live in `journal: {edits, cursor}`.
 */
const MIGRATIONS: Record<number, (doc: Json) => Json> = {
  1: (doc) => {
    const settings = { ...((doc.settings as Json) ?? {}) };
    if (typeof settings.delayMs === 'number') settings.cutoff = { kind: 'onset-minus-delay', delayMs: settings.delayMs };
    delete settings.delayMs;
    if (Array.isArray(settings.hypotheses) && settings.hypotheses.every((h) => typeof h === 'string')) {
      settings.hypotheses = (settings.hypotheses as string[]).map((id) => {
        const std = STANDARD_HYPOTHESES.find((h) => h.id === id);
        if (!std) throw new ParseError({ file: String(doc.__file ?? 'study'), line: 1 }, `a standard hypothesis id at $.settings.hypotheses (${STANDARD_HYPOTHESES.map((h) => h.id).join(', ')})`, JSON.stringify(id));
        return { ...std };
      });
    }
    const trials = Array.isArray(doc.trials)
      ? (doc.trials as Json[]).map((t) => {
          const { exclude, ...rest } = t;
          return { ...rest, excluded: typeof exclude === 'string' ? true : Boolean(exclude), excludeReason: typeof exclude === 'string' ? exclude : undefined };
        })
      : doc.trials;
    const edits = Array.isArray(doc.edits) ? doc.edits : [];
    const { edits: _e, ...restDoc } = doc;
    void _e;
    return { ...restDoc, schemaVersion: 2, settings, trials, journal: { edits, cursor: edits.length } };
  },
};

/**
 * Brings a parsed study document to the current schema version, one migration at a time.
 *
 * @param doc - the parsed JSON object
 * @param fileName - for error messages
 * @returns the migrated document (a new object; the input is not modified)
 * @throws ParseError when schemaVersion is missing, not an integer, or newer than this Forecatch knows
 */
export function migrateStudy(doc: Json, fileName: string): Json {
  const v = doc.schemaVersion;
  if (typeof v !== 'number' || !Number.isInteger(v) || v < 1) {
    throw new ParseError({ file: fileName, line: 1 }, '$.schemaVersion: an integer >= 1', JSON.stringify(v));
  }
  if (v > STUDY_SCHEMA_VERSION) {
    throw new ParseError({ file: fileName, line: 1 }, `$.schemaVersion <= ${STUDY_SCHEMA_VERSION} (file written by a newer Forecatch)`, String(v));
  }
  let cur: Json = { ...doc, __file: fileName };
  for (let ver = v; ver < STUDY_SCHEMA_VERSION; ver++) cur = MIGRATIONS[ver](cur);
  delete cur.__file;
  return cur;
}
