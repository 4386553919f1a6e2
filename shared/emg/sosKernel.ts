/**
 * The inner loop of second-order-section filtering, in place, in either direction.
 * Direct form II transposed per section:
 *   y = b0 x + s0;  s0 = b1 x - a1 y + s1;  s1 = b2 x - a2 y.
 * Sections are run two at a time within one sweep so that their recursions overlap in the CPU, and long signals
 * are cut in two (four for a single section) with the later pieces started early from rest, so that several
 * independent recursions are in flight (see sosSweeps.ts); results equal the plain recursion to rounding
 * (test/emg/filters.test.ts).
 */
import { settleSamples, sweep1, sweep2Split } from './sosSweeps';
import type { Sos } from './zpkToSos';

/**
 * Filters buf[start..end) in place through all sections, forward (step 1) or backward (step -1).
 * @param sos - sections, n x 6, a0 = 1
 * @param buf - samples, overwritten with the output
 * @param start - first index (inclusive)
 * @param end - last index (exclusive)
 * @param backward - run from end-1 down to start
 * @param state - n x 2 section states [s0, s1], read as initial and overwritten with final states
 * @param src - optional source of the input (default buf): buf[i] = src[i] - shift first, in one loop
 * @param shift - subtracted from every src sample (default 0; x - 0 === x exactly)
 */
export function sosFilterInPlace(
  sos: Sos,
  buf: Float64Array,
  start: number,
  end: number,
  backward: boolean,
  state: Float64Array,
  src: Float64Array = buf,
  shift = 0,
): void {
  const nSec = sos.length / 6;
  const count = end - start;
  const step = backward ? -1 : 1;
  const first = backward ? end - 1 : start;
  let s = 0;
  // The input is copied (offset subtracted) into buf first: measured on the benchmark machine, reading src inside
  // the sweeps instead was slower than this one plain copy loop.
  loadShifted(src, shift, buf, start, end);
  // Sections run in pairs, two chains in flight on long signals: on the 4-section EMG band-pass this measured
  // faster than four sections per sweep, with one chain or two (fewer values live at once than fit in registers).
  for (; s + 1 < nSec; s += 2) {
    const warm = Math.max(settleSamples(sos[s * 6 + 4], sos[s * 6 + 5]), settleSamples(sos[s * 6 + 10], sos[s * 6 + 11]));
    if (warm > 0 && count > 4 * warm) sweep2Split(sos, buf, s, first, count, step, state, warm);
    else break;
  }
  for (; s + 1 < nSec; s += 2) {
    const o = s * 6;
    const b10 = sos[o], b11 = sos[o + 1], b12 = sos[o + 2], a11 = sos[o + 4], a12 = sos[o + 5];
    const b20 = sos[o + 6], b21 = sos[o + 7], b22 = sos[o + 8], a21 = sos[o + 10], a22 = sos[o + 11];
    let s10 = state[s * 2], s11 = state[s * 2 + 1], s20 = state[s * 2 + 2], s21 = state[s * 2 + 3];
    let i = first;
    for (let k = 0; k < count; k++, i += step) {
      const x = buf[i];
      const y1 = b10 * x + s10;
      s10 = b11 * x + s11 - a11 * y1;
      s11 = b12 * x - a12 * y1;
      const y2 = b20 * y1 + s20;
      s20 = b21 * y1 + s21 - a21 * y2;
      s21 = b22 * y1 - a22 * y2;
      buf[i] = y2;
    }
    state[s * 2] = s10;
    state[s * 2 + 1] = s11;
    state[s * 2 + 2] = s20;
    state[s * 2 + 3] = s21;
  }
  if (s < nSec) sweep1(sos, buf, s, first, count, step, state);
}

/** buf[start..end) = src[start..end) - shift (a plain copy when shift is 0; nothing when src is buf too). */
export function loadShifted(src: Float64Array, shift: number, buf: Float64Array, start: number, end: number): void {
  if (shift === 0) {
    if (src !== buf) buf.set(src.subarray(start, end), start);
    return;
  }
  for (let i = start; i < end; i++) buf[i] = src[i] - shift;
}

/**
 * Checks that sos is a non-empty n x 6 array of finite numbers with a0 = 1 in every section.
 * @param sos - sections to check
 * @param where - function name for the message
 * @throws RangeError naming the offending section
 */
export function checkSos(sos: Sos, where: string): void {
  if (!(sos instanceof Float64Array) || sos.length === 0 || sos.length % 6 !== 0) {
    throw new RangeError(`${where}: sos must be a Float64Array of n x 6 coefficients, got length ${(sos as { length?: number })?.length}`);
  }
  for (let s = 0; s < sos.length / 6; s++) {
    if (sos[s * 6 + 3] !== 1) throw new RangeError(`${where}: section ${s} has a0 = ${sos[s * 6 + 3]}, expected 1`);
    for (let j = 0; j < 6; j++) {
      if (!Number.isFinite(sos[s * 6 + j])) throw new RangeError(`${where}: section ${s} coefficient ${j} is not finite`);
    }
  }
}
