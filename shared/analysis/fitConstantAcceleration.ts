/**
 * Least-squares fit of h(t) = c0 + c1 t + a t^2 / 2 to the finite heights in [fromS, toS], with the standard
 * error of a from the residual variance (ordinary least squares, normal equations solved by Cramer's rule on
 * the centred times).
 *
 * @param timesS - sample times, s
 * @param heightM - heights, m (NaN skipped)
 * @param fromS - window start, s
 * @param toS - window end, s
 * @returns acceleration m/s^2 (up positive) and its SE; NaN when fewer than 4 samples
 * @see Draper & Smith 1998, Applied Regression Analysis, ch. 5 (polynomial regression)
 */
export function fitConstantAcceleration(timesS: Float64Array, heightM: Float64Array, fromS: number, toS: number): { accMps2: number; sdMps2: number } {
  let n = 0;
  let tm = 0;
  for (let i = 0; i < timesS.length; i++) {
    if (timesS[i] >= fromS && timesS[i] <= toS && Number.isFinite(heightM[i])) {
      n++;
      tm += timesS[i];
    }
  }
  if (n < 4) return { accMps2: NaN, sdMps2: NaN };
  tm /= n;
  // sums of powers of u = t - tm, with columns [1, u, u^2/2]
  let s0 = 0, s1 = 0, s2 = 0, s3 = 0, s4 = 0, y0 = 0, y1 = 0, y2 = 0;
  for (let i = 0; i < timesS.length; i++) {
    if (!(timesS[i] >= fromS && timesS[i] <= toS && Number.isFinite(heightM[i]))) continue;
    const u = timesS[i] - tm;
    const q = 0.5 * u * u;
    const y = heightM[i];
    s0 += 1; s1 += u; s2 += u * u; s3 += u * q; s4 += q * q;
    y0 += y; y1 += u * y; y2 += q * y;
  }
  const sq = s2 / 2; // sum of q
  // normal matrix M = [[s0, s1, sq], [s1, s2, s3], [sq, s3, s4]]
  const M = [s0, s1, sq, s1, s2, s3, sq, s3, s4];
  const det = (m: number[]): number => m[0] * (m[4] * m[8] - m[5] * m[7]) - m[1] * (m[3] * m[8] - m[5] * m[6]) + m[2] * (m[3] * m[7] - m[4] * m[6]);
  const D = det(M);
  if (!(Math.abs(D) > 0)) return { accMps2: NaN, sdMps2: NaN };
  const c0 = det([y0, s1, sq, y1, s2, s3, y2, s3, s4]) / D;
  const c1 = det([s0, y0, sq, s1, y1, s3, sq, y2, s4]) / D;
  const a = det([s0, s1, y0, s1, s2, y1, sq, s3, y2]) / D;
  let rss = 0;
  for (let i = 0; i < timesS.length; i++) {
    if (!(timesS[i] >= fromS && timesS[i] <= toS && Number.isFinite(heightM[i]))) continue;
    const u = timesS[i] - tm;
    const r = heightM[i] - (c0 + c1 * u + a * 0.5 * u * u);
    rss += r * r;
  }
  const sigma2 = rss / Math.max(n - 3, 1);
  // (M^-1)[2][2] = minor / det
  const inv22 = (s0 * s2 - s1 * s1) / D;
  return { accMps2: a, sdMps2: Math.sqrt(Math.max(sigma2 * inv22, 0)) };
}
