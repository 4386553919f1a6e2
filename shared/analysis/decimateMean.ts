/**
 * Block-mean decimation of a signal for display: at most `maxPoints` values, each the mean of a block.
 *
 * @param values - samples
 * @param rateHz - sampling rate, Hz
 * @param startS - time of sample 0, s
 * @param maxPoints - largest output length (>= 1)
 * @returns block centre times (s) and block means
 */
export function decimateMean(values: Float64Array | Float32Array, rateHz: number, startS: number, maxPoints: number): { timesS: Float64Array; values: Float64Array } {
  const n = values.length;
  const block = Math.max(1, Math.ceil(n / Math.max(1, maxPoints)));
  const m = Math.ceil(n / block);
  const t = new Float64Array(m);
  const v = new Float64Array(m);
  for (let j = 0; j < m; j++) {
    const a = j * block;
    const b = Math.min(n, a + block);
    let s = 0;
    for (let i = a; i < b; i++) s += values[i];
    v[j] = s / (b - a);
    t[j] = startS + ((a + b - 1) / 2) / rateHz;
  }
  return { timesS: t, values: v };
}
