/**
 * Scalar-local Kalman filter kernels for the per-axis shapes (n = 2 or 3 states, m = 1 observed
 * component), used automatically by {@link kalmanFilter}. They perform the same operations as the
 * general dense code (same Joseph form, same symmetrisation) without matrix objects or inner loops,
 * and agree with it to rounding. Internal to `shared/ssm/`.
 */
import { NotPositiveDefiniteError } from '../errors';
import type { StateSpaceModel } from './stateSpaceModel';
import { DiscretizationCache } from './discretizationCache';
import type { FilterResult } from './kalmanFilter';

const LOG_2PI = Math.log(2 * Math.PI);

function notPd(k: number, t: number): NotPositiveDefiniteError {
  return new NotPositiveDefiniteError(
    `kalmanFilter: innovation variance S is not positive at sample ${k} (t = ${t} s); check R and P0`,
  );
}

function notFinite(k: number, dtS: number): RangeError {
  return new RangeError(`kalmanFilter: model.discretize(${dtS}) gave a non-finite F, u or Q (step to sample ${k})`);
}

/**
 * Filter for n = 2, m = 1; fills `res` (already allocated; inputs already checked).
 * @param model - a model with n = 2, m = 1
 * @param z - observations, T, NaN for missing
 * @param timesS - sample times, s, strictly increasing
 * @param res - output storage for T samples
 * @throws NotPositiveDefiniteError when S <= 0; RangeError when discretize yields non-finite values
 */
