/**
 * Dialect and header detection for delimited text: which delimiter, whether numbers use a decimal
 * comma, which line holds the column names (and an optional units row), where the numbers start.
 */
import Papa from 'papaparse';
import type { ImportTemplate } from '../importTemplate';

/** What {@link sniffDelimited} found in the first lines of a file. */
export interface DelimitedDialect {
  delimiter: ',' | ';' | '\t';
  decimalComma: boolean;
  /** 0-based index of the column-name line, -1 when the file has none. */
  headerIndex: number;
  /** 0-based index of a units row, -1 when none. */
  unitsIndex: number;
  /** 0-based index of the first data line. */
  dataIndex: number;
  /** Number of cells per data row. */
  columnCount: number;
  names: string[] | null;
  units: string[] | null;
  /** Lines before the header (instrument notes and such), as text. */
  preamble: string[];
}

const DECIMAL_COMMA_CELL = /^\s*[-+]?\d*,\d+(?:[eE][-+]?\d+)?\s*$/;
const KNOWN_UNITS = new Set([
  's', 'ms', 'us', 'm', 'mm', 'cm', 'v', 'mv', 'uv', 'µv', 'μv', 'n', 'nm', 'deg', 'rad', 'g', 'hz', '%', 'a', 'ma', 'm/s', 'm/s^2', 'm/s2',
]);

/** True when the cell is a number (with the given decimal mark), `NaN`, or empty. */
export function isNumericCell(cell: string, decimalComma: boolean): boolean {
  const t = cell.trim();
  if (t === '' || t.toLowerCase() === 'nan') return true;
  const v = Number(decimalComma ? t.replace(',', '.') : t);
  return Number.isFinite(v);
}

function isNumericRow(row: string[], decimalComma: boolean): boolean {
  let any = false;
  for (const c of row) {
    if (!isNumericCell(c, decimalComma)) return false;
    if (c.trim() !== '' && c.trim().toLowerCase() !== 'nan') any = true;
  }
  return any;
}

function unitKey(cell: string): string {
  return cell.trim().replace(/^[[(]|[\])]$/g, '').toLowerCase();
}

function looksLikeUnitsRow(row: string[]): boolean {
  let known = 0;
  for (const c of row) {
    const k = unitKey(c);
    if (k === '') continue;
    if (!KNOWN_UNITS.has(k)) return false;
    known++;
  }
  return known > 0;
}

function firstDataRow(rows: string[][], decimalComma: boolean): number {
  for (let i = 0; i < rows.length; i++) {
    if (rows[i].length >= 2 && isNumericRow(rows[i], decimalComma)) return i;
  }
  return -1;
}

/**
 * Detects delimiter, decimal comma and header lines from the first complete lines of a file.
 * @param sampleLines - the first lines, without line terminators
 * @param template - optional template fixing the delimiter, decimal mark or header lines
 * @returns the dialect, or null when no run of numeric rows was found in the sample
 */
export function sniffDelimited(sampleLines: string[], template?: ImportTemplate): DelimitedDialect | null {
  const forced = template?.delimiter && template.delimiter !== 'auto' ? [template.delimiter] : (['\t', ';', ','] as const);
  let end = sampleLines.length;
  while (end > 0 && sampleLines[end - 1].trim() === '') end--;
  const text = sampleLines.slice(0, end).join('\n');
  for (const delimiter of forced) {
    const rows = (Papa.parse<string[]>(text, { delimiter, newline: '\n' }).data as string[][]).slice(0, end);
    let decimalComma = false;
    if (template?.decimalComma === true) decimalComma = true;
    else if (template?.decimalComma === undefined || template.decimalComma === 'auto') {
      if (delimiter !== ',') decimalComma = rows.some((r) => r.some((c) => DECIMAL_COMMA_CELL.test(c)));
    }
    let headerIndex = -1;
    let unitsIndex = -1;
    let dataIndex: number;
    if (template?.headerLine !== undefined) {
      headerIndex = template.headerLine - 1;
      unitsIndex = template.unitsLine !== undefined ? template.unitsLine - 1 : -1;
      dataIndex = Math.max(headerIndex, unitsIndex) + 1;
      if (dataIndex >= rows.length) return null;
      if (rows[dataIndex].length < 2 && forced.length > 1) continue;
    } else {
      dataIndex = firstDataRow(rows, decimalComma);
      if (dataIndex < 0) continue;
      const n = rows[dataIndex].length;
      for (let i = dataIndex - 1; i >= 0; i--) {
        if (rows[i].length === n && !isNumericRow(rows[i], decimalComma)) {
          headerIndex = i;
          break;
        }
      }
      if (headerIndex > 0 && looksLikeUnitsRow(rows[headerIndex]) && rows[headerIndex - 1].length === n) {
        unitsIndex = headerIndex;
        headerIndex -= 1;
      }
    }
    const columnCount = rows[dataIndex].length;
    const names = headerIndex >= 0 ? rows[headerIndex].map((c) => c.trim()) : null;
    const units = unitsIndex >= 0 ? rows[unitsIndex].map((c) => c.trim().replace(/^[[(]|[\])]$/g, '')) : null;
    const preamble = sampleLines.slice(0, Math.max(0, headerIndex));
    return { delimiter, decimalComma, headerIndex, unitsIndex, dataIndex, columnCount, names, units, preamble };
  }
  return null;
}
