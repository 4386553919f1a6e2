/**
 * One-pass (causal) filtering through second-order sections, and the steady-state initial conditions
 * used to start a filter without a transient.
 */
import { checkSos, sosFilterInPlace } from './sosKernel';
import type { Sos } from './zpkToSos';

/**
 * Initial section states for a step response in steady state: filtering a constant c from states c * zi
 * gives a constant output. Per section (b, a), the direct form II transposed steady state solves
 * (I - A^T) zi = b[1:] - a[1:] b0, scaled by the DC gain of the sections before it.
 * @param sos - sections, n x 6, a0 = 1
 * @returns zi, n x 2 (row-major)
 * @throws RangeError for malformed sections or a section with a pole at z = 1 (no steady state)
 * @see scipy.signal.sosfilt_zi and lfilter_zi (scipy 1.10), whose definition this follows
 */
export function sosFiltZi(sos: Sos): Float64Array {
  checkSos(sos, 'sosFiltZi');
  const n = sos.length / 6;
  const zi = new Float64Array(n * 2);
  let scale = 1;
  for (let s = 0; s < n; s++) {
    const o = s * 6;
    const [b0, b1, b2, , a1, a2] = [sos[o], sos[o + 1], sos[o + 2], sos[o + 3], sos[o + 4], sos[o + 5]];
    const den = 1 + a1 + a2;
    if (den === 0) throw new RangeError(`sosFiltZi: section ${s} has a pole at z = 1 (no steady state)`);
    const B0 = b1 - a1 * b0;
    const B1 = b2 - a2 * b0;
    // (I - A^T) = [[1 + a1, -1], [a2, 1]]: zi0 = (B0 + B1) / (1 + a1 + a2), zi1 = B1 - a2 zi0
    const z0 = (B0 + B1) / den;
    zi[s * 2] = scale * z0;
    zi[s * 2 + 1] = scale * (B1 - a2 * z0);
    scale *= (b0 + b1 + b2) / den;
  }
  return zi;
}

/**
 * Causal filtering through second-order sections (direct form II transposed), like scipy.signal.sosfilt.
 * @param sos - sections, n x 6, a0 = 1
 * @param x - input samples (not modified)
 * @param zi - optional initial states n x 2 (default zeros); not modified
 * @param out - optional output buffer of x's length (may be x itself when x is a Float64Array)
 * @returns the filtered samples (out when given)
 * @throws RangeError for malformed sections, a wrong zi length or a wrong out length
 * @see scipy.signal.sosfilt (scipy 1.10)
 */
export function sosFilt(sos: Sos, x: Float64Array | Float32Array, zi?: Float64Array, out?: Float64Array): Float64Array {
  checkSos(sos, 'sosFilt');
  const n = sos.length / 6;
  if (zi && zi.length !== n * 2) throw new RangeError(`sosFilt: zi must have ${n * 2} values (n sections x 2), got ${zi.length}`);
  if (out && out.length !== x.length) throw new RangeError(`sosFilt: out has ${out.length} samples, input has ${x.length}`);
  const y = out ?? new Float64Array(x.length);
  if (y !== x) y.set(x);
  const state = zi ? Float64Array.from(zi) : new Float64Array(n * 2);
  sosFilterInPlace(sos, y, 0, y.length, false, state);
  return y;
}
