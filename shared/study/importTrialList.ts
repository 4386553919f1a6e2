import Papa from 'papaparse';
import { ParseError } from '../errors';
import type { TrialSpec } from '../analysis/types';

/** Column names with a fixed meaning in a trial list (case-insensitive); all others become covariates. */
export const TRIAL_LIST_COLUMNS = ['trial', 'subject', 'condition', 'file', 'emg_file', 'exclude', 'note'] as const;

const FALSEY = new Set(['', '0', 'false', 'no', 'n']);
const TRUTHY = new Set(['1', 'true', 'yes', 'y', 'x']);

/**
 * Reads a trial list CSV (comma, semicolon or tab separated; header row required) into trial specs.
 * Columns: `trial`, `subject`, `condition`, `file` (required; paths relative to the CSV), optional
 * `emg_file`, `exclude` (empty/0/false/no = kept; 1/true/yes/x = excluded; any other text = excluded with that
 * text as the reason), `note`; every other column is kept as a covariate (a number when the whole cell
 * parses as one, else the text).
 *
 * @param text - CSV content
 * @param fileName - CSV name for messages
 * @returns the trials in file order
 * @throws ParseError naming the line for a missing required column, an empty required cell or a duplicate trial id
 * @see RFC 4180 (CSV); papaparse for parsing
 */
export function importTrialList(text: string, fileName: string): TrialSpec[] {
  const parsed = Papa.parse<string[]>(text.replace(/^\uFEFF/, ''), { skipEmptyLines: 'greedy', delimitersToGuess: [',', ';', '\t'] });
  const rows = parsed.data;
  if (rows.length === 0) throw new ParseError({ file: fileName, line: 1 }, 'a header row with trial, subject, condition, file');
  const header = rows[0].map((h) => h.trim());
  const lower = header.map((h) => h.toLowerCase());
  const col = (name: string): number => lower.indexOf(name);
  for (const need of ['trial', 'subject', 'condition', 'file']) {
    if (col(need) < 0) throw new ParseError({ file: fileName, line: 1, column: need }, `a '${need}' column (header: ${header.join(', ')})`);
  }
  const covCols = header.map((h, i) => ({ h, i })).filter(({ h }) => !(TRIAL_LIST_COLUMNS as readonly string[]).includes(h.toLowerCase()));
  const ids = new Set<string>();
  const out: TrialSpec[] = [];
  for (let r = 1; r < rows.length; r++) {
    const row = rows[r];
    const line = r + 1;
    const cell = (name: string): string => (col(name) >= 0 ? (row[col(name)] ?? '').trim() : '');
    for (const need of ['trial', 'subject', 'file']) {
      if (cell(need) === '') throw new ParseError({ file: fileName, line, column: need }, `a value in column '${need}'`, 'an empty cell');
    }
    const id = cell('trial');
    if (ids.has(id)) throw new ParseError({ file: fileName, line, column: 'trial' }, 'a unique trial id', id);
    ids.add(id);
    const ex = cell('exclude');
    const exLower = ex.toLowerCase();
    const excluded = !FALSEY.has(exLower);
    const covariates: Record<string, number | string> = {};
    for (const { h, i } of covCols) {
      const v = (row[i] ?? '').trim();
      if (v === '') continue;
      const n = Number(v);
      covariates[h] = Number.isFinite(n) && /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/.test(v) ? n : v;
    }
    out.push({
      id,
      subject: cell('subject'),
      condition: cell('condition'),
      file: cell('file'),
      emgFile: cell('emg_file') || undefined,
      excluded,
      excludeReason: excluded ? (TRUTHY.has(exLower) ? 'excluded in the trial list' : ex) : undefined,
      note: cell('note') || undefined,
      covariates,
    });
  }
  return out;
}
