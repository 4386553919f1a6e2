/**
 * Streaming reader for delimited text (CSV, TSV, semicolon with decimal comma). Text arrives in chunks of
 * any size through `push`; complete lines are parsed by papaparse batch by batch and each cell goes straight
 * into a column of Float64Arrays, so a file of several hundred MB never exists as one string or as row objects.
 */
import Papa from 'papaparse';
import { ParseError } from '../../errors';
import type { ImportWarning, Recording } from '../../recording/types';
import type { ImportTemplate } from '../importTemplate';
import { ColumnStore } from './columnStore';
import { parseDecimal } from './parseDecimal';
import { planColumns, SLOT_MARKER, type ColumnPlan } from './columnPlan';
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
const BATCH_CHARS = 1 << 16;

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
  let store: ColumnStore | null = null;
  let newline = '\n';
  let lineNo = 0;
  let stopped = false;
  let finished = false;
  let reserved = false;
  let prevT = -Infinity;
  let timeDecimals = 0;
  let missingSignal = 0;
  let missingMarker = new Float64Array(0);
  const warnings: ImportWarning[] = [];

  const fault = (line: number, col: number, expected: string, found: string): void => {
    const column = col >= 0 && plan ? plan.columnNames[col] ?? `#${col + 1}` : undefined;
    if (onFault === 'truncate' && store && store.rows > 0) {
      stopped = true;
      const where = `line ${line}${column ? `, column ${column}` : ''}`;
      warnings.push({ code: 'PARTIAL', message: `${fileName}: ${where}: expected ${expected}, found ${found}; kept the ${store.rows} rows before it` });
      return;
    }
    throw new ParseError({ file: fileName, line, column }, expected, found);
  };

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
    store = new ColumnStore(plan.srcCol.length);
    missingMarker = new Float64Array(plan.markers.length);
  };

  const handleRows = (rows: string[][], batchChars: number): void => {
    const p = plan!;
    const s = store!;
    const n = dialect!.columnCount;
    const comma = dialect!.decimalComma;
    const nSlots = p.srcCol.length;
    if (!reserved && opts.expectedBytes && rows.length > 0) {
      reserved = true;
      const est = (opts.expectedBytes / Math.max(1, batchChars / rows.length)) * 1.05 + 16;
      s.reserve(Math.min(est, opts.expectedBytes / 2));
    }
    const cols = s.columns();
    const srcCol = p.srcCol;
    const divisor = p.divisor;
    const kind = p.kind;
    const first = p.timeSlot === 0 ? 1 : 0;
    const timeCol = p.timeSlot === 0 ? srcCol[0] : -1;
    const timeDiv = p.timeSlot === 0 ? divisor[0] : 1;
    const markerSlots = p.markerSlots;
    const nMarkers = markerSlots.length / 3;
    let lastT = prevT;
    let decimals = timeDecimals;
    let missingSig = missingSignal;
    try {
      for (let r = 0; r < rows.length; r++) {
        const cells = rows[r];
        lineNo++;
        if (cells.length !== n) {
          if (cells.length === 1 && cells[0].trim() === '') continue;
          fault(lineNo, -1, `${n} cells`, `${cells.length}`);
          return;
        }
        const row = s.rows;
        if (row >= s.allocatedRows) s.ensure(row + 1);
        if (timeCol >= 0) {
          const text = cells[timeCol];
          const t = (text.length === 0 ? NaN : parseDecimal(text, comma)) / timeDiv;
          if (!(t > lastT) || t === Infinity || (t === 0 && text.trim() === '')) {
            const shown = `"${text.trim().slice(0, 24)}"`;
            fault(lineNo, timeCol, t === t && text.trim() !== '' && t !== Infinity ? `a time stamp after ${lastT}` : 'a finite time stamp', shown);
            return;
          }
          lastT = t;
          const dot = comma ? text.indexOf(',') : text.indexOf('.');
          if (dot >= 0) {
            const dec = text.indexOf('e') >= 0 || text.indexOf('E') >= 0 ? 17 : text.trimEnd().length - dot - 1;
            if (dec > decimals) decimals = dec;
          }
          cols[0][row] = t;
        }
        for (let k = first; k < nSlots; k++) {
          const col = srcCol[k];
          const text = cells[col];
          let v = text.length === 0 ? NaN : parseDecimal(text, comma);
          if (v !== v) {
            const t = text.trim();
            if (t !== '' && t !== 'NaN' && t.toLowerCase() !== 'nan') {
              fault(lineNo, col, 'a number', `"${t.slice(0, 24)}"`);
              return;
            }
            if (kind[k] !== SLOT_MARKER) missingSig++;
          } else if (v === 0 && text.trim() === '') {
            v = NaN;
            if (kind[k] !== SLOT_MARKER) missingSig++;
          } else if (v === Infinity || v === -Infinity) {
            fault(lineNo, col, 'a finite number', `"${text.trim().slice(0, 24)}"`);
            return;
          }
          cols[k][row] = v / divisor[k];
        }
        for (let m = 0; m < nMarkers; m++) {
          const ca = cols[markerSlots[3 * m]];
          const cb = cols[markerSlots[3 * m + 1]];
          const cc = cols[markerSlots[3 * m + 2]];
          const x = ca[row];
          const y = cb[row];
          const z = cc[row];
          if (x !== x || y !== y || z !== z) {
            ca[row] = NaN;
            cb[row] = NaN;
            cc[row] = NaN;
            missingMarker[m]++;
          }
        }
        s.rows = row + 1;
      }
    } finally {
      prevT = lastT;
      timeDecimals = decimals;
      missingSignal = missingSig;
    }
  };

  const parseLines = (text: string): string[][] =>
    Papa.parse<string[]>(text, { delimiter: dialect!.delimiter, newline: '\n' as const }).data as string[][];

  /**
   * Parses complete lines in slices of about BATCH_CHARS, so each slice's rows of strings die young
   * (cheap for the garbage collector) instead of piling up per read-stream chunk.
   */
  const handleText = (text: string): void => {
    if (text.length <= BATCH_CHARS || text.indexOf('"') >= 0) {
      handleRows(parseLines(text), text.length);
      return;
    }
    let start = 0;
    while (start < text.length && !stopped) {
      let end = start + BATCH_CHARS >= text.length ? text.length : text.indexOf('\n', start + BATCH_CHARS);
      if (end < 0) end = text.length;
      handleRows(parseLines(text.slice(start, end)), end - start);
      start = end + 1;
    }
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
    lineNo = skip;
  };

  return {
    push(chunk: string): void {
      if (finished) throw new RangeError('push() after finish()');
      if (stopped || chunk.length === 0) return;
      pending += normalize(chunk);
      sniffIfReady(false);
      if (!dialect) {
        if (pending.length > MAX_LINE_CHARS) throw new ParseError({ file: fileName, line: 1 }, `line breaks within the first ${MAX_LINE_CHARS} characters`, 'none');
        return;
      }
      const text = takeCompleteLines();
      if (text !== null) handleText(text);
      if (pending.length > MAX_LINE_CHARS) {
        throw new ParseError({ file: fileName, line: lineNo + 1 }, `lines shorter than ${MAX_LINE_CHARS} characters`, 'no line break');
      }
    },
    finish(): Recording {
      if (finished) throw new RangeError('finish() called twice');
      finished = true;
      if (!stopped) {
        if (!dialect) sniffIfReady(true);
        const text = takeCompleteLines();
        if (text !== null) handleText(text);
        if (!stopped && pending.trim().length > 0) {
          const rows = parseLines(pending);
          const last = rows[rows.length - 1];
          if (rows.length === 1 && last.length < dialect!.columnCount && store!.rows > 0) {
            warnings.push({
              code: 'TRUNCATED_LAST_LINE',
              message: `${fileName}: line ${lineNo + 1}: expected ${dialect!.columnCount} cells, found ${last.length} at the end of the file; kept the ${store!.rows} complete rows`,
            });
          } else handleRows(rows, pending.length);
        }
      }
      pending = '';
      return buildDelimitedRecording(fileName, {
        dialect: dialect!,
        plan: plan!,
        store: store!,
        lastLine: lineNo,
        timeDecimals,
        missingMarker,
        missingSignal,
        warnings,
      });
    },
  };
}
