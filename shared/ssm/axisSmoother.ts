/**
 * Scalar-local RTS smoother kernels for n = 2 or 3 states (m = 1), used automatically by
 * {@link rtsSmooth}. Same operations as the general dense code: smoother gain C = P_k|k F' P_k+1|k^-1
 * by a Cholesky solve of P_k+1|k, Joseph-form smoothed covariance symmetrised, lag-one covariance
 * P_k+1|T C'.
 * Internal to `shared/ssm/`.
 */
import { NotPositiveDefiniteError } from '../errors';
import type { StateSpaceModel } from './stateSpaceModel';
import { DiscretizationCache } from './discretizationCache';
import type { FilterResult } from './kalmanFilter';
import type { SmoothResult } from './rtsSmooth';

function notPd(k: number, t: number): NotPositiveDefiniteError {
  return new NotPositiveDefiniteError(`rtsSmooth: predicted covariance is not positive definite at sample ${k} (t = ${t} s)`);
}

/**
 * Smoother for n = 2; fills `out` (allocated by the caller).
 * @param model - the model the filter ran with (n = 2)
 * @param f - the filter result
 * @param out - output storage for the same T
 * @throws NotPositiveDefiniteError when a predicted covariance is not positive definite
 */
export function smoothAxis2(model: StateSpaceModel, f: FilterResult, out: SmoothResult): void {
  const { length: T, timesS, xPred, PPred, xFilt, PFilt } = f;
  const { xSmooth, PSmooth, PLag } = out;
  const cache = new DiscretizationCache(model);
  const cF = cache.F, cQ = cache.Q;
  let f00 = 0, f01 = 0, f10 = 0, f11 = 0, q00 = 0, q01 = 0, q10 = 0, q11 = 0;
  let lastDt = NaN;
  // Smoothed moments of step k+1 (s: mean, S: covariance).
  const e = T - 1;
  let s0 = xFilt[2 * e], s1 = xFilt[2 * e + 1];
  let S00 = PFilt[4 * e], S01 = PFilt[4 * e + 1], S11 = PFilt[4 * e + 3];
  xSmooth[2 * e] = s0; xSmooth[2 * e + 1] = s1;
  PSmooth[4 * e] = S00; PSmooth[4 * e + 1] = S01; PSmooth[4 * e + 2] = S01; PSmooth[4 * e + 3] = S11;
  for (let k = T - 2; k >= 0; k--) {
    const dt = timesS[k + 1] - timesS[k];
    if (dt !== lastDt) {
      const fo = cache.slot(dt) * 4;
      f00 = cF[fo]; f01 = cF[fo + 1]; f10 = cF[fo + 2]; f11 = cF[fo + 3];
      q00 = cQ[fo]; q01 = cQ[fo + 1]; q10 = cQ[fo + 2]; q11 = cQ[fo + 3];
      lastDt = dt;
    }
    const xo = 2 * k, po = 4 * k, x1 = xo + 2, p1 = po + 4;
    const c00 = PFilt[po], c01 = PFilt[po + 1], c11 = PFilt[po + 3];
    const p00 = PPred[p1], p01 = PPred[p1 + 1], p11 = PPred[p1 + 3];
    // M = F P_k|k
    const m00 = f00 * c00 + f01 * c01, m01 = f00 * c01 + f01 * c11;
    const m10 = f10 * c00 + f11 * c01, m11 = f10 * c01 + f11 * c11;
    // Cholesky of P_k+1|k
    if (!(p00 > 0)) throw notPd(k + 1, timesS[k + 1]);
    const l00 = Math.sqrt(p00), i00 = 1 / l00;
    const l10 = p01 * i00;
    const d11 = p11 - l10 * l10;
    if (!(d11 > 0)) throw notPd(k + 1, timesS[k + 1]);
    const i11 = 1 / Math.sqrt(d11);
    // C' = P_k+1|k^-1 M, column by column (forward then backward substitution; i = 1 / diag(L))
    let y0 = m00 * i00;
    let y1 = (m10 - l10 * y0) * i11;
    const t10 = y1 * i11;
    const t00 = (y0 - l10 * t10) * i00;
    y0 = m01 * i00;
    y1 = (m11 - l10 * y0) * i11;
    const t11 = y1 * i11;
    const t01 = (y0 - l10 * t11) * i00;
    // C = (C')'
    const C00 = t00, C01 = t10, C10 = t01, C11 = t11;
    // x_k|T = x_k|k + C (x_k+1|T - x_k+1|k)
    const d0 = s0 - xPred[x1], d1 = s1 - xPred[x1 + 1];
    const n0 = xFilt[xo] + C00 * d0 + C01 * d1;
    const n1 = xFilt[xo + 1] + C10 * d0 + C11 * d1;
    // Joseph-form RTS covariance, a sum of positive semi-definite terms equal to
    // P_k|k + C (P_k+1|T - P_k+1|k) C':  P_k|T = (I - C F) P_k|k (I - C F)' + C (Q + P_k+1|T) C'
    const A00 = 1 - (C00 * f00 + C01 * f10), A01 = -(C00 * f01 + C01 * f11);
    const A10 = -(C10 * f00 + C11 * f10), A11 = 1 - (C10 * f01 + C11 * f11);
    const B00 = A00 * c00 + A01 * c01, B01 = A00 * c01 + A01 * c11;
    const B10 = A10 * c00 + A11 * c01, B11 = A10 * c01 + A11 * c11;
    const W00 = q00 + S00, W01 = 0.5 * (q01 + q10) + S01, W11 = q11 + S11;
    const E00 = C00 * W00 + C01 * W01, E01 = C00 * W01 + C01 * W11;
    const E10 = C10 * W00 + C11 * W01, E11 = C10 * W01 + C11 * W11;
    const N00 = B00 * A00 + B01 * A01 + (E00 * C00 + E01 * C01);
    const N01 = 0.5 * ((B00 * A10 + B01 * A11 + (E00 * C10 + E01 * C11)) + (B10 * A00 + B11 * A01 + (E10 * C00 + E11 * C01)));
    const N11 = B10 * A10 + B11 * A11 + (E10 * C10 + E11 * C11);
    // Cov(x_k+1, x_k | T) = P_k+1|T C'
    PLag[p1] = S00 * C00 + S01 * C01;
    PLag[p1 + 1] = S00 * C10 + S01 * C11;
    PLag[p1 + 2] = S01 * C00 + S11 * C01;
    PLag[p1 + 3] = S01 * C10 + S11 * C11;
    s0 = n0; s1 = n1; S00 = N00; S01 = N01; S11 = N11;
    xSmooth[xo] = s0; xSmooth[xo + 1] = s1;
    PSmooth[po] = S00; PSmooth[po + 1] = S01; PSmooth[po + 2] = S01; PSmooth[po + 3] = S11;
  }
}

