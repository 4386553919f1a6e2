/**
 * A faster route through Butterworth band-pass sections for zero-phase filtering. A Butterworth band-pass of
 * order N has its N zeros at z = 1 and N at z = -1, so its numerator is k (1 - z^-2)^N. Written as N sections
 * that each take one zero of each kind, y = (x - x2) - a2 y2 - a1 y1 (direct form I), a section costs two
 * multiplies and three subtractions instead of the five multiplies and four additions of a general section, and
 * four sections run in one sweep over memory with all four recursions in flight. The transfer function is the
 * same as the sections' (same poles, same zeros, same gain); only the rounding differs (test/emg/bandCascade.test.ts).
 */
import { oddExtensions } from './oddExtensions';
import { loadShifted } from './sosKernel';
import type { Sos } from './zpkToSos';

/** The band-pass cascade of {@link bandCascadePlan}. */
export interface BandCascade {
  /** Overall gain: the product of the sections' b0. */
  gain: number;
  /** Denominators [a1, a2] of the sections, in the order of the input sections. */
  a: Float64Array;
  /** Sections per sweep over memory (4, then 2, then 1). */
  sweeps: number[];
}

/**
 * Recognises sections whose zeros all lie at z = 1 and z = -1, as many of each, with two poles in every section
 * (every Butterworth band-pass from butterworthSos or scipy.signal.butter). Each section's numerator must be
 * exactly b0 [1, 2, 1], b0 [1, -2, 1] or b0 [1, 0, -1] (as zpk2sos forms them from zeros at exactly +-1).
 * @param sos - sections, n x 6, a0 = 1
 * @returns the plan, or null when the sections have another shape (the general kernel then applies)
 */
export function bandCascadePlan(sos: Sos): BandCascade | null {
  const nSec = sos.length / 6;
  if (nSec < 1 || !Number.isInteger(nSec)) return null;
  let gain = 1;
  let atPlusOne = 0;
  let atMinusOne = 0;
  const a = new Float64Array(2 * nSec);
  for (let s = 0; s < nSec; s++) {
    const [b0, b1, b2, a0, a1, a2] = sos.subarray(6 * s, 6 * s + 6);
    if (a0 !== 1 || a2 === 0 || !(b0 !== 0) || !Number.isFinite(b0 * a1 * a2)) return null;
    if (b1 === 2 * b0 && b2 === b0) atMinusOne += 2;
    else if (b1 === -2 * b0 && b2 === b0) atPlusOne += 2;
    else if (b1 === 0 && b2 === -b0) {
      atPlusOne++;
      atMinusOne++;
    } else return null;
    gain *= b0;
    a[2 * s] = a1;
    a[2 * s + 1] = a2;
  }
  if (atPlusOne !== atMinusOne || !Number.isFinite(gain) || gain === 0) return null;
  const sweeps: number[] = [];
  let left = nSec;
  while (left >= 4) {
    sweeps.push(4);
    left -= 4;
  }
  if (left >= 2) {
    sweeps.push(2);
    left -= 2;
  }
  if (left === 1) sweeps.push(1);
  return { gain, a, sweeps };
}

/** Length of the state of a plan: per sweep of K sections, the input history (2) and 2 K output histories. */
function stateLength(plan: BandCascade): number {
  let n = 0;
  for (const k of plan.sweeps) n += 2 + 2 * k;
  return n;
}

/**
 * Sets the state to the steady state of a constant input c: every input history c, every output 0 (the
 * numerator (1 - z^-2) passes no constant), the same steady state as scipy's sosfilt_zi(sos) * c.
 */
function restAt(state: Float64Array, c: number): void {
  state.fill(0);
  state[0] = c;
  state[1] = c;
}

/**
 * Runs every sweep over buf[start..end) in place, forward or backward, carrying the state.
 * @param plan - the cascade
 * @param buf - samples, overwritten with the output (scaled by the gain)
 * @param start - first index (inclusive)
 * @param end - last index (exclusive)
 * @param backward - run from end - 1 down to start
 * @param state - sweep states (see stateLength), read and updated
 */
function run(plan: BandCascade, buf: Float64Array, start: number, end: number, backward: boolean, state: Float64Array): void {
  const count = end - start;
  if (count <= 0) return;
  const step = backward ? -1 : 1;
  const first = backward ? end - 1 : start;
  let section = 0;
  let o = 0;
  for (let i = 0; i < plan.sweeps.length; i++) {
    const k = plan.sweeps[i];
    const gain = i === plan.sweeps.length - 1 ? plan.gain : 1;
    if (k === 4) sweep4(plan.a, section, buf, first, count, step, state, o, gain);
    else if (k === 2) sweep2(plan.a, section, buf, first, count, step, state, o, gain);
    else sweep1(plan.a, section, buf, first, count, step, state, o, gain);
    section += k;
    o += 2 + 2 * k;
  }
}

