/**
 * Streaming reader for delimited text (CSV, TSV, semicolon with decimal comma). Text arrives in chunks of
 * any size through `push`; complete lines are parsed by papaparse batch by batch and each cell goes straight
 * into a column of Float64Arrays, so a file of several hundred MB never exists as one string or as row objects.
 */
import Papa from 'papaparse';
import { ParseError } from '../../errors';
import type { ImportWarning, Recording } from '../../recording/types';
import type { ImportTemplate } from '../importTemplate';
import { DelimitedRowSink } from './delimitedRowSink';
import { planColumns, type ColumnPlan } from './columnPlan';
import { sniffDelimited, type DelimitedDialect } from './sniffDelimited';
import { buildDelimitedRecording } from './buildDelimitedRecording';

/** Options of {@link createDelimitedReader}. */
export interface DelimitedReaderOptions {
  /** Column mapping; without one the default layout applies. */
  template?: ImportTemplate;
  /**
   * What a fault in the data (garbage cell, wrong cell count, time not increasing) does:
   * `error` (default) throws a ParseError; `truncate` keeps the rows before the fault and adds a warning.
   */
  onFault?: 'error' | 'truncate';
  /** Total size of the input in bytes, if known: used once to pre-allocate the columns. */
  expectedBytes?: number;
}

/** An incremental delimited-text reader. */
export interface DelimitedReader {
  /** Feeds the next piece of text (any size, may end mid-line). */
  push(chunk: string): void;
  /** Ends the input and returns the recording. */
  finish(): Recording;
}

const SNIFF_LINES = 64;
const SNIFF_CHARS = 1 << 18;
/** Longest line accepted (characters): a bound on the text held while waiting for a line break. */
const MAX_LINE_CHARS = 1 << 24;

/**
 * Creates a streaming reader for one delimited text file.
 * @param fileName - name used in messages and as the recording's source
 * @param opts - template, fault policy, expected size
 * @returns a reader; `push` and `finish` throw ParseError naming file, line, column and what was expected
 */
