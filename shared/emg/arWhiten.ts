/**
 * Whitening by an autoregressive prediction-error filter fitted on a baseline span.
 */

/**
 * Autoregressive coefficients a1..ap of x[from..to) by the Yule-Walker equations solved with the
 * Levinson-Durbin recursion (biased autocorrelation, mean removed, NaN samples skipped):
 * x(n) + a1 x(n-1) + ... + ap x(n-p) = e(n).
 * @param x - samples
 * @param from - fit span start (inclusive)
 * @param to - fit span end (exclusive)
 * @param order - model order p (>= 0)
 * @returns Float64Array of p coefficients (all zeros when the span has zero variance or too few samples)
 * @see Levinson N. (1947) J Math Phys 25:261-278; Durbin J. (1960) Rev Int Stat Inst 28:233-244
 */
export function fitAutoregressive(x: ArrayLike<number>, from: number, to: number, order: number): Float64Array {
  const a = new Float64Array(order);
  const n = to - from;
  if (order === 0 || n <= 2 * order) return a;
  let mean = 0;
  let count = 0;
  for (let i = from; i < to; i++) if (x[i] === x[i]) { mean += x[i]; count++; }
  if (count === 0) return a;
  mean /= count;
  const r = new Float64Array(order + 1);
  for (let k = 0; k <= order; k++) {
    let s = 0;
    for (let i = from + k; i < to; i++) {
      const p = (x[i] - mean) * (x[i - k] - mean);
      if (p === p) s += p;
    }
    r[k] = s / count;
  }
  if (!(r[0] > 0)) return a;
  // Levinson-Durbin: a^(m) = a^(m-1) + k_m * reversed(a^(m-1)), k_m = -(r_m + sum a_j r_{m-j}) / E_{m-1}
  let err = r[0];
  const prev = new Float64Array(order);
  for (let m = 1; m <= order; m++) {
    let acc = r[m];
    for (let j = 1; j < m; j++) acc += a[j - 1] * r[m - j];
    const km = -acc / err;
    prev.set(a);
    for (let j = 1; j < m; j++) a[j - 1] = prev[j - 1] + km * prev[m - j - 1];
    a[m - 1] = km;
    err *= 1 - km * km;
    if (!(err > 0)) break;
  }
  return a;
}

/**
 * Prediction error e(n) = x(n) + a1 x(n-1) + ... + ap x(n-p) (the first p samples use the terms available).
 * @param x - samples
 * @param a - AR coefficients from {@link fitAutoregressive}
 * @param out - optional output of x's length (must not be x)
 * @returns the whitened samples
 */
export function whiten(x: ArrayLike<number>, a: Float64Array, out?: Float64Array): Float64Array {
  const n = x.length;
  const y = out ?? new Float64Array(n);
  const p = a.length;
  for (let i = 0; i < n; i++) {
    let e = x[i];
    const kmax = Math.min(p, i);
    for (let k = 1; k <= kmax; k++) e += a[k - 1] * x[i - k];
    y[i] = e;
  }
  return y;
}
