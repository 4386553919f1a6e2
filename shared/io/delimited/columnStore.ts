/**
 * Column-wise numeric storage for streamed text import: one Float64Array per column, all grown together
 * by capacity doubling, so rows never exist as objects and the parsed data costs 8 bytes per value
 * (plus at most the unused capacity).
 */
export class ColumnStore {
  private cols: Float64Array[];
  private capacity: number;
  /** Number of complete rows stored. */
  rows = 0;

  /**
   * @param columnCount - number of numeric columns
   * @param initialCapacity - rows to allocate up front
   * @throws RangeError when a count is not a non-negative integer
   */
  constructor(columnCount: number, initialCapacity = 1024) {
    if (!Number.isInteger(columnCount) || !(columnCount >= 0)) throw new RangeError(`columnCount must be a non-negative integer, got ${columnCount}`);
    if (!Number.isInteger(initialCapacity) || !(initialCapacity >= 1)) throw new RangeError(`initialCapacity must be a positive integer, got ${initialCapacity}`);
    this.capacity = initialCapacity;
    this.cols = [];
    for (let k = 0; k < columnCount; k++) this.cols.push(new Float64Array(initialCapacity));
  }

  /** Allocated rows per column. */
  get allocatedRows(): number {
    return this.capacity;
  }

  /**
   * Makes room for at least `rows` rows; grows to max(rows, 2 x capacity), one column at a time so
   * the transient extra memory is one column's old buffer.
   * @param rows - rows that must fit
   */
  ensure(rows: number): void {
    if (rows <= this.capacity) return;
    this.resize(Math.max(rows, this.capacity * 2));
  }

  /**
   * Pre-allocates for an expected row count (from the file size), avoiding later doublings.
   * @param rows - expected total rows; ignored when not larger than the capacity
   */
  reserve(rows: number): void {
    if (Number.isFinite(rows) && rows > this.capacity) this.resize(Math.ceil(rows));
  }

  private resize(newCapacity: number): void {
    for (let k = 0; k < this.cols.length; k++) {
      const grown = new Float64Array(newCapacity);
      grown.set(this.cols[k].subarray(0, this.rows));
      this.cols[k] = grown;
    }
    this.capacity = newCapacity;
  }

  /**
   * The list of backing arrays, one per column; growth replaces its elements in place, so the list stays
   * valid while each element is valid until the next growth. Write row i at index i.
   */
  columns(): Float64Array[] {
    return this.cols;
  }

  /**
   * The filled part of every column. A view when the unused capacity is small (at most 1/8),
   * otherwise a trimmed copy made one column at a time; the store must not be used afterwards.
   * @returns one array of length `rows` per column
   */
  take(): Float64Array[] {
    const out: Float64Array[] = [];
    const waste = this.capacity - this.rows;
    for (let k = 0; k < this.cols.length; k++) {
      const c = this.cols[k];
      out.push(waste * 8 > this.capacity ? c.slice(0, this.rows) : c.subarray(0, this.rows));
      this.cols[k] = new Float64Array(0);
    }
    return out;
  }
}