export function filterAxis2(model: StateSpaceModel, z: Float64Array, timesS: Float64Array, res: FilterResult): void {
  const T = timesS.length;
  const { xPred, PPred, xFilt, PFilt, nis, nisDof } = res;
  const cache = new DiscretizationCache(model);
  const cF = cache.F, cu = cache.u, cQ = cache.Q;
  const h0 = model.H[0], h1 = model.H[1], r = model.R[0];
  let f00 = 0, f01 = 0, f10 = 0, f11 = 0, u0 = 0, u1 = 0, q00 = 0, q01 = 0, q10 = 0, q11 = 0;
  // Filtered moments of the previous step (a: mean, c: covariance).
  let a0 = 0, a1 = 0, c00 = 0, c01 = 0, c11 = 0;
  let lastDt = NaN;
  let sumNis = 0, sumLogS = 0, prodS = 1;
  let nObs = 0;
  for (let k = 0; k < T; k++) {
    let x0: number, x1: number, p00: number, p01: number, p11: number;
    if (k === 0) {
      const P0 = model.P0;
      x0 = model.x0[0]; x1 = model.x0[1];
      p00 = P0[0]; p01 = 0.5 * (P0[1] + P0[2]); p11 = P0[3];
    } else {
      const dt = timesS[k] - timesS[k - 1];
      if (dt !== lastDt) {
        const sl = cache.slot(dt), fo = sl * 4, vo = sl * 2;
        f00 = cF[fo]; f01 = cF[fo + 1]; f10 = cF[fo + 2]; f11 = cF[fo + 3];
        u0 = cu[vo]; u1 = cu[vo + 1];
        q00 = cQ[fo]; q01 = cQ[fo + 1]; q10 = cQ[fo + 2]; q11 = cQ[fo + 3];
        if (!Number.isFinite(f00 + f01 + f10 + f11 + u0 + u1 + q00 + q01 + q10 + q11)) throw notFinite(k, dt);
        lastDt = dt;
      }
      // x_k|k-1 = F x + u
      x0 = u0 + f00 * a0 + f01 * a1;
      x1 = u1 + f10 * a0 + f11 * a1;
      // G = F C; P = G F' + Q (symmetrised)
      const g00 = f00 * c00 + f01 * c01, g01 = f00 * c01 + f01 * c11;
      const g10 = f10 * c00 + f11 * c01, g11 = f10 * c01 + f11 * c11;
      p00 = g00 * f00 + g01 * f01 + q00;
      p01 = 0.5 * ((g00 * f10 + g01 * f11 + q01) + (g10 * f00 + g11 * f01 + q10));
      p11 = g10 * f10 + g11 * f11 + q11;
    }
    const xo = 2 * k, po = 4 * k;
    xPred[xo] = x0; xPred[xo + 1] = x1;
    PPred[po] = p00; PPred[po + 1] = p01; PPred[po + 2] = p01; PPred[po + 3] = p11;
    const zk = z[k];
    if (zk !== zk) {
      a0 = x0; a1 = x1; c00 = p00; c01 = p01; c11 = p11;
      nis[k] = NaN;
      nisDof[k] = 0;
    } else {
      // P H', S = H P H' + R
      const ph0 = p00 * h0 + p01 * h1;
      const ph1 = p01 * h0 + p11 * h1;
      const s = h0 * ph0 + h1 * ph1 + r;
      if (!(s > 0) || s === Infinity) throw notPd(k, timesS[k]);
      // K = P H' / S; v = z - H x
      const is = 1 / s;
      const k0 = ph0 * is, k1 = ph1 * is;
      const v = zk - (h0 * x0 + h1 * x1);
      const q = v * v * is;
      nis[k] = q;
      nisDof[k] = 1;
      // log-likelihood term -(log 2pi + log S + NIS)/2. log S is accumulated as a product, flushed
      // through Math.log when it leaves [1e-200, 1e200] (no overflow or underflow for S in
      // [1e-100, 1e100]; other S are logged directly), to keep Math.log out of the per-sample path.
      sumNis += q;
      if (s > 1e-100 && s < 1e100) {
        prodS *= s;
        if (!(prodS < 1e200 && prodS > 1e-200)) {
          sumLogS += Math.log(prodS);
          prodS = 1;
        }
      } else {
        sumLogS += Math.log(s);
      }
      nObs++;
      a0 = x0 + k0 * v;
      a1 = x1 + k1 * v;
      // Joseph form: A = I - K H; P = A P A' + K R K'
      const A00 = 1 - k0 * h0, A01 = -k0 * h1, A10 = -k1 * h0, A11 = 1 - k1 * h1;
      const B00 = A00 * p00 + A01 * p01, B01 = A00 * p01 + A01 * p11;
      const B10 = A10 * p00 + A11 * p01, B11 = A10 * p01 + A11 * p11;
      c00 = B00 * A00 + B01 * A01 + k0 * r * k0;
      c01 = 0.5 * ((B00 * A10 + B01 * A11 + k0 * r * k1) + (B10 * A00 + B11 * A01 + k1 * r * k0));
      c11 = B10 * A10 + B11 * A11 + k1 * r * k1;
    }
    xFilt[xo] = a0; xFilt[xo + 1] = a1;
    PFilt[po] = c00; PFilt[po + 1] = c01; PFilt[po + 2] = c01; PFilt[po + 3] = c11;
  }
  res.logLik = -0.5 * (nObs * LOG_2PI + sumLogS + Math.log(prodS) + sumNis);
  res.nObserved = nObs;
}

/**
 * Filter for n = 3, m = 1; fills `res` (already allocated; inputs already checked).
 * @param model - a model with n = 3, m = 1
 * @param z - observations, T, NaN for missing
 * @param timesS - sample times, s, strictly increasing
 * @param res - output storage for T samples
 * @throws NotPositiveDefiniteError when S <= 0; RangeError when discretize yields non-finite values
 */
