import { describe, expect, it } from 'vitest';
import { ColumnStore } from '../../../shared/io/delimited/columnStore';

describe('ColumnStore', () => {
  it('keeps every value through capacity doublings and returns exactly `rows` values per column', () => {
    const s = new ColumnStore(3, 2);
    for (let r = 0; r < 1000; r++) {
      s.ensure(r + 1);
      const cols = s.columns();
      for (let k = 0; k < 3; k++) cols[k][r] = r * 10 + k;
      s.rows = r + 1;
    }
    expect(s.allocatedRows).toBe(1024);
    const out = s.take();
    expect(out.map((c) => c.length)).toEqual([1000, 1000, 1000]);
    for (let r = 0; r < 1000; r++) expect(out[2][r]).toBe(r * 10 + 2);
  });

  it('returns views when little capacity is unused and trimmed copies otherwise', () => {
    const a = new ColumnStore(1, 100);
    a.rows = 95;
    expect(a.take()[0].buffer.byteLength).toBe(800);
    const b = new ColumnStore(1, 100);
    b.rows = 10;
    expect(b.take()[0].buffer.byteLength).toBe(80);
  });

  it('rejects bad counts', () => {
    expect(() => new ColumnStore(-1)).toThrow(RangeError);
    expect(() => new ColumnStore(2, 0)).toThrow(RangeError);
  });
});
