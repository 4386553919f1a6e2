/**
 * CSV export of marker trajectories and signal channels in Forecatch's default layout, so that
 * `createDelimitedReader` reads the text back to the same numbers (shortest round-trip number text).
 */
import { DimensionMismatchError } from '../../errors';
import type { MarkerStream, SignalChannel } from '../../recording/types';

/** Options of the CSV writers. */
export interface DelimitedWriteOptions {
  /** Field delimiter (default `,`). */
  delimiter?: ',' | ';' | '\t';
  /** Marker coordinate units in the file (default `m`; `mm` multiplies by 1000 and names columns `NAME_x_mm`). */
  markerUnits?: 'm' | 'mm';
}

function quote(cell: string, delimiter: string): string {
  return cell.includes(delimiter) || cell.includes('"') || cell.includes('\n') || cell.includes('\r') ? `"${cell.replace(/"/g, '""')}"` : cell;
}

function num(v: number): string {
  return v === v ? String(v) : '';
}

function timeAt(startS: number, rateHz: number, timesS: Float64Array | undefined, i: number): number {
  return timesS ? timesS[i] : startS + i / rateHz;
}

/**
 * Writes a marker stream as delimited text: `time_s`, then `NAME_x`, `NAME_y`, `NAME_z` per marker;
 * missing samples are empty cells.
 * @param stream - the markers (metres)
 * @param opts - delimiter and file units
 * @returns the file text, one line per frame after the header, ending in a newline
 * @throws DimensionMismatchError when a marker's arrays are not frameCount long
 */
export function writeDelimitedMarkers(stream: MarkerStream, opts: DelimitedWriteOptions = {}): string {
  const d = opts.delimiter ?? ',';
  const mm = opts.markerUnits === 'mm';
  const f = mm ? 1000 : 1;
  const n = stream.frameCount;
  for (const m of stream.markers) {
    if (m.x.length !== n || m.y.length !== n || m.z.length !== n) {
      throw new DimensionMismatchError(`marker ${m.label}: coordinate arrays must hold frameCount = ${n} samples`);
    }
  }
  if (stream.timesS && stream.timesS.length !== n) throw new DimensionMismatchError(`timesS holds ${stream.timesS.length} times for ${n} frames`);
  const suffix = mm ? '_mm' : '';
  const head = ['time_s'];
  for (const m of stream.markers) for (const a of 'xyz') head.push(quote(`${m.label}_${a}${suffix}`, d));
  const lines: string[] = [head.join(d)];
  const cells: string[] = new Array(1 + 3 * stream.markers.length);
  for (let i = 0; i < n; i++) {
    cells[0] = String(timeAt(stream.startS, stream.rateHz, stream.timesS, i));
    let k = 1;
    for (const m of stream.markers) {
      const missing = m.x[i] !== m.x[i] || m.y[i] !== m.y[i] || m.z[i] !== m.z[i];
      cells[k++] = missing ? '' : num(m.x[i] * f);
      cells[k++] = missing ? '' : num(m.y[i] * f);
      cells[k++] = missing ? '' : num(m.z[i] * f);
    }
    lines.push(cells.join(d));
  }
  return lines.join('\n') + '\n';
}

/**
 * Writes signal channels sharing one clock as delimited text: `time_s`, then one column per channel
 * named `LABEL [UNITS]` (or `LABEL` without units).
 * @param channels - channels with equal rate, start, length (and times, if explicit)
 * @param opts - delimiter
 * @returns the file text, ending in a newline
 * @throws DimensionMismatchError when channels differ in rate, start or length
 * @throws RangeError when there are no channels
 */
export function writeDelimitedSignals(channels: SignalChannel[], opts: DelimitedWriteOptions = {}): string {
  const d = opts.delimiter ?? ',';
  if (channels.length === 0) throw new RangeError('writeDelimitedSignals needs at least one channel');
  const c0 = channels[0];
  const n = c0.values.length;
  for (const c of channels) {
    if (c.values.length !== n || c.rateHz !== c0.rateHz || c.startS !== c0.startS) {
      throw new DimensionMismatchError(`channel ${c.label}: all channels of one CSV file must share rate, start and length (${c0.label}: ${c0.rateHz} Hz, ${c0.startS} s, ${n} samples)`);
    }
  }
  const timesS = c0.timesS;
  if (timesS && timesS.length !== n) throw new DimensionMismatchError(`timesS holds ${timesS.length} times for ${n} samples`);
  const head = ['time_s', ...channels.map((c) => quote(c.units ? `${c.label} [${c.units}]` : c.label, d))];
  const lines: string[] = [head.join(d)];
  const cells: string[] = new Array(1 + channels.length);
  for (let i = 0; i < n; i++) {
    cells[0] = String(timeAt(c0.startS, c0.rateHz, timesS, i));
    for (let k = 0; k < channels.length; k++) cells[k + 1] = num(channels[k].values[i]);
    lines.push(cells.join(d));
  }
  return lines.join('\n') + '\n';
}
