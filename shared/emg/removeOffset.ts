/**
 * DC offset removal.
 */

/**
 * Mean of the finite samples of x (NaN when there is none).
 * @param x - samples
 * @returns the mean of the finite samples
 */
export function finiteMean(x: Float64Array | Float32Array): number {
  let sum = 0;
  let n = 0;
  for (let i = 0; i < x.length; i++) {
    const v = x[i];
    if (Number.isFinite(v)) {
      sum += v;
      n++;
    }
  }
  return n > 0 ? sum / n : NaN;
}

/**
 * Subtracts the mean of the finite samples (DC offset); NaN samples stay NaN.
 * @param x - samples (not modified unless passed as out)
 * @param out - optional output of x's length (may be x when x is a Float64Array)
 * @returns x minus its finite mean
 * @throws RangeError when out has the wrong length
 */
export function removeOffset(x: Float64Array | Float32Array, out?: Float64Array): Float64Array {
  if (out && out.length !== x.length) throw new RangeError(`removeOffset: out has ${out.length} samples, input has ${x.length}`);
  const y = out ?? new Float64Array(x.length);
  const m = finiteMean(x);
  const offset = Number.isFinite(m) ? m : 0;
  for (let i = 0; i < x.length; i++) y[i] = x[i] - offset;
  return y;
}
