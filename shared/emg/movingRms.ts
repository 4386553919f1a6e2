/**
 * Moving root-mean-square amplitude.
 */

/**
 * Centred moving RMS: sqrt(mean of x^2 over the samples i - h .. i + h), the window shortened at the ends;
 * NaN samples are left out of the mean (the output is NaN only where the whole window is NaN).
 * @param x - samples
 * @param windowSamples - window length in samples (odd; an even length is rounded up to the next odd)
 * @param out - optional output of x's length (must not be x)
 * @returns the moving RMS
 * @throws RangeError when the window is not a positive integer or out has the wrong length or is x
 * @see Merletti R. (1999) Standards for reporting EMG data, J Electromyogr Kinesiol 9(1) (RMS amplitude)
 */
export function movingRms(x: Float64Array | Float32Array, windowSamples: number, out?: Float64Array): Float64Array {
  if (!Number.isInteger(windowSamples) || !(windowSamples >= 1)) {
    throw new RangeError(`movingRms: window must be a positive whole number of samples, got ${windowSamples}`);
  }
  if (out && out.length !== x.length) throw new RangeError(`movingRms: out has ${out.length} samples, input has ${x.length}`);
  if (out && (out as unknown) === x) throw new RangeError('movingRms: out must not be the input');
  const n = x.length;
  const y = out ?? new Float64Array(n);
  const h = Math.floor(windowSamples / 2);
  let sum = 0;
  let count = 0;
  const add = (j: number, sign: 1 | -1): void => {
    const v = x[j];
    if (v === v) {
      sum += sign * v * v;
      count += sign;
    }
  };
  for (let j = 0; j < Math.min(h, n); j++) add(j, 1);
  for (let i = 0; i < n; i++) {
    if (i + h < n) add(i + h, 1);
    if (i - h - 1 >= 0) add(i - h - 1, -1);
    // A running sum can drift below zero by rounding; recompute exactly every 4096 samples.
    if ((i & 4095) === 4095) {
      sum = 0;
      count = 0;
      for (let j = Math.max(0, i - h); j <= Math.min(n - 1, i + h); j++) add(j, 1);
    }
    y[i] = count > 0 ? Math.sqrt(Math.max(0, sum) / count) : NaN;
  }
  return y;
}
