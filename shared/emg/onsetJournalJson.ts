/**
 * The onset journal as JSON (inside a study file or on its own), with validation on the way in.
 */
import { ParseError } from '../errors';
import { onsetEditProblem, type OnsetEdit, type OnsetJournal } from './onsetJournal';

/** Format tag written into every journal JSON. */
export const ONSET_JOURNAL_FORMAT = 'forecatch-onset-journal';

/** Plain-data form of a journal (what JSON.stringify writes). */
export interface OnsetJournalData {
  format: typeof ONSET_JOURNAL_FORMAT;
  version: 1;
  cursor: number;
  edits: OnsetEdit[];
}

/**
 * Plain data for embedding in a study file.
 * @param journal - journal
 * @returns data with format tag and version
 */
export function journalToData(journal: OnsetJournal): OnsetJournalData {
  return { format: ONSET_JOURNAL_FORMAT, version: 1, cursor: journal.cursor, edits: journal.edits.map((e) => ({ ...e })) };
}

/**
 * Journal as JSON text, one edit per line.
 * @param journal - journal
 * @returns JSON
 */
export function journalToJson(journal: OnsetJournal): string {
  const d = journalToData(journal);
  const edits = d.edits.map((e) => `    ${JSON.stringify(e)}`).join(',\n');
  return `{\n  "format": "${d.format}",\n  "version": 1,\n  "cursor": ${d.cursor},\n  "edits": [${edits ? `\n${edits}\n  ` : ''}]\n}\n`;
}

/** UTF-8 byte length of text[0..chars). */
function utf8Length(text: string, chars: number): number {
  let bytes = 0;
  for (let i = 0; i < Math.min(chars, text.length); i++) {
    const c = text.charCodeAt(i);
    if (c < 0x80) bytes += 1;
    else if (c < 0x800) bytes += 2;
    else if (c >= 0xd800 && c < 0xdc00) {
      bytes += 4;
      i++;
    } else bytes += 3;
  }
  return bytes;
}

function lineOf(text: string, needle: string): number {
  const at = needle ? text.indexOf(needle) : -1;
  if (at < 0) return 1;
  let line = 1;
  for (let i = 0; i < at; i++) if (text.charCodeAt(i) === 10) line++;
  return line;
}

/**
 * Checks and freezes plain journal data (e.g. from a study file).
 * @param data - parsed JSON
 * @param fileName - file name for error messages
 * @param text - the JSON text, when available, to report line numbers
 * @returns the journal
 * @throws ParseError naming file, line and what was expected
 */
export function journalFromData(data: unknown, fileName: string, text = ''): OnsetJournal {
  const fail = (expected: string, found?: string, needle = ''): never => {
    throw new ParseError({ file: fileName, line: lineOf(text, needle) }, expected, found);
  };
  if (!data || typeof data !== 'object') return fail('a JSON object with format, version, cursor and edits');
  const d = data as Partial<OnsetJournalData>;
  if (d.format !== ONSET_JOURNAL_FORMAT) return fail(`format "${ONSET_JOURNAL_FORMAT}"`, JSON.stringify(d.format), '"format"');
  if (d.version !== 1) return fail('version 1', JSON.stringify(d.version), '"version"');
  if (!Array.isArray(d.edits)) return fail('edits to be an array', typeof d.edits, '"edits"');
  if (!Number.isInteger(d.cursor) || !((d.cursor as number) >= 0 && (d.cursor as number) <= d.edits.length)) {
    return fail(`cursor to be an integer from 0 to ${d.edits.length}`, JSON.stringify(d.cursor), '"cursor"');
  }
  const seen = new Set<string>();
  const edits: OnsetEdit[] = [];
  d.edits.forEach((raw, i) => {
    const e = raw as OnsetEdit;
    const needle = e && typeof e.id === 'string' ? JSON.stringify(e.id) : '';
    const problem = onsetEditProblem(e);
    if (problem) fail(`edits[${i}]: ${problem}`, undefined, needle);
    if (seen.has(e.id)) fail(`edits[${i}]: a unique id`, JSON.stringify(e.id), needle);
    seen.add(e.id);
    const copy: OnsetEdit = { id: e.id, trialId: e.trialId, muscle: e.muscle, action: e.action, fromS: e.fromS, toS: e.toS, atIso: e.atIso };
    if (e.reason !== undefined) copy.reason = e.reason;
    edits.push(Object.freeze(copy));
  });
  return Object.freeze({ edits: Object.freeze(edits), cursor: d.cursor as number });
}

/**
 * Reads a journal from JSON text.
 * @param text - JSON
 * @param fileName - file name for error messages
 * @returns the journal
 * @throws ParseError on invalid JSON (with the byte offset when the JSON engine reports a position) or invalid content (with the line)
 */
export function journalFromJson(text: string, fileName: string): OnsetJournal {
  let data: unknown;
  try {
    data = JSON.parse(text);
  } catch (err) {
    const m = /position (\d+)/.exec(String((err as Error).message));
    const where = m ? { file: fileName, byteOffset: utf8Length(text, Number(m[1])) } : { file: fileName };
    throw new ParseError(where, 'valid JSON', String((err as Error).message));
  }
  return journalFromData(data, fileName, text);
}
