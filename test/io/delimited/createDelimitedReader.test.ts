import { describe, expect, it } from 'vitest';
import { ParseError } from '../../../shared/errors';
import { createDelimitedReader, type DelimitedReaderOptions } from '../../../shared/io/delimited/createDelimitedReader';
import type { Recording } from '../../../shared/recording/types';
import { seededRandom } from '../../seededRandom';

function read(text: string, opts: DelimitedReaderOptions = {}, chunk = 0, name = 'trial.csv'): Recording {
  const r = createDelimitedReader(name, opts);
  if (chunk <= 0) r.push(text);
  else for (let i = 0; i < text.length; i += chunk) r.push(text.slice(i, i + chunk));
  return r.finish();
}

function parseError(fn: () => unknown): ParseError {
  try {
    fn();
  } catch (e) {
    expect(e).toBeInstanceOf(ParseError);
    return e as ParseError;
  }
  throw new Error('expected a ParseError');
}

const MARKERS_CSV = [
  'time_s,ball_x,ball_y,ball_z,hand_x,hand_y,hand_z,EMG_biceps [mV]',
  '0,0.1,0.2,1.5,0.3,0.4,1.0,0.01',
  '0.005,0.1,0.2,1.49,0.3,0.4,1.0,-0.02',
  '0.01,0.1,0.2,1.47,,0.4,1.0,0.03',
  '0.015,0.1,0.2,1.44,0.3,0.4,1.0,0.04',
].join('\n');

describe('createDelimitedReader: default layout', () => {
  it('reads time_s, NAME_x/_y/_z markers and a channel with units in brackets', () => {
    const rec = read(MARKERS_CSV);
    expect(rec.format).toBe('delimited');
    expect(rec.markers?.rateHz).toBe(200);
    expect(rec.markers?.startS).toBe(0);
    expect(rec.markers?.timesS).toBeUndefined();
    expect(rec.markers?.markers.map((m) => m.label)).toEqual(['ball', 'hand']);
    expect(Array.from(rec.markers!.markers[0].z)).toEqual([1.5, 1.49, 1.47, 1.44]);
    expect(rec.signals).toHaveLength(1);
    expect(rec.signals[0]).toMatchObject({ label: 'EMG_biceps', units: 'mV', rateHz: 200, startS: 0 });
    expect(Array.from(rec.signals[0].values)).toEqual([0.01, -0.02, 0.03, 0.04]);
  });

  it('reads an empty marker cell as a missing sample in all three coordinates and counts it', () => {
    const rec = read(MARKERS_CSV);
    const hand = rec.markers!.markers[1];
    expect([hand.x[2], hand.y[2], hand.z[2]].every(Number.isNaN)).toBe(true);
    expect(hand.x[1]).toBe(0.3);
    expect(rec.meta.missingSamplesByMarker).toEqual({ ball: 0, hand: 1 });
    expect(rec.warnings.map((w) => w.code)).toContain('MISSING_MARKER_SAMPLES');
  });

  it('gives the same result whatever the chunk boundaries (seeded random chunk sizes)', () => {
    const rand = seededRandom(7);
    const lines = ['time,a_x,a_y,a_z,force'];
    for (let i = 0; i < 500; i++) lines.push(`${i / 100},${(rand() - 0.5).toFixed(6)},${rand().toFixed(6)},${(rand() * 2).toFixed(6)},${(rand() * 10).toFixed(3)}`);
    const text = lines.join('\r\n') + '\r\n';
    const whole = read(text);
    for (const size of [1, 2, 3, 17, 64, 1000]) {
      const piecewise = read(text, {}, size);
      expect(piecewise.markers!.markers[0].x).toEqual(whole.markers!.markers[0].x);
      expect(piecewise.signals[0].values).toEqual(whole.signals[0].values);
    }
    // Random sizes too.
    const r = createDelimitedReader('t.csv');
    for (let i = 0; i < text.length; ) {
      const n = 1 + Math.floor(rand() * 300);
      r.push(text.slice(i, i + n));
      i += n;
    }
    expect(r.finish().markers!.markers[0].z).toEqual(whole.markers!.markers[0].z);
    expect(whole.markers!.frameCount).toBe(500);
    expect(whole.markers!.rateHz).toBe(100);
  });

  it('skips preamble lines and reads a units row under the header (mm converted to metres)', () => {
    const text = ['Forecatch rail lab export', 'operator: invented', 'time,ball_x,ball_y,ball_z', 's,mm,mm,mm', '0,100,200,1500', '0.01,100,200,1490'].join('\n');
    const rec = read(text);
    expect(rec.meta.preamble).toEqual(['Forecatch rail lab export', 'operator: invented']);
    expect(rec.meta.headerLine).toBe(3);
    expect(rec.meta.unitsLine).toBe(4);
    expect(rec.markers?.sourceUnits).toBe('mm');
    expect(Array.from(rec.markers!.markers[0].z)).toEqual([1.5, 1.49]);
  });

  it('accepts time_ms and NAME_x_mm column names', () => {
    const rec = read('time_ms,b_x_mm,b_y_mm,b_z_mm\n0,1000,0,0\n10,2000,0,0\n20,3000,0,0\n');
    expect(rec.markers!.rateHz).toBe(100);
    expect(Array.from(rec.markers!.markers[0].x)).toEqual([1, 2, 3]);
  });

  it('detects semicolon delimiter with decimal comma, and tab-separated files', () => {
    const semi = read('time;ball_x;ball_y;ball_z\n0,00;0,5;1,25;-2,5\n0,01;0,6;1,5;-2,4\n');
    expect(semi.meta).toMatchObject({ delimiter: ';', decimalComma: true });
    expect(Array.from(semi.markers!.markers[0].y)).toEqual([1.25, 1.5]);
    const tsv = read('time\temg1\temg2\n0\t1.5\t2\n0.001\t1.6\t2.1\n');
    expect(tsv.meta.delimiter).toBe('\t');
    expect(tsv.signals.map((s) => s.label)).toEqual(['emg1', 'emg2']);
    expect(tsv.signals[0].rateHz).toBe(1000);
  });

  it('strips a UTF-8 byte-order mark and reads old-Mac CR line ends', () => {
    const rec = read('\uFEFFtime,emg\r0,1\r0.5,2\r');
    expect(rec.signals[0].label).toBe('emg');
    expect(rec.signals[0].rateHz).toBe(2);
  });

  it('reads a file without header as time + channels and warns', () => {
    const rec = read('0,1,2\n0.1,3,4\n0.2,5,6\n');
    expect(rec.signals.map((s) => s.label)).toEqual(['column2', 'column3']);
    expect(rec.signals[0].rateHz).toBe(10);
    expect(rec.warnings.map((w) => w.code)).toContain('NO_HEADER');
  });

  it('keeps explicit times when the stamps are increasing but not evenly spaced', () => {
    const rec = read('time,emg\n0,1\n0.001,2\n0.0025,3\n0.003,4\n');
    expect(Array.from(rec.signals[0].timesS!)).toEqual([0, 0.001, 0.0025, 0.003]);
    expect(rec.warnings.map((w) => w.code)).toContain('IRREGULAR_TIME');
  });

  it('treats stamps rounded to their printed resolution as evenly sampled (300 Hz printed with 4 decimals)', () => {
    const lines = ['time,emg'];
    for (let i = 0; i < 300; i++) lines.push(`${(i / 300).toFixed(4)},${i}`);
    const rec = read(lines.join('\n'));
    expect(rec.signals[0].timesS).toBeUndefined();
    expect(rec.signals[0].rateHz).toBeCloseTo(300, 2);
  });
});

