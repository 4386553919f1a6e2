/**
 * Teager-Kaiser energy operator.
 */

/**
 * Teager-Kaiser energy operator psi[x(n)] = x(n)^2 - x(n+1) x(n-1) for n = 1 .. N-2; the end samples take
 * their neighbour's value (psi[0] = psi[1], psi[N-1] = psi[N-2]).
 * @param x - samples (at least 3)
 * @param out - optional output of x's length (must not be x)
 * @returns psi
 * @throws RangeError when x has fewer than 3 samples, or out has the wrong length or is x
 * @see Kaiser J.F. (1990) On a simple algorithm to calculate the 'energy' of a signal, Proc IEEE ICASSP
 *   381-384; Li X., Zhou P. & Aruin A.S. (2007) Ann Biomed Eng 35:1532-1538 (as EMG onset conditioning)
 */
export function tkeo(x: Float64Array | Float32Array, out?: Float64Array): Float64Array {
  const n = x.length;
  if (n < 3) throw new RangeError(`tkeo: needs at least 3 samples, got ${n}`);
  if (out && out.length !== n) throw new RangeError(`tkeo: out has ${out.length} samples, input has ${n}`);
  if (out && (out as unknown) === x) throw new RangeError('tkeo: out must not be the input');
  const y = out ?? new Float64Array(n);
  // psi[x(n)] = x(n)^2 - x(n+1) x(n-1)
  for (let i = 1; i < n - 1; i++) y[i] = x[i] * x[i] - x[i + 1] * x[i - 1];
  y[0] = y[1];
  y[n - 1] = y[n - 2];
  return y;
}
