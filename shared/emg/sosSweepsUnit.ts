/**
 * A variant of sweep4Split for cascades whose sections after the first have b0 = b2 = 1 (every Butterworth
 * low-pass, high-pass or band-pass from zpkToSos: the gain sits in the first section, the others are
 * (1, +-2, 1)). Multiplying by 1 is exact, so leaving those products out gives bit-identical results with
 * fewer multiplications per sample.
 */
import type { Sos } from './zpkToSos';

/**
 * Four sections, two chains in flight (see sweep4Split in sosSweeps.ts), for sections s+1..s+3 with b0 = b2 = 1
 * (checked by {@link hasUnitOuterTaps}); same arithmetic as sweep4Split.
 * @param sos - sections, n x 6 (a0 = 1)
 * @param buf - samples, filtered in place
 * @param s - index of the first section this sweep runs
 * @param first - index of the first sample visited
 * @param count - number of samples
 * @param step - 1 forward, -1 backward
 * @param state - n x 2 section states, read as initial and overwritten with final states
 * @param warm - start-up samples of the second chain (from settleSamples)
 * @param src - where the input is read (default buf; may be buf): sample i is src[i] - shift (x - 0 === x exactly)
 * @param shift - subtracted from every input sample as it is read (offset removal fused into the first pass)
 */
export function sweep4SplitUnit(
  sos: Sos,
  buf: Float64Array,
  s: number,
  first: number,
  count: number,
  step: number,
  state: Float64Array,
  warm: number,
  src: Float64Array = buf,
  shift = 0,
): void {
  const o = s * 6;
  const b10 = sos[o], b11 = sos[o + 1], b12 = sos[o + 2], a11 = sos[o + 4], a12 = sos[o + 5];
  const b21 = sos[o + 7], a21 = sos[o + 10], a22 = sos[o + 11];
  const b31 = sos[o + 13], a31 = sos[o + 16], a32 = sos[o + 17];
  const b41 = sos[o + 19], a41 = sos[o + 22], a42 = sos[o + 23];
  const z = s * 2;
  let s10 = state[z], s11 = state[z + 1], s20 = state[z + 2], s21 = state[z + 3];
  let s30 = state[z + 4], s31 = state[z + 5], s40 = state[z + 6], s41 = state[z + 7];
  let t10 = 0, t11 = 0, t20 = 0, t21 = 0, t30 = 0, t31 = 0, t40 = 0, t41 = 0;
  const half = (count + warm) >> 1;
  let i = first;
  let iB = first + (half - warm) * step;
  for (let k = 0; k < half; k++, i += step, iB += step) {
    const x = src[i] - shift;
    const u = src[iB] - shift;
    const y1 = b10 * x + s10;
    const v1 = b10 * u + t10;
    s10 = b11 * x + s11 - a11 * y1;
    t10 = b11 * u + t11 - a11 * v1;
    s11 = b12 * x - a12 * y1;
    t11 = b12 * u - a12 * v1;
    const y2 = y1 + s20;
    const v2 = v1 + t20;
    s20 = b21 * y1 + s21 - a21 * y2;
    t20 = b21 * v1 + t21 - a21 * v2;
    s21 = y1 - a22 * y2;
    t21 = v1 - a22 * v2;
    const y3 = y2 + s30;
    const v3 = v2 + t30;
    s30 = b31 * y2 + s31 - a31 * y3;
    t30 = b31 * v2 + t31 - a31 * v3;
    s31 = y2 - a32 * y3;
    t31 = v2 - a32 * v3;
    const y4 = y3 + s40;
    const v4 = v3 + t40;
    s40 = b41 * y3 + s41 - a41 * y4;
    t40 = b41 * v3 + t41 - a41 * v4;
    s41 = y3 - a42 * y4;
    t41 = v3 - a42 * v4;
    buf[i] = y4;
    if (k >= warm) buf[iB] = v4;
  }
  for (let k = half + (half - warm); k < count; k++, iB += step) {
    const u = src[iB] - shift;
    const v1 = b10 * u + t10;
    t10 = b11 * u + t11 - a11 * v1;
    t11 = b12 * u - a12 * v1;
    const v2 = v1 + t20;
    t20 = b21 * v1 + t21 - a21 * v2;
    t21 = v1 - a22 * v2;
    const v3 = v2 + t30;
    t30 = b31 * v2 + t31 - a31 * v3;
    t31 = v2 - a32 * v3;
    const v4 = v3 + t40;
    t40 = b41 * v3 + t41 - a41 * v4;
    t41 = v3 - a42 * v4;
    buf[iB] = v4;
  }
  state[z] = t10;
  state[z + 1] = t11;
  state[z + 2] = t20;
  state[z + 3] = t21;
  state[z + 4] = t30;
  state[z + 5] = t31;
  state[z + 6] = t40;
  state[z + 7] = t41;
}

/**
 * Whether sections s+1..s+3 all have b0 = b2 = 1 exactly (so that {@link sweep4SplitUnit} applies).
 * @param sos - sections, n x 6
 * @param s - index of the first of four sections
 * @returns true when the three later sections have unit outer taps
 */
export function hasUnitOuterTaps(sos: Sos, s: number): boolean {
  for (let t = s + 1; t < s + 4; t++) if (sos[t * 6] !== 1 || sos[t * 6 + 2] !== 1) return false;
  return true;
}
