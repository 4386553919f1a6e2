/**
 * Zero-phase filtering of a derived signal (|x| or |TKEO(x)|) without first writing the derived signal out:
 * the map is applied as the forward pass reads its input. Same arithmetic as mapping into the output buffer
 * and calling sosFiltFilt on it in place, so the results are bit-identical; one pass over memory fewer.
 */
import { sosFiltZi } from './sosFilt';
import { defaultPadLength } from './sosFiltFilt';
import { sosFilterInPlace } from './sosKernel';
import { settleSamples } from './sosSweeps';
import type { Sos } from './zpkToSos';

/** What the forward pass reads: 'abs' |x(n)|, 'tkeo-abs' |x(n)^2 - x(n+1) x(n-1)| with the end samples copying their neighbour. */
export type InputMap = 'abs' | 'tkeo-abs';

/**
 * The mapped input at index j (see {@link InputMap}); for 'tkeo-abs' the end samples take their neighbour's value,
 * as tkeo() does.
 * @param src - samples (at least 3)
 * @param j - index
 * @param last - src.length - 1
 * @param tkeo - true for 'tkeo-abs', false for 'abs'
 * @returns the mapped value
 */
function mapped(src: Float64Array, j: number, last: number, tkeo: boolean): number {
  if (!tkeo) return Math.abs(src[j]);
  const k = j < 1 ? 1 : j >= last ? last - 1 : j;
  const b = src[k];
  return Math.abs(b * b - src[k + 1] * src[k - 1]);
}

/**
 * sosFiltFilt(sos, map(src)) written into out, for one second-order section long enough for sweep1's
 * four-chain direct form I path (the filters of the envelope and of the TKEO statistic); other cases return false
 * and leave the work to the caller's plain path.
 * @param sos - one section (6 coefficients, a0 = 1, checked by the caller's design)
 * @param src - input samples (not modified; must not be out)
 * @param out - output of src's length
 * @param map - the map applied to the input
 * @returns true when done; false when this path does not apply or (for 'tkeo-abs') a mapped value was not
 *   finite, in which case out holds no result
 */
export function sosFiltFiltMapped(sos: Sos, src: Float64Array, out: Float64Array, map: InputMap): boolean {
  const n = src.length;
  if (sos.length !== 6 || out.length !== n || out.buffer === src.buffer || n < 3) return false;
  const edge = defaultPadLength(sos);
  const a1 = sos[4];
  const a2 = sos[5];
  const warm = settleSamples(a1, a2);
  if (!(n > edge) || edge === 0 || Math.abs(a2) < 0.1 || !(warm > 0 && n > 8 * warm)) return false;
  const tkeo = map === 'tkeo-abs';
  const last = n - 1;
  const left = new Float64Array(edge);
  const right = new Float64Array(edge);
  const m0 = mapped(src, 0, last, tkeo);
  const mn = mapped(src, last, last, tkeo);
  for (let i = 0; i < edge; i++) {
    left[i] = 2 * m0 - mapped(src, edge - i, last, tkeo);
    right[i] = 2 * mn - mapped(src, n - 2 - i, last, tkeo);
  }
  const zi = sosFiltZi(sos);
  const state = new Float64Array(2);
  state[0] = zi[0] * left[0];
  state[1] = zi[1] * left[0];
  sosFilterInPlace(sos, left, 0, edge, false, state);
  forwardMapped(sos, src, out, state, warm, tkeo);
  // A non-finite input value stays non-finite in every later output of its chain (no finite arithmetic turns
  // Inf or NaN finite again), and every index lies in one chain's own range, so checking the chains' last outputs
  // finds any.
  const L = Math.ceil(n / 4);
  if (!(Number.isFinite(out[L - 1]) && Number.isFinite(out[2 * L - 1]) && Number.isFinite(out[3 * L - 1]) && Number.isFinite(out[n - 1]))) return false;
  sosFilterInPlace(sos, right, 0, edge, false, state);
  const first = right[edge - 1];
  state[0] = zi[0] * first;
  state[1] = zi[1] * first;
  sosFilterInPlace(sos, right, 0, edge, true, state);
  sosFilterInPlace(sos, out, 0, n, true, state);
  return true;
}