describe('createDelimitedReader: bad input', () => {
  it('names file, line, column and the expectation for a garbage cell', () => {
    const e = parseError(() => read('time,emg\n0,1\n0.1,abc\n0.2,3\n'));
    expect(e.line).toBe(3);
    expect(e.message).toContain('trial.csv');
    expect(e.message).toContain('column emg');
    expect(e.message).toContain('expected a number');
  });

  it('rejects infinite values', () => {
    const e = parseError(() => read('time,emg\n0,1\n0.1,Infinity\n'));
    expect(e.message).toMatch(/line 3, column emg: expected a finite number/);
  });

  it('rejects a decreasing or duplicated time stamp', () => {
    expect(parseError(() => read('time,emg\n0,1\n0.1,2\n0.1,3\n')).line).toBe(4);
    expect(parseError(() => read('time,emg\n0,1\n0.2,2\n0.1,3\n')).message).toContain('a time stamp after 0.2');
  });

  it('rejects an empty time cell', () => {
    expect(parseError(() => read('time,emg\n0,1\n,2\n0.2,3\n')).line).toBe(3);
  });

  it('rejects a row with the wrong number of cells in the middle of the file', () => {
    const e = parseError(() => read('time,emg\n0,1\n0.1,2,7\n0.2,3\n'));
    expect(e.line).toBe(3);
    expect(e.expected).toBe('2 cells');
  });

  it('keeps the complete rows and warns when only the last line is cut short', () => {
    const rec = read('time,a,b\n0,1,2\n0.1,3,4\n0.2,5');
    expect(rec.signals[0].values.length).toBe(2);
    expect(rec.warnings.map((w) => w.code)).toContain('TRUNCATED_LAST_LINE');
  });

  it("with onFault 'truncate' returns the rows before a fault and a warning naming the line", () => {
    const rec = read('time,emg\n0,1\n0.1,2\n0.2,x\n0.3,4\n', { onFault: 'truncate' });
    expect(Array.from(rec.signals[0].values)).toEqual([1, 2]);
    const w = rec.warnings.find((x) => x.code === 'PARTIAL')!;
    expect(w.message).toContain('line 4, column emg');
  });

  it('names the missing axis column of a marker', () => {
    const e = parseError(() => read('time,ball_x,ball_y\n0,1,2\n0.1,1,2\n'));
    expect(e.message).toContain('no column ball_z');
    expect(e.line).toBe(1);
  });

  it('refuses two columns for the same marker axis', () => {
    const e = parseError(() => read('time,ball_x,ball_y,ball_z,ball_X\n0,1,2,3,4\n0.1,1,2,3,4\n'));
    expect(e.message).toContain('one column for ball_x');
  });

  it('asks for a time column or a template when none is named time/time_s', () => {
    const e = parseError(() => read('t,emg\n0,1\n0.1,2\n'));
    expect(e.message).toContain('a time column named "time" or "time_s"');
  });

  it('rejects text that has no rows of numbers, and a header without data', () => {
    expect(parseError(() => read('hello world\nno numbers here\n')).line).toBe(1);
    expect(parseError(() => read('time,emg\n')).expected).toMatch(/numbers|data row/);
  });

  it('bounds the text held while waiting for a line break', () => {
    const r = createDelimitedReader('long.csv');
    r.push('time,emg\n0,1\n0.1,2\n' + '1'.repeat(64) + ',');
    expect(parseError(() => r.push('9'.repeat((1 << 24) + 1))).message).toMatch(/line 4: expected lines shorter than/);
    expect(parseError(() => createDelimitedReader('blob.csv').push('x'.repeat(1 << 19))).line).toBe(1);
  });

  it('needs two rows to determine the rate from a time column', () => {
    expect(parseError(() => read('time,emg\n0,1\n')).expected).toContain('at least two data rows');
  });
});