/**
 * out = sosFiltFilt(sos, src - shift) for the band-pass cascade of plan: odd-extension padding of `edge`
 * samples, forward from the steady state of the first padded sample, backward from the steady state of the last
 * forward output (see sosFiltFilt). Arguments are not checked: out of src's length (may be src itself),
 * src.length > edge >= 0.
 * @param plan - from bandCascadePlan(sos)
 * @param src - input samples (not modified unless it is out)
 * @param shift - subtracted from every input sample
 * @param out - output buffer
 * @param edge - odd-extension length, samples
 * @see Gustafsson F. (1996) IEEE Trans Signal Process 44:988-992; scipy.signal.sosfiltfilt (scipy 1.10)
 */
export function bandFiltFilt(plan: BandCascade, src: Float64Array, shift: number, out: Float64Array, edge: number): void {
  const n = src.length;
  const { left, right } = oddExtensions(src, shift, edge);
  const x0 = src[0] - shift;
  loadShifted(src, shift, out, 0, n);
  const state = new Float64Array(stateLength(plan));
  restAt(state, edge > 0 ? left[0] : x0);
  run(plan, left, 0, edge, false, state);
  run(plan, out, 0, n, false, state);
  run(plan, right, 0, edge, false, state);
  restAt(state, edge > 0 ? right[edge - 1] : out[n - 1]);
  run(plan, right, 0, edge, true, state);
  run(plan, out, 0, n, true, state);
}

/**
 * Four sections, y = (x - x2) - a2 y2 - a1 y1 each, the last output scaled by gain.
 * @param a - [a1, a2] per section
 * @param s - first section of this sweep
 * @param buf - samples, in place
 * @param first - first index visited
 * @param count - samples
 * @param step - 1 forward, -1 backward
 * @param st - states; this sweep's are st[o..o + 10): x1, x2, then y1, y2 of each section
 * @param o - offset of this sweep's state
 * @param gain - output scale
 */
function sweep4(a: Float64Array, s: number, buf: Float64Array, first: number, count: number, step: number, st: Float64Array, o: number, gain: number): void {
  const a11 = a[2 * s], a12 = a[2 * s + 1], a21 = a[2 * s + 2], a22 = a[2 * s + 3];
  const a31 = a[2 * s + 4], a32 = a[2 * s + 5], a41 = a[2 * s + 6], a42 = a[2 * s + 7];
  let x1 = st[o], x2 = st[o + 1];
  let p1 = st[o + 2], p2 = st[o + 3], q1 = st[o + 4], q2 = st[o + 5];
  let r1 = st[o + 6], r2 = st[o + 7], u1 = st[o + 8], u2 = st[o + 9];
  let i = first;
  for (let k = 0; k < count; k++, i += step) {
    const x = buf[i];
    const p = x - x2 - a12 * p2 - a11 * p1;
    x2 = x1;
    x1 = x;
    const q = p - p2 - a22 * q2 - a21 * q1;
    p2 = p1;
    p1 = p;
    const r = q - q2 - a32 * r2 - a31 * r1;
    q2 = q1;
    q1 = q;
    const u = r - r2 - a42 * u2 - a41 * u1;
    r2 = r1;
    r1 = r;
    u2 = u1;
    u1 = u;
    buf[i] = gain * u;
  }
  st[o] = x1;
  st[o + 1] = x2;
  st[o + 2] = p1;
  st[o + 3] = p2;
  st[o + 4] = q1;
  st[o + 5] = q2;
  st[o + 6] = r1;
  st[o + 7] = r2;
  st[o + 8] = u1;
  st[o + 9] = u2;
}

/** Two sections (see sweep4); this sweep's state is st[o..o + 6). */
function sweep2(a: Float64Array, s: number, buf: Float64Array, first: number, count: number, step: number, st: Float64Array, o: number, gain: number): void {
  const a11 = a[2 * s], a12 = a[2 * s + 1], a21 = a[2 * s + 2], a22 = a[2 * s + 3];
  let x1 = st[o], x2 = st[o + 1];
  let p1 = st[o + 2], p2 = st[o + 3], q1 = st[o + 4], q2 = st[o + 5];
  let i = first;
  for (let k = 0; k < count; k++, i += step) {
    const x = buf[i];
    const p = x - x2 - a12 * p2 - a11 * p1;
    x2 = x1;
    x1 = x;
    const q = p - p2 - a22 * q2 - a21 * q1;
    p2 = p1;
    p1 = p;
    q2 = q1;
    q1 = q;
    buf[i] = gain * q;
  }
  st[o] = x1;
  st[o + 1] = x2;
  st[o + 2] = p1;
  st[o + 3] = p2;
  st[o + 4] = q1;
  st[o + 5] = q2;
}

/** One section (see sweep4); this sweep's state is st[o..o + 4). */
function sweep1(a: Float64Array, s: number, buf: Float64Array, first: number, count: number, step: number, st: Float64Array, o: number, gain: number): void {
  const a11 = a[2 * s], a12 = a[2 * s + 1];
  let x1 = st[o], x2 = st[o + 1];
  let p1 = st[o + 2], p2 = st[o + 3];
  let i = first;
  for (let k = 0; k < count; k++, i += step) {
    const x = buf[i];
    const p = x - x2 - a12 * p2 - a11 * p1;
    x2 = x1;
    x1 = x;
    p2 = p1;
    p1 = p;
    buf[i] = gain * p;
  }
  st[o] = x1;
  st[o + 1] = x2;
  st[o + 2] = p1;
  st[o + 3] = p2;
}
