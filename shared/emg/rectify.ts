/**
 * Full-wave rectification.
 */

/**
 * Full-wave rectification |x(n)|.
 * @param x - samples (not modified unless passed as out)
 * @param out - optional output of x's length (may be x when x is a Float64Array)
 * @returns |x|
 * @throws RangeError when out has the wrong length
 */
export function rectify(x: Float64Array | Float32Array, out?: Float64Array): Float64Array {
  if (out && out.length !== x.length) throw new RangeError(`rectify: out has ${out.length} samples, input has ${x.length}`);
  const y = out ?? new Float64Array(x.length);
  for (let i = 0; i < x.length; i++) y[i] = Math.abs(x[i]);
  return y;
}
