/**
 * The loops behind sosFilterInPlace: one or two second-order sections per sweep over memory, with one,
 * two or four independent recursions in flight (see sosKernel.ts). Direct form II transposed unless stated.
 */
import type { Sos } from './zpkToSos';

/**
 * One section. With a2 far enough from 0 it runs in direct form I, y = ((b0 x + b1 x1 + b2 x2) - a2 y2) - a1 y1,
 * whose loop-carried chain (one multiply and one subtract) is shorter than direct form II transposed; the
 * DF2T states are mapped to an equivalent DF1 history (past inputs 0) on entry and back on exit.
 * @param sos - sections, n x 6 (a0 = 1)
 * @param buf - samples, filtered in place
 * @param s - index of the first section this sweep runs
 * @param first - index of the first sample visited
 * @param count - number of samples
 * @param step - 1 forward, -1 backward
 * @param state - n x 2 section states, read as initial and overwritten with final states
 */
export function sweep1(sos: Sos, buf: Float64Array, s: number, first: number, count: number, step: number, state: Float64Array): void {
  const o = s * 6;
  const b0 = sos[o], b1 = sos[o + 1], b2 = sos[o + 2], a1 = sos[o + 4], a2 = sos[o + 5];
  let i = first;
  if (Math.abs(a2) < 0.1) {
    let s0 = state[s * 2], s1 = state[s * 2 + 1];
    for (let k = 0; k < count; k++, i += step) {
      const x = buf[i];
      const y = b0 * x + s0;
      s0 = b1 * x + s1 - a1 * y;
      s1 = b2 * x - a2 * y;
      buf[i] = y;
    }
    state[s * 2] = s0;
    state[s * 2 + 1] = s1;
    return;
  }
  // s0 = -a1 y1 - a2 y2 and s1 = -a2 y1 with x1 = x2 = 0
  let x1 = 0, x2 = 0;
  let y1 = -state[s * 2 + 1] / a2;
  let y2 = (-state[s * 2] - a1 * y1) / a2;
  const warm = settleSamples(a1, a2);
  let k = 0;
  if (warm > 0 && count > 8 * warm) {
    // Four chains in flight. Chain c (0..3) writes samples [c L, (c + 1) L) (the last one up to count); chains 1-3
    // first run `warm` samples before their range from rest, by which time their start-up error has decayed
    // below 1e-18 of the state. Every chain reads an input before the chain to its left overwrites it.
    const L = Math.ceil(count / 4);
    const R = count - 3 * L;
    let p1 = 0, q1 = 0, p2 = 0, q2 = 0;
    let c1 = 0, d1 = 0, c2 = 0, d2 = 0;
    let e1 = 0, f1 = 0, e2 = 0, f2 = 0;
    let iB = first + (L - warm) * step;
    let iC = first + (2 * L - warm) * step;
    let iD = first + (3 * L - warm) * step;
    for (let j = 0; j < warm; j++, iB += step, iC += step, iD += step) {
      const u = buf[iB];
      const v = b0 * u + b1 * p1 + b2 * p2 - a2 * q2 - a1 * q1;
      p2 = p1; p1 = u; q2 = q1; q1 = v;
      const w = buf[iC];
      const z = b0 * w + b1 * c1 + b2 * c2 - a2 * d2 - a1 * d1;
      c2 = c1; c1 = w; d2 = d1; d1 = z;
      const g = buf[iD];
      const h = b0 * g + b1 * e1 + b2 * e2 - a2 * f2 - a1 * f1;
      e2 = e1; e1 = g; f2 = f1; f1 = h;
    }
    for (let j = 0; j < R; j++, i += step, iB += step, iC += step, iD += step) {
      const x = buf[i];
      const y = b0 * x + b1 * x1 + b2 * x2 - a2 * y2 - a1 * y1;
      x2 = x1; x1 = x; y2 = y1; y1 = y;
      const u = buf[iB];
      const v = b0 * u + b1 * p1 + b2 * p2 - a2 * q2 - a1 * q1;
      p2 = p1; p1 = u; q2 = q1; q1 = v;
      const w = buf[iC];
      const z = b0 * w + b1 * c1 + b2 * c2 - a2 * d2 - a1 * d1;
      c2 = c1; c1 = w; d2 = d1; d1 = z;
      const g = buf[iD];
      const h = b0 * g + b1 * e1 + b2 * e2 - a2 * f2 - a1 * f1;
      e2 = e1; e1 = g; f2 = f1; f1 = h;
      buf[i] = y;
      buf[iB] = v;
      buf[iC] = z;
      buf[iD] = h;
    }
    // Chains 0-2 have L - R (at most 3) samples left; chain 3 is done and holds the final history.
    for (let j = R; j < L; j++, i += step, iB += step, iC += step) {
      const x = buf[i];
      const y = b0 * x + b1 * x1 + b2 * x2 - a2 * y2 - a1 * y1;
      x2 = x1; x1 = x; y2 = y1; y1 = y;
      buf[i] = y;
      const u = buf[iB];
      const v = b0 * u + b1 * p1 + b2 * p2 - a2 * q2 - a1 * q1;
      p2 = p1; p1 = u; q2 = q1; q1 = v;
      buf[iB] = v;
      const w = buf[iC];
      const z = b0 * w + b1 * c1 + b2 * c2 - a2 * d2 - a1 * d1;
      c2 = c1; c1 = w; d2 = d1; d1 = z;
      buf[iC] = z;
    }
    k = count;
    x1 = e1; x2 = e2; y1 = f1; y2 = f2;
  }
  for (; k < count; k++, i += step) {
    const x = buf[i];
    const y = b0 * x + b1 * x1 + b2 * x2 - a2 * y2 - a1 * y1;
    x2 = x1;
    x1 = x;
    y2 = y1;
    y1 = y;
    buf[i] = y;
  }
  state[s * 2] = b1 * x1 + b2 * x2 - a1 * y1 - a2 * y2;
  state[s * 2 + 1] = b2 * x1 - a2 * y1;
}