export function createDelimitedReader(fileName: string, opts: DelimitedReaderOptions = {}): DelimitedReader {
  const onFault = opts.onFault ?? 'error';
  let pending = '';
  let first = true;
  let dialect: DelimitedDialect | null = null;
  let plan: ColumnPlan | null = null;
  let sink: DelimitedRowSink | null = null;
  let newline = '\n';
  let finished = false;
  let reserved = false;
  const warnings: ImportWarning[] = [];
  const stopped = () => sink !== null && sink.stopped;

  const setup = (lines: string[]): void => {
    dialect = sniffDelimited(lines, opts.template);
    if (!dialect) {
      throw new ParseError(
        { file: fileName, line: 1 },
        'delimited text (comma, semicolon or tab) with rows of numbers under at most a few header lines',
        `"${(lines[0] ?? '').slice(0, 40)}"`,
      );
    }
    plan = planColumns(fileName, dialect, opts.template);
    warnings.push(...plan.warnings);
    sink = new DelimitedRowSink(fileName, dialect, plan, onFault, warnings, dialect.dataIndex);
  };

  const parseLines = (text: string): string[][] =>
    Papa.parse<string[]>(text, { delimiter: dialect!.delimiter, newline: '\n' as const }).data as string[][];

  /**
   * Parses complete lines with papaparse's row-by-row `step` mode (each row's strings die young, which keeps
   * the garbage collector's work small) into the row sink.
   */
  const handleText = (text: string): void => {
    const k = sink!;
    if (!reserved && opts.expectedBytes) {
      reserved = true;
      let lines = 1;
      for (let i = text.indexOf('\n'); i >= 0; i = text.indexOf('\n', i + 1)) lines++;
      const est = (opts.expectedBytes / Math.max(1, text.length / lines)) * 1.05 + 16;
      k.store.reserve(Math.min(est, opts.expectedBytes / 2));
    }
    Papa.parse<string[]>(text, {
      delimiter: dialect!.delimiter,
      newline: '\n',
      step: (res, parser) => {
        if (!k.row(res.data)) parser.abort();
      },
    });
  };

  /** Cuts `pending` after its last line break outside quotes; returns the complete lines. */
  const takeCompleteLines = (): string | null => {
    let cut = pending.lastIndexOf('\n');
    if (cut < 0) return null;
    if (pending.indexOf('"') >= 0) {
      let inQuote = false;
      let lastOutside = -1;
      for (let i = 0; i <= cut; i++) {
        const ch = pending.charCodeAt(i);
        if (ch === 34) inQuote = !inQuote;
        else if (ch === 10 && !inQuote) lastOutside = i;
      }
      cut = lastOutside;
      if (cut < 0) return null;
    }
    const text = pending.slice(0, cut);
    pending = pending.slice(cut + 1);
    return text;
  };

  const normalize = (chunk: string): string => {
    if (first) {
      first = false;
      if (chunk.charCodeAt(0) === 0xfeff) chunk = chunk.slice(1);
      if (chunk.indexOf('\n') < 0 && chunk.indexOf('\r') >= 0) newline = '\r';
    }
    if (newline === '\r') return chunk.replace(/\r/g, '\n');
    return chunk.indexOf('\r') >= 0 ? chunk.replace(/\r\n?/g, '\n') : chunk;
  };

  const sniffIfReady = (force: boolean): void => {
    if (dialect) return;
    let count = 0;
    let idx = -1;
    while (count < SNIFF_LINES && (idx = pending.indexOf('\n', idx + 1)) >= 0) count++;
    if (!force && count < SNIFF_LINES && pending.length < SNIFF_CHARS) return;
    const sampleEnd = count >= SNIFF_LINES ? idx : force ? pending.length : pending.lastIndexOf('\n');
    const lines = pending.slice(0, Math.max(0, sampleEnd)).split('\n');
    setup(lines);
    const skip = dialect!.dataIndex;
    let pos = 0;
    for (let i = 0; i < skip; i++) pos = pending.indexOf('\n', pos) + 1;
    pending = pending.slice(pos);
  };

  return {
    push(chunk: string): void {
      if (finished) throw new RangeError('push() after finish()');
      if (stopped() || chunk.length === 0) return;
      pending += normalize(chunk);
      sniffIfReady(false);
      if (!dialect) {
        if (pending.length > MAX_LINE_CHARS) throw new ParseError({ file: fileName, line: 1 }, `line breaks within the first ${MAX_LINE_CHARS} characters`, 'none');
        return;
      }
      const text = takeCompleteLines();
      if (text !== null) handleText(text);
      if (pending.length > MAX_LINE_CHARS) {
        throw new ParseError({ file: fileName, line: sink!.lineNo + 1 }, `lines shorter than ${MAX_LINE_CHARS} characters`, 'no line break');
      }
    },
    finish(): Recording {
      if (finished) throw new RangeError('finish() called twice');
      finished = true;
      if (!stopped()) {
        if (!dialect) sniffIfReady(true);
        const text = takeCompleteLines();
        if (text !== null) handleText(text);
        if (!stopped() && pending.trim().length > 0) {
          const rows = parseLines(pending);
          const k = sink!;
          if (rows.length === 1 && rows[0].length < dialect!.columnCount && k.store.rows > 0) {
            warnings.push({
              code: 'TRUNCATED_LAST_LINE',
              message: `${fileName}: line ${k.lineNo + 1}: expected ${dialect!.columnCount} cells, found ${rows[0].length} at the end of the file; kept the ${k.store.rows} complete rows`,
            });
          } else handleText(pending);
        }
      }
      pending = '';
      return buildDelimitedRecording(fileName, {
        dialect: dialect!,
        plan: plan!,
        store: sink!.store,
        lastLine: sink!.lineNo,
        timeDecimals: sink!.timeDecimals,
        missingMarker: sink!.missingMarker,
        missingSignal: sink!.missingSignal,
        warnings,
      });
    },
  };
}
