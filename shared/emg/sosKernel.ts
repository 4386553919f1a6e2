/**
 * The inner loop of second-order-section filtering, in place, in either direction.
 * Direct form II transposed per section:
 *   y = b0 x + s0;  s0 = b1 x - a1 y + s1;  s1 = b2 x - a2 y.
 * Sections are run two at a time within one sweep so that their recursions overlap in the CPU
 * (the second section's chain does not wait for the first section's next sample).
 */
import type { Sos } from './zpkToSos';

/**
 * Filters buf[start..end) in place through all sections, forward (step 1) or backward (step -1).
 * @param sos - sections, n x 6, a0 = 1
 * @param buf - samples, overwritten with the output
 * @param start - first index (inclusive)
 * @param end - last index (exclusive)
 * @param backward - run from end-1 down to start
 * @param state - n x 2 section states [s0, s1], read as initial and overwritten with final states
 */
export function sosFilterInPlace(sos: Sos, buf: Float64Array, start: number, end: number, backward: boolean, state: Float64Array): void {
  const nSec = sos.length / 6;
  const count = end - start;
  const step = backward ? -1 : 1;
  const first = backward ? end - 1 : start;
  let s = 0;
  for (; s + 1 < nSec; s += 2) {
    const o = s * 6;
    const b10 = sos[o], b11 = sos[o + 1], b12 = sos[o + 2], a11 = sos[o + 4], a12 = sos[o + 5];
    const b20 = sos[o + 6], b21 = sos[o + 7], b22 = sos[o + 8], a21 = sos[o + 10], a22 = sos[o + 11];
    let s10 = state[s * 2], s11 = state[s * 2 + 1], s20 = state[s * 2 + 2], s21 = state[s * 2 + 3];
    let i = first;
    for (let k = 0; k < count; k++, i += step) {
      const x = buf[i];
      const y1 = b10 * x + s10;
      s10 = b11 * x - a11 * y1 + s11;
      s11 = b12 * x - a12 * y1;
      const y2 = b20 * y1 + s20;
      s20 = b21 * y1 - a21 * y2 + s21;
      s21 = b22 * y1 - a22 * y2;
      buf[i] = y2;
    }
    state[s * 2] = s10;
    state[s * 2 + 1] = s11;
    state[s * 2 + 2] = s20;
    state[s * 2 + 3] = s21;
  }
  if (s < nSec) {
    const o = s * 6;
    const b0 = sos[o], b1 = sos[o + 1], b2 = sos[o + 2], a1 = sos[o + 4], a2 = sos[o + 5];
    let s0 = state[s * 2], s1 = state[s * 2 + 1];
    let i = first;
    for (let k = 0; k < count; k++, i += step) {
      const x = buf[i];
      const y = b0 * x + s0;
      s0 = b1 * x - a1 * y + s1;
      s1 = b2 * x - a2 * y;
      buf[i] = y;
    }
    state[s * 2] = s0;
    state[s * 2 + 1] = s1;
  }
}

/**
 * Checks that sos is a non-empty n x 6 array of finite numbers with a0 = 1 in every section.
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
