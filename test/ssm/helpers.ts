/**
 * Test helpers for the state-space engine: seeded random numbers and small models.
 */
import type { StateSpaceModel } from '../../shared/ssm/stateSpaceModel';
import { whiteNoiseAccelerationQ } from '../../shared/ssm/processNoise';
import { seededRandom } from '../seededRandom';

/** Seeded uniform generator (mulberry32) and standard normals by Box-Muller. */
export function rng(seed: number): { uniform(): number; normal(): number } {
  const uniform = seededRandom(seed);
  let spare = NaN;
  const normal = (): number => {
    if (!Number.isNaN(spare)) {
      const s = spare;
      spare = NaN;
      return s;
    }
    let u = 0;
    while (u === 0) u = uniform();
    const v = uniform();
    const rad = Math.sqrt(-2 * Math.log(u));
    spare = rad * Math.sin(2 * Math.PI * v);
    return rad * Math.cos(2 * Math.PI * v);
  };
  return { uniform, normal };
}

/** Irregular, strictly increasing sample times: steps drawn uniformly in [minDt, maxDt]. */
export function irregularTimes(T: number, minDt: number, maxDt: number, seed: number): Float64Array {
  const r = rng(seed);
  const t = new Float64Array(T);
  for (let k = 1; k < T; k++) t[k] = t[k - 1] + minDt + (maxDt - minDt) * r.uniform();
  return t;
}

/**
 * Two-axis constant-velocity model, state [px, vx, py, vy], both positions observed (m = 2) with a
 * correlated measurement covariance: exercises the general dense code and per-component missing data.
 */
export function planarModel(q: number, R: [number, number, number]): StateSpaceModel {
  const H = Float64Array.from([1, 0, 0, 0, 0, 0, 1, 0]);
  const tmp = new Float64Array(4);
  return {
    n: 4,
    m: 2,
    H,
    R: Float64Array.from([R[0], R[1], R[1], R[2]]),
    x0: Float64Array.from([0.1, 1, -0.2, 0.5]),
    P0: Float64Array.from([0.5, 0.1, 0, 0, 0.1, 2, 0, 0, 0, 0, 0.7, -0.2, 0, 0, -0.2, 1.5]),
    discretize(dtS, F, u, Q) {
      F.fill(0);
      Q.fill(0);
      u.fill(0);
      F[0] = 1; F[1] = dtS; F[5] = 1; F[10] = 1; F[11] = dtS; F[15] = 1;
      u[1] = 0.05 * dtS;
      whiteNoiseAccelerationQ(dtS, q, tmp, 2);
      Q[0] = tmp[0]; Q[1] = tmp[1]; Q[4] = tmp[2]; Q[5] = tmp[3];
      Q[10] = tmp[0]; Q[11] = tmp[1]; Q[14] = tmp[2]; Q[15] = tmp[3];
    },
  };
}

/**
 * Simulates a model: x_0 ~ N(x0, P0) drawn, then x_k = F x + u + w, z = H x + e.
 * Covariance draws use a Cholesky factor computed here (dense, small n).
 */
export function simulate(model: StateSpaceModel, timesS: Float64Array, seed: number): { x: Float64Array; z: Float64Array } {
  const { n, m } = model;
  const T = timesS.length;
  const r = rng(seed);
  const x = new Float64Array(T * n);
  const z = new Float64Array(T * m);
  const F = new Float64Array(n * n), u = new Float64Array(n), Q = new Float64Array(n * n);
  const draw = (cov: Float64Array, k: number): Float64Array => {
    const L = cholPsd(cov, k);
    const e = new Float64Array(k);
    for (let i = 0; i < k; i++) e[i] = r.normal();
    const out = new Float64Array(k);
    for (let i = 0; i < k; i++) for (let j = 0; j <= i; j++) out[i] += L[i * k + j] * e[j];
    return out;
  };
  const w0 = draw(model.P0, n);
  for (let i = 0; i < n; i++) x[i] = model.x0[i] + w0[i];
  for (let k = 0; k < T; k++) {
    if (k > 0) {
      model.discretize(timesS[k] - timesS[k - 1], F, u, Q);
      const w = draw(Q, n);
      for (let i = 0; i < n; i++) {
        let s = u[i] + w[i];
        for (let j = 0; j < n; j++) s += F[i * n + j] * x[(k - 1) * n + j];
        x[k * n + i] = s;
      }
    }
    const e = draw(model.R, m);
    for (let a = 0; a < m; a++) {
      let s = e[a];
      for (let j = 0; j < n; j++) s += model.H[a * n + j] * x[k * n + j];
      z[k * m + a] = s;
    }
  }
  return { x, z };
}

/** Cholesky that tolerates zero rows (positive semi-definite input, e.g. a noise-free state). */
function cholPsd(a: Float64Array, k: number): Float64Array {
  const l = new Float64Array(k * k);
  for (let i = 0; i < k; i++) {
    for (let j = 0; j <= i; j++) {
      let s = a[i * k + j];
      for (let p = 0; p < j; p++) s -= l[i * k + p] * l[j * k + p];
      if (i === j) l[i * k + i] = s > 1e-300 ? Math.sqrt(s) : 0;
      else l[i * k + j] = l[j * k + j] > 0 ? s / l[j * k + j] : 0;
    }
  }
  return l;
}

/** Largest absolute difference between two arrays (NaN when lengths differ or a NaN appears). */
export function maxAbsDiff(a: ArrayLike<number>, b: ArrayLike<number>): number {
  if (a.length !== b.length) return NaN;
  let d = 0;
  for (let i = 0; i < a.length; i++) {
    const e = Math.abs(a[i] - b[i]);
    if (!(e <= d)) d = e;
  }
  return d;
}

/** Largest absolute value. */
export function maxAbs(a: ArrayLike<number>): number {
  let d = 0;
  for (let i = 0; i < a.length; i++) d = Math.max(d, Math.abs(a[i]));
  return d;
}
