/**
 * The per-row work of the delimited reader: one row of cell strings in, numbers into the column store,
 * with the checks (cell count, numbers, finite values, increasing time) and the missing-sample counts.
 */
import { ParseError } from '../../errors';
import type { ImportWarning } from '../../recording/types';
import { ColumnStore } from './columnStore';
import { SLOT_MARKER, type ColumnPlan } from './columnPlan';
import { parseDecimal } from './parseDecimal';
import type { DelimitedDialect } from './sniffDelimited';

/** Receives parsed rows of one file and stores their numbers column by column. */
export class DelimitedRowSink {
  readonly store: ColumnStore;
  /** 1-based number of the last line handed in. */
  lineNo: number;
  /** True once a fault stopped the import (fault policy `truncate`). */
  stopped = false;
  /** Most decimals seen in a time cell (the printed resolution of the time stamps). */
  timeDecimals = 0;
  missingSignal = 0;
  readonly missingMarker: Float64Array;
  private prevT = -Infinity;
  private readonly n: number;
  private readonly comma: boolean;
  private readonly first: number;
  private readonly timeCol: number;
  private readonly timeDiv: number;
  private readonly nMarkers: number;

  /**
   * @param fileName - for messages
   * @param dialect - the file's dialect (cell count, decimal mark)
   * @param plan - the column mapping
   * @param onFault - `error` throws ParseError at a fault; `truncate` stops and warns (when rows were kept)
   * @param warnings - receives the PARTIAL warning
   * @param firstLine - number of lines before the first row handed in
   */
  constructor(
    private readonly fileName: string,
    dialect: DelimitedDialect,
    private readonly plan: ColumnPlan,
    private readonly onFault: 'error' | 'truncate',
    private readonly warnings: ImportWarning[],
    firstLine: number,
  ) {
    this.store = new ColumnStore(plan.srcCol.length);
    this.missingMarker = new Float64Array(plan.markers.length);
    this.n = dialect.columnCount;
    this.comma = dialect.decimalComma;
    this.first = plan.timeSlot === 0 ? 1 : 0;
    this.timeCol = plan.timeSlot === 0 ? plan.srcCol[0] : -1;
    this.timeDiv = plan.timeSlot === 0 ? plan.divisor[0] : 1;
    this.nMarkers = plan.markerSlots.length / 3;
    this.lineNo = firstLine;
  }

  private fault(col: number, expected: string, found: string): false {
    const column = col >= 0 ? this.plan.columnNames[col] ?? `#${col + 1}` : undefined;
    if (this.onFault === 'truncate' && this.store.rows > 0) {
      this.stopped = true;
      const where = `line ${this.lineNo}${column ? `, column ${column}` : ''}`;
      this.warnings.push({ code: 'PARTIAL', message: `${this.fileName}: ${where}: expected ${expected}, found ${found}; kept the ${this.store.rows} rows before it` });
      return false;
    }
    throw new ParseError({ file: this.fileName, line: this.lineNo, column }, expected, found);
  }

  /**
   * Handles the next line's cells.
   * @param cells - the cells of one line
   * @returns false when a fault stopped the import (the caller stops feeding rows)
   * @throws ParseError at a fault under the `error` policy
   */
  row(cells: string[]): boolean {
    this.lineNo++;
    const n = this.n;
    if (cells.length !== n) {
      if (cells.length === 1 && cells[0].trim() === '') return true;
      return this.fault(-1, `${n} cells`, `${cells.length}`);
    }
    const s = this.store;
    const row = s.rows;
    if (row >= s.allocatedRows) s.ensure(row + 1);
    const cols = s.columns();
    const comma = this.comma;
    const p = this.plan;
    if (this.timeCol >= 0) {
      const text = cells[this.timeCol];
      const t = (text.length === 0 ? NaN : parseDecimal(text, comma)) / this.timeDiv;
      if (!(t > this.prevT) || t === Infinity || (t === 0 && text.trim() === '')) {
        const finite = t === t && text.trim() !== '' && t !== Infinity;
        return this.fault(this.timeCol, finite ? `a time stamp after ${this.prevT}` : 'a finite time stamp', `"${text.trim().slice(0, 24)}"`);
      }
      this.prevT = t;
      const dot = comma ? text.indexOf(',') : text.indexOf('.');
      if (dot >= 0) {
        const dec = text.indexOf('e') >= 0 || text.indexOf('E') >= 0 ? 17 : text.trimEnd().length - dot - 1;
        if (dec > this.timeDecimals) this.timeDecimals = dec;
      }
      cols[0][row] = t;
    }
    const srcCol = p.srcCol;
    const divisor = p.divisor;
    const kind = p.kind;
    const nSlots = srcCol.length;
    for (let k = this.first; k < nSlots; k++) {
      const col = srcCol[k];
      const text = cells[col];
      let v = text.length === 0 ? NaN : parseDecimal(text, comma);
      if (v !== v) {
        const t = text.trim();
        if (t !== '' && t !== 'NaN' && t.toLowerCase() !== 'nan') return this.fault(col, 'a number', `"${t.slice(0, 24)}"`);
        if (kind[k] !== SLOT_MARKER) this.missingSignal++;
      } else if (v === 0 && text.trim() === '') {
        v = NaN;
        if (kind[k] !== SLOT_MARKER) this.missingSignal++;
      } else if (v === Infinity || v === -Infinity) {
        return this.fault(col, 'a finite number', `"${text.trim().slice(0, 24)}"`);
      }
      cols[k][row] = v / divisor[k];
    }
    const markerSlots = p.markerSlots;
    for (let m = 0; m < this.nMarkers; m++) {
      const ca = cols[markerSlots[3 * m]];
      const cb = cols[markerSlots[3 * m + 1]];
      const cc = cols[markerSlots[3 * m + 2]];
      if (ca[row] !== ca[row] || cb[row] !== cb[row] || cc[row] !== cc[row]) {
        ca[row] = NaN;
        cb[row] = NaN;
        cc[row] = NaN;
        this.missingMarker[m]++;
      }
    }
    s.rows = row + 1;
    return true;
  }
}