export function filterAxis3(model: StateSpaceModel, z: Float64Array, timesS: Float64Array, res: FilterResult): void {
  const T = timesS.length;
  const { xPred, PPred, xFilt, PFilt, nis, nisDof } = res;
  const cache = new DiscretizationCache(model);
  const cF = cache.F, cu = cache.u, cQ = cache.Q;
  const h0 = model.H[0], h1 = model.H[1], h2 = model.H[2], r = model.R[0];
  let f00 = 0, f01 = 0, f02 = 0, f10 = 0, f11 = 0, f12 = 0, f20 = 0, f21 = 0, f22 = 0;
  let u0 = 0, u1 = 0, u2 = 0;
  let q00 = 0, q01 = 0, q02 = 0, q10 = 0, q11 = 0, q12 = 0, q20 = 0, q21 = 0, q22 = 0;
  let a0 = 0, a1 = 0, a2 = 0;
  let c00 = 0, c01 = 0, c02 = 0, c11 = 0, c12 = 0, c22 = 0;
  let lastDt = NaN;
  let sumNis = 0, sumLogS = 0, prodS = 1;
  let nObs = 0;
  for (let k = 0; k < T; k++) {
    let x0: number, x1: number, x2: number;
    let p00: number, p01: number, p02: number, p11: number, p12: number, p22: number;
    if (k === 0) {
      const P0 = model.P0;
      x0 = model.x0[0]; x1 = model.x0[1]; x2 = model.x0[2];
      p00 = P0[0]; p11 = P0[4]; p22 = P0[8];
      p01 = 0.5 * (P0[1] + P0[3]); p02 = 0.5 * (P0[2] + P0[6]); p12 = 0.5 * (P0[5] + P0[7]);
    } else {
      const dt = timesS[k] - timesS[k - 1];
      if (dt !== lastDt) {
        const sl = cache.slot(dt), fo = sl * 9, vo = sl * 3;
        f00 = cF[fo]; f01 = cF[fo + 1]; f02 = cF[fo + 2]; f10 = cF[fo + 3]; f11 = cF[fo + 4]; f12 = cF[fo + 5]; f20 = cF[fo + 6]; f21 = cF[fo + 7]; f22 = cF[fo + 8];
        u0 = cu[vo]; u1 = cu[vo + 1]; u2 = cu[vo + 2];
        q00 = cQ[fo]; q01 = cQ[fo + 1]; q02 = cQ[fo + 2]; q10 = cQ[fo + 3]; q11 = cQ[fo + 4]; q12 = cQ[fo + 5]; q20 = cQ[fo + 6]; q21 = cQ[fo + 7]; q22 = cQ[fo + 8];
        if (!Number.isFinite(f00 + f01 + f02 + f10 + f11 + f12 + f20 + f21 + f22 + u0 + u1 + u2 +
          q00 + q01 + q02 + q10 + q11 + q12 + q20 + q21 + q22)) throw notFinite(k, dt);
        lastDt = dt;
      }
      // x_k|k-1 = F x + u
      x0 = u0 + f00 * a0 + f01 * a1 + f02 * a2;
      x1 = u1 + f10 * a0 + f11 * a1 + f12 * a2;
      x2 = u2 + f20 * a0 + f21 * a1 + f22 * a2;
      // G = F C
      const g00 = f00 * c00 + f01 * c01 + f02 * c02, g01 = f00 * c01 + f01 * c11 + f02 * c12, g02 = f00 * c02 + f01 * c12 + f02 * c22;
      const g10 = f10 * c00 + f11 * c01 + f12 * c02, g11 = f10 * c01 + f11 * c11 + f12 * c12, g12 = f10 * c02 + f11 * c12 + f12 * c22;
      const g20 = f20 * c00 + f21 * c01 + f22 * c02, g21 = f20 * c01 + f21 * c11 + f22 * c12, g22 = f20 * c02 + f21 * c12 + f22 * c22;
      // P = G F' + Q (symmetrised)
      p00 = g00 * f00 + g01 * f01 + g02 * f02 + q00;
      p11 = g10 * f10 + g11 * f11 + g12 * f12 + q11;
      p22 = g20 * f20 + g21 * f21 + g22 * f22 + q22;
      p01 = 0.5 * ((g00 * f10 + g01 * f11 + g02 * f12 + q01) + (g10 * f00 + g11 * f01 + g12 * f02 + q10));
      p02 = 0.5 * ((g00 * f20 + g01 * f21 + g02 * f22 + q02) + (g20 * f00 + g21 * f01 + g22 * f02 + q20));
      p12 = 0.5 * ((g10 * f20 + g11 * f21 + g12 * f22 + q12) + (g20 * f10 + g21 * f11 + g22 * f12 + q21));
    }
    const xo = 3 * k, po = 9 * k;
    xPred[xo] = x0; xPred[xo + 1] = x1; xPred[xo + 2] = x2;
    PPred[po] = p00; PPred[po + 1] = p01; PPred[po + 2] = p02;
    PPred[po + 3] = p01; PPred[po + 4] = p11; PPred[po + 5] = p12;
    PPred[po + 6] = p02; PPred[po + 7] = p12; PPred[po + 8] = p22;
    const zk = z[k];
    if (zk !== zk) {
      a0 = x0; a1 = x1; a2 = x2;
      c00 = p00; c01 = p01; c02 = p02; c11 = p11; c12 = p12; c22 = p22;
      nis[k] = NaN;
      nisDof[k] = 0;
    } else {
      // P H', S = H P H' + R
      const ph0 = p00 * h0 + p01 * h1 + p02 * h2;
      const ph1 = p01 * h0 + p11 * h1 + p12 * h2;
      const ph2 = p02 * h0 + p12 * h1 + p22 * h2;
      const s = h0 * ph0 + h1 * ph1 + h2 * ph2 + r;
      if (!(s > 0) || s === Infinity) throw notPd(k, timesS[k]);
      const is = 1 / s;
      const k0 = ph0 * is, k1 = ph1 * is, k2 = ph2 * is;
      const v = zk - (h0 * x0 + h1 * x1 + h2 * x2);
      const q = v * v * is;
      nis[k] = q;
      nisDof[k] = 1;
      // log-likelihood term -(log 2pi + log S + NIS)/2. log S is accumulated as a product, flushed
      // through Math.log when it leaves [1e-200, 1e200] (no overflow or underflow for S in
      // [1e-100, 1e100]; other S are logged directly), to keep Math.log out of the per-sample path.
      sumNis += q;
      if (s > 1e-100 && s < 1e100) {
        prodS *= s;
        if (!(prodS < 1e200 && prodS > 1e-200)) {
          sumLogS += Math.log(prodS);
          prodS = 1;
        }
      } else {
        sumLogS += Math.log(s);
      }
      nObs++;
      a0 = x0 + k0 * v; a1 = x1 + k1 * v; a2 = x2 + k2 * v;
      // Joseph form: A = I - K H; B = A P; P = B A' + K R K'
      const A00 = 1 - k0 * h0, A01 = -k0 * h1, A02 = -k0 * h2;
      const A10 = -k1 * h0, A11 = 1 - k1 * h1, A12 = -k1 * h2;
      const A20 = -k2 * h0, A21 = -k2 * h1, A22 = 1 - k2 * h2;
      const B00 = A00 * p00 + A01 * p01 + A02 * p02, B01 = A00 * p01 + A01 * p11 + A02 * p12, B02 = A00 * p02 + A01 * p12 + A02 * p22;
      const B10 = A10 * p00 + A11 * p01 + A12 * p02, B11 = A10 * p01 + A11 * p11 + A12 * p12, B12 = A10 * p02 + A11 * p12 + A12 * p22;
      const B20 = A20 * p00 + A21 * p01 + A22 * p02, B21 = A20 * p01 + A21 * p11 + A22 * p12, B22 = A20 * p02 + A21 * p12 + A22 * p22;
      c00 = B00 * A00 + B01 * A01 + B02 * A02 + k0 * r * k0;
      c11 = B10 * A10 + B11 * A11 + B12 * A12 + k1 * r * k1;
      c22 = B20 * A20 + B21 * A21 + B22 * A22 + k2 * r * k2;
      c01 = 0.5 * ((B00 * A10 + B01 * A11 + B02 * A12 + k0 * r * k1) + (B10 * A00 + B11 * A01 + B12 * A02 + k1 * r * k0));
      c02 = 0.5 * ((B00 * A20 + B01 * A21 + B02 * A22 + k0 * r * k2) + (B20 * A00 + B21 * A01 + B22 * A02 + k2 * r * k0));
      c12 = 0.5 * ((B10 * A20 + B11 * A21 + B12 * A22 + k1 * r * k2) + (B20 * A10 + B21 * A11 + B22 * A12 + k2 * r * k1));
    }
    xFilt[xo] = a0; xFilt[xo + 1] = a1; xFilt[xo + 2] = a2;
    PFilt[po] = c00; PFilt[po + 1] = c01; PFilt[po + 2] = c02;
    PFilt[po + 3] = c01; PFilt[po + 4] = c11; PFilt[po + 5] = c12;
    PFilt[po + 6] = c02; PFilt[po + 7] = c12; PFilt[po + 8] = c22;
  }
  res.logLik = -0.5 * (nObs * LOG_2PI + sumLogS + Math.log(prodS) + sumNis);
  res.nObserved = nObs;
}