/**
 * sweep1's four-chain direct form I forward pass over all of src, reading mapped(src) and writing out
 * (see sweep1 in sosSweeps.ts for the chains and their start-up).
 */
function forwardMapped(sos: Sos, src: Float64Array, out: Float64Array, state: Float64Array, warm: number, tkeo: boolean): void {
  const count = src.length;
  const last = count - 1;
  const b0 = sos[0], b1 = sos[1], b2 = sos[2], a1 = sos[4], a2 = sos[5];
  let x1 = 0, x2 = 0;
  let y1 = -state[1] / a2;
  let y2 = (-state[0] - a1 * y1) / a2;
  const L = Math.ceil(count / 4);
  const R = count - 3 * L;
  let p1 = 0, q1 = 0, p2 = 0, q2 = 0;
  let c1 = 0, d1 = 0, c2 = 0, d2 = 0;
  let e1 = 0, f1 = 0, e2 = 0, f2 = 0;
  let i = 0;
  let iB = L - warm;
  let iC = 2 * L - warm;
  let iD = 3 * L - warm;
  for (let j = 0; j < warm; j++, iB++, iC++, iD++) {
    const u = mapped(src, iB, last, tkeo);
    const v = b0 * u + b1 * p1 + b2 * p2 - a2 * q2 - a1 * q1;
    p2 = p1; p1 = u; q2 = q1; q1 = v;
    const w = mapped(src, iC, last, tkeo);
    const z = b0 * w + b1 * c1 + b2 * c2 - a2 * d2 - a1 * d1;
    c2 = c1; c1 = w; d2 = d1; d1 = z;
    const g = mapped(src, iD, last, tkeo);
    const h = b0 * g + b1 * e1 + b2 * e2 - a2 * f2 - a1 * f1;
    e2 = e1; e1 = g; f2 = f1; f1 = h;
  }
  for (let j = 0; j < R; j++, i++, iB++, iC++, iD++) {
    const x = mapped(src, i, last, tkeo);
    const y = b0 * x + b1 * x1 + b2 * x2 - a2 * y2 - a1 * y1;
    x2 = x1; x1 = x; y2 = y1; y1 = y;
    const u = mapped(src, iB, last, tkeo);
    const v = b0 * u + b1 * p1 + b2 * p2 - a2 * q2 - a1 * q1;
    p2 = p1; p1 = u; q2 = q1; q1 = v;
    const w = mapped(src, iC, last, tkeo);
    const z = b0 * w + b1 * c1 + b2 * c2 - a2 * d2 - a1 * d1;
    c2 = c1; c1 = w; d2 = d1; d1 = z;
    const g = mapped(src, iD, last, tkeo);
    const h = b0 * g + b1 * e1 + b2 * e2 - a2 * f2 - a1 * f1;
    e2 = e1; e1 = g; f2 = f1; f1 = h;
    out[i] = y;
    out[iB] = v;
    out[iC] = z;
    out[iD] = h;
  }
  for (let j = R; j < L; j++, i++, iB++, iC++) {
    const x = mapped(src, i, last, tkeo);
    const y = b0 * x + b1 * x1 + b2 * x2 - a2 * y2 - a1 * y1;
    x2 = x1; x1 = x; y2 = y1; y1 = y;
    out[i] = y;
    const u = mapped(src, iB, last, tkeo);
    const v = b0 * u + b1 * p1 + b2 * p2 - a2 * q2 - a1 * q1;
    p2 = p1; p1 = u; q2 = q1; q1 = v;
    out[iB] = v;
    const w = mapped(src, iC, last, tkeo);
    const z = b0 * w + b1 * c1 + b2 * c2 - a2 * d2 - a1 * d1;
    c2 = c1; c1 = w; d2 = d1; d1 = z;
    out[iC] = z;
  }
  // Chain D holds the final history (see sweep1).
  state[0] = b1 * e1 + b2 * e2 - a1 * f1 - a2 * f2;
  state[1] = b2 * e1 - a2 * f1;
}
