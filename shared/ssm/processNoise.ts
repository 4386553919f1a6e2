/**
 * Process-noise covariances of the kinematic models, from integrating F(t) L q L' F(t)' over a step.
 */

/**
 * Continuous white-noise acceleration for the state [p, v]:
 * Q = q [[dt^3/3, dt^2/2], [dt^2/2, dt]], written row-major into `out` at `off` with row stride `stride`.
 * @param dtS - step in seconds (> 0)
 * @param q - spectral density of the acceleration noise, m^2/s^3
 * @param out - destination (row-major)
 * @param stride - row length of the destination matrix (2 for a 2x2 Q, 3 when embedded in a 3x3 Q)
 * @see Bar-Shalom, Li & Kirubarajan (2001), Estimation with Applications to Tracking and Navigation, ch. 6
 */
export function whiteNoiseAccelerationQ(dtS: number, q: number, out: Float64Array, stride = 2): void {
  const dt2 = dtS * dtS;
  out[0] = (q * dt2 * dtS) / 3;
  out[1] = (q * dt2) / 2;
  out[stride] = (q * dt2) / 2;
  out[stride + 1] = q * dtS;
}

/**
 * White jerk (continuous white-noise jerk) for the state [p, v, a]:
 * Q = q [[dt^5/20, dt^4/8, dt^3/6], [dt^4/8, dt^3/3, dt^2/2], [dt^3/6, dt^2/2, dt]], into `out` (3x3 row-major).
 * @param dtS - step in seconds (> 0)
 * @param q - spectral density of the jerk noise, m^2/s^5
 * @param out - destination, 9 entries
 * @see Bar-Shalom, Li & Kirubarajan (2001), Estimation with Applications to Tracking and Navigation, ch. 6
 */
export function whiteJerkQ(dtS: number, q: number, out: Float64Array): void {
  const d2 = dtS * dtS, d3 = d2 * dtS, d4 = d3 * dtS, d5 = d4 * dtS;
  out[0] = (q * d5) / 20; out[1] = (q * d4) / 8; out[2] = (q * d3) / 6;
  out[3] = (q * d4) / 8; out[4] = (q * d3) / 3; out[5] = (q * d2) / 2;
  out[6] = (q * d3) / 6; out[7] = (q * d2) / 2; out[8] = q * dtS;
}