/**
 * Smoother for n = 3; fills `out` (allocated by the caller).
 * @param model - the model the filter ran with (n = 3)
 * @param f - the filter result
 * @param out - output storage for the same T
 * @throws NotPositiveDefiniteError when a predicted covariance is not positive definite
 */
export function smoothAxis3(model: StateSpaceModel, f: FilterResult, out: SmoothResult): void {
  const { length: T, timesS, xPred, PPred, xFilt, PFilt } = f;
  const { xSmooth, PSmooth, PLag } = out;
  const cache = new DiscretizationCache(model);
  const cF = cache.F, cQ = cache.Q;
  let f00 = 0, f01 = 0, f02 = 0, f10 = 0, f11 = 0, f12 = 0, f20 = 0, f21 = 0, f22 = 0;
  let q00 = 0, q01 = 0, q02 = 0, q10 = 0, q11 = 0, q12 = 0, q20 = 0, q21 = 0, q22 = 0;
  let lastDt = NaN;
  const e = T - 1;
  let s0 = xFilt[3 * e], s1 = xFilt[3 * e + 1], s2 = xFilt[3 * e + 2];
  let S00 = PFilt[9 * e], S01 = PFilt[9 * e + 1], S02 = PFilt[9 * e + 2];
  let S11 = PFilt[9 * e + 4], S12 = PFilt[9 * e + 5], S22 = PFilt[9 * e + 8];
  xSmooth.set(xFilt.subarray(3 * e, 3 * e + 3), 3 * e);
  PSmooth.set(PFilt.subarray(9 * e, 9 * e + 9), 9 * e);
  for (let k = T - 2; k >= 0; k--) {
    const dt = timesS[k + 1] - timesS[k];
    if (dt !== lastDt) {
      const fo = cache.slot(dt) * 9;
      f00 = cF[fo]; f01 = cF[fo + 1]; f02 = cF[fo + 2]; f10 = cF[fo + 3]; f11 = cF[fo + 4]; f12 = cF[fo + 5]; f20 = cF[fo + 6]; f21 = cF[fo + 7]; f22 = cF[fo + 8];
      q00 = cQ[fo]; q01 = cQ[fo + 1]; q02 = cQ[fo + 2]; q10 = cQ[fo + 3]; q11 = cQ[fo + 4]; q12 = cQ[fo + 5]; q20 = cQ[fo + 6]; q21 = cQ[fo + 7]; q22 = cQ[fo + 8];
      lastDt = dt;
    }
    const xo = 3 * k, po = 9 * k, x1 = xo + 3, p1 = po + 9;
    const c00 = PFilt[po], c01 = PFilt[po + 1], c02 = PFilt[po + 2];
    const c11 = PFilt[po + 4], c12 = PFilt[po + 5], c22 = PFilt[po + 8];
    const p00 = PPred[p1], p01 = PPred[p1 + 1], p02 = PPred[p1 + 2];
    const p11 = PPred[p1 + 4], p12 = PPred[p1 + 5], p22 = PPred[p1 + 8];
    // M = F P_k|k
    const m00 = f00 * c00 + f01 * c01 + f02 * c02, m01 = f00 * c01 + f01 * c11 + f02 * c12, m02 = f00 * c02 + f01 * c12 + f02 * c22;
    const m10 = f10 * c00 + f11 * c01 + f12 * c02, m11 = f10 * c01 + f11 * c11 + f12 * c12, m12 = f10 * c02 + f11 * c12 + f12 * c22;
    const m20 = f20 * c00 + f21 * c01 + f22 * c02, m21 = f20 * c01 + f21 * c11 + f22 * c12, m22 = f20 * c02 + f21 * c12 + f22 * c22;
    // Cholesky of P_k+1|k
    if (!(p00 > 0)) throw notPd(k + 1, timesS[k + 1]);
    const i00 = 1 / Math.sqrt(p00);
    const l10 = p01 * i00, l20 = p02 * i00;
    const d11 = p11 - l10 * l10;
    if (!(d11 > 0)) throw notPd(k + 1, timesS[k + 1]);
    const i11 = 1 / Math.sqrt(d11);
    const l21 = (p12 - l20 * l10) * i11;
    const d22 = p22 - l20 * l20 - l21 * l21;
    if (!(d22 > 0)) throw notPd(k + 1, timesS[k + 1]);
    const i22 = 1 / Math.sqrt(d22);
    // C' = P_k+1|k^-1 M, column j gives row j of C (i = 1 / diag(L))
    let y0 = m00 * i00, y1 = (m10 - l10 * y0) * i11, y2 = (m20 - l20 * y0 - l21 * y1) * i22;
    const C02 = y2 * i22, C01 = (y1 - l21 * C02) * i11, C00 = (y0 - l10 * C01 - l20 * C02) * i00;
    y0 = m01 * i00; y1 = (m11 - l10 * y0) * i11; y2 = (m21 - l20 * y0 - l21 * y1) * i22;
    const C12 = y2 * i22, C11 = (y1 - l21 * C12) * i11, C10 = (y0 - l10 * C11 - l20 * C12) * i00;
    y0 = m02 * i00; y1 = (m12 - l10 * y0) * i11; y2 = (m22 - l20 * y0 - l21 * y1) * i22;
    const C22 = y2 * i22, C21 = (y1 - l21 * C22) * i11, C20 = (y0 - l10 * C21 - l20 * C22) * i00;
    // x_k|T = x_k|k + C (x_k+1|T - x_k+1|k)
    const d0 = s0 - xPred[x1], d1 = s1 - xPred[x1 + 1], d2 = s2 - xPred[x1 + 2];
    const n0 = xFilt[xo] + C00 * d0 + C01 * d1 + C02 * d2;
    const n1 = xFilt[xo + 1] + C10 * d0 + C11 * d1 + C12 * d2;
    const n2 = xFilt[xo + 2] + C20 * d0 + C21 * d1 + C22 * d2;
    // Joseph-form RTS covariance, a sum of positive semi-definite terms equal to
    // P_k|k + C (P_k+1|T - P_k+1|k) C':  P_k|T = (I - C F) P_k|k (I - C F)' + C (Q + P_k+1|T) C'
    const A00 = 1 - (C00 * f00 + C01 * f10 + C02 * f20), A01 = -(C00 * f01 + C01 * f11 + C02 * f21), A02 = -(C00 * f02 + C01 * f12 + C02 * f22);
    const A10 = -(C10 * f00 + C11 * f10 + C12 * f20), A11 = 1 - (C10 * f01 + C11 * f11 + C12 * f21), A12 = -(C10 * f02 + C11 * f12 + C12 * f22);
    const A20 = -(C20 * f00 + C21 * f10 + C22 * f20), A21 = -(C20 * f01 + C21 * f11 + C22 * f21), A22 = 1 - (C20 * f02 + C21 * f12 + C22 * f22);
    const B00 = A00 * c00 + A01 * c01 + A02 * c02, B01 = A00 * c01 + A01 * c11 + A02 * c12, B02 = A00 * c02 + A01 * c12 + A02 * c22;
    const B10 = A10 * c00 + A11 * c01 + A12 * c02, B11 = A10 * c01 + A11 * c11 + A12 * c12, B12 = A10 * c02 + A11 * c12 + A12 * c22;
    const B20 = A20 * c00 + A21 * c01 + A22 * c02, B21 = A20 * c01 + A21 * c11 + A22 * c12, B22 = A20 * c02 + A21 * c12 + A22 * c22;
    const W00 = q00 + S00, W11 = q11 + S11, W22 = q22 + S22;
    const W01 = 0.5 * (q01 + q10) + S01, W02 = 0.5 * (q02 + q20) + S02, W12 = 0.5 * (q12 + q21) + S12;
    const E00 = C00 * W00 + C01 * W01 + C02 * W02, E01 = C00 * W01 + C01 * W11 + C02 * W12, E02 = C00 * W02 + C01 * W12 + C02 * W22;
    const E10 = C10 * W00 + C11 * W01 + C12 * W02, E11 = C10 * W01 + C11 * W11 + C12 * W12, E12 = C10 * W02 + C11 * W12 + C12 * W22;
    const E20 = C20 * W00 + C21 * W01 + C22 * W02, E21 = C20 * W01 + C21 * W11 + C22 * W12, E22 = C20 * W02 + C21 * W12 + C22 * W22;
    const N00 = B00 * A00 + B01 * A01 + B02 * A02 + (E00 * C00 + E01 * C01 + E02 * C02);
    const N11 = B10 * A10 + B11 * A11 + B12 * A12 + (E10 * C10 + E11 * C11 + E12 * C12);
    const N22 = B20 * A20 + B21 * A21 + B22 * A22 + (E20 * C20 + E21 * C21 + E22 * C22);
    const N01 = 0.5 * ((B00 * A10 + B01 * A11 + B02 * A12 + (E00 * C10 + E01 * C11 + E02 * C12)) +
      (B10 * A00 + B11 * A01 + B12 * A02 + (E10 * C00 + E11 * C01 + E12 * C02)));
    const N02 = 0.5 * ((B00 * A20 + B01 * A21 + B02 * A22 + (E00 * C20 + E01 * C21 + E02 * C22)) +
      (B20 * A00 + B21 * A01 + B22 * A02 + (E20 * C00 + E21 * C01 + E22 * C02)));
    const N12 = 0.5 * ((B10 * A20 + B11 * A21 + B12 * A22 + (E10 * C20 + E11 * C21 + E12 * C22)) +
      (B20 * A10 + B21 * A11 + B22 * A12 + (E20 * C10 + E21 * C11 + E22 * C12)));
    // Cov(x_k+1, x_k | T) = P_k+1|T C'
    PLag[p1] = S00 * C00 + S01 * C01 + S02 * C02;
    PLag[p1 + 1] = S00 * C10 + S01 * C11 + S02 * C12;
    PLag[p1 + 2] = S00 * C20 + S01 * C21 + S02 * C22;
    PLag[p1 + 3] = S01 * C00 + S11 * C01 + S12 * C02;
    PLag[p1 + 4] = S01 * C10 + S11 * C11 + S12 * C12;
    PLag[p1 + 5] = S01 * C20 + S11 * C21 + S12 * C22;
    PLag[p1 + 6] = S02 * C00 + S12 * C01 + S22 * C02;
    PLag[p1 + 7] = S02 * C10 + S12 * C11 + S22 * C12;
    PLag[p1 + 8] = S02 * C20 + S12 * C21 + S22 * C22;
    s0 = n0; s1 = n1; s2 = n2;
    S00 = N00; S01 = N01; S02 = N02; S11 = N11; S12 = N12; S22 = N22;
    xSmooth[xo] = s0; xSmooth[xo + 1] = s1; xSmooth[xo + 2] = s2;
    PSmooth[po] = S00; PSmooth[po + 1] = S01; PSmooth[po + 2] = S02;
    PSmooth[po + 3] = S01; PSmooth[po + 4] = S11; PSmooth[po + 5] = S12;
    PSmooth[po + 6] = S02; PSmooth[po + 7] = S12; PSmooth[po + 8] = S22;
  }
}