/**
 * Two sections, two chains in flight (see sweep1): chain A runs the first `half` samples from the given
 * states, chain B starts `warm` samples before `half` from rest and writes from `half` on.
 * @param sos - sections, n x 6 (a0 = 1)
 * @param buf - samples, filtered in place
 * @param s - index of the first section this sweep runs
 * @param first - index of the first sample visited
 * @param count - number of samples
 * @param step - 1 forward, -1 backward
 * @param state - n x 2 section states, read as initial and overwritten with final states
 * @param warm - start-up samples of the second chain (from settleSamples)
 */
export function sweep2Split(sos: Sos, buf: Float64Array, s: number, first: number, count: number, step: number, state: Float64Array, warm: number): void {
  const o = s * 6;
  const b10 = sos[o], b11 = sos[o + 1], b12 = sos[o + 2], a11 = sos[o + 4], a12 = sos[o + 5];
  const b20 = sos[o + 6], b21 = sos[o + 7], b22 = sos[o + 8], a21 = sos[o + 10], a22 = sos[o + 11];
  let s10 = state[s * 2], s11 = state[s * 2 + 1], s20 = state[s * 2 + 2], s21 = state[s * 2 + 3];
  let t10 = 0, t11 = 0, t20 = 0, t21 = 0;
  const half = (count + warm) >> 1;
  let i = first;
  let iB = first + (half - warm) * step;
  for (let k = 0; k < half; k++, i += step, iB += step) {
    const x = buf[i];
    const y1 = b10 * x + s10;
    s10 = b11 * x + s11 - a11 * y1;
    s11 = b12 * x - a12 * y1;
    const y2 = b20 * y1 + s20;
    s20 = b21 * y1 + s21 - a21 * y2;
    s21 = b22 * y1 - a22 * y2;
    const u = buf[iB];
    const v1 = b10 * u + t10;
    t10 = b11 * u + t11 - a11 * v1;
    t11 = b12 * u - a12 * v1;
    const v2 = b20 * v1 + t20;
    t20 = b21 * v1 + t21 - a21 * v2;
    t21 = b22 * v1 - a22 * v2;
    buf[i] = y2;
    if (k >= warm) buf[iB] = v2;
  }
  // Chain B finishes alone (at most one sample).
  for (let k = half + (half - warm); k < count; k++, iB += step) {
    const u = buf[iB];
    const v1 = b10 * u + t10;
    t10 = b11 * u + t11 - a11 * v1;
    t11 = b12 * u - a12 * v1;
    const v2 = b20 * v1 + t20;
    t20 = b21 * v1 + t21 - a21 * v2;
    t21 = b22 * v1 - a22 * v2;
    buf[iB] = v2;
  }
  state[s * 2] = t10;
  state[s * 2 + 1] = t11;
  state[s * 2 + 2] = t20;
  state[s * 2 + 3] = t21;
}

/**
 * Samples after which the free response of 1 / (1 + a1 z^-1 + a2 z^-2) has decayed by 1e-18 (with a factor 2
 * margin for nearly repeated poles); 0 when a pole is too close to the unit circle for that to be useful.
 * @param a1 - section denominator coefficient a1
 * @param a2 - section denominator coefficient a2
 * @returns samples, or 0
 */
export function settleSamples(a1: number, a2: number): number {
  const disc = a1 * a1 - 4 * a2;
  const r = disc < 0 ? Math.sqrt(a2) : Math.max(Math.abs((-a1 + Math.sqrt(disc)) / 2), Math.abs((-a1 - Math.sqrt(disc)) / 2));
  if (!(r < 0.9999)) return 0;
  if (r === 0) return 4;
  return 2 * Math.ceil(Math.log(1e-18) / Math.log(r)) + 4;
}
