/**
 * The drag hypothesis: a ball under gravity and quadratic air drag along one axis, for the extended
 * Kalman filter.
 */
import type { HypothesisSpec, AxisModelOptions } from './hypotheses';
import { STANDARD_GRAVITY_MPS2 } from './hypotheses';
import type { NonlinearStateSpaceModel } from './extendedKalmanFilter';
import { validateModel } from './stateSpaceModel';
import { whiteNoiseAccelerationQ } from './processNoise';

/** Largest integration sub-step, s. */
const MAX_SUBSTEP_S = 0.002;

/**
 * Builds the per-axis drag model, state [p, v]:
 *   dp/dt = v,  dv/dt = -g - k |v| v   (vertical axis, up positive; g = 0 on a horizontal axis),
 * with k = `spec.dragPerM` (1/m; k = rho Cd A / (2 mass)). The drag uses the axis' own velocity: exact
 * for motion along the axis, an approximation when the object also moves across it. Each step is
 * integrated with classical Runge-Kutta (sub-steps of at most 2 ms) together with the variational
 * equation dPhi/dt = [[0, 1], [0, -2 k |v|]] Phi, which gives the Jacobian F = Phi(dt). Process noise:
 * continuous white-noise acceleration (the same Q as the linear models; drag does not reshape it).
 * @param spec - a hypothesis of kind 'drag' (gMps2 default standard gravity; dragPerM >= 0 required)
 * @param opts - axis, noise levels, prior (as for makeAxisModel)
 * @returns the nonlinear model, for {@link extendedKalmanFilter} and {@link extendedRtsSmooth}
 * @throws RangeError for a missing or negative dragPerM, non-finite gravity or bad noise levels
 * @see Taylor (2005), Classical Mechanics, sec. 2.4 (quadratic drag); Särkkä (2013), Bayesian Filtering
 *   and Smoothing, sec. 5.2 (EKF) (section numbers from memory)
 */
export function makeDragAxisModel(spec: HypothesisSpec, opts: AxisModelOptions): NonlinearStateSpaceModel {
  const k = spec.dragPerM;
  if (!(k !== undefined && k >= 0 && Number.isFinite(k))) throw new RangeError(`hypothesis ${spec.id}: dragPerM must be finite and >= 0, got ${k}`);
  const gIn = spec.gMps2 ?? STANDARD_GRAVITY_MPS2;
  if (!Number.isFinite(gIn)) throw new RangeError(`hypothesis ${spec.id}: gMps2 must be finite, got ${spec.gMps2}`);
  const { qIntensity: q, measurementVarM2: r } = opts;
  if (!(q >= 0) || !Number.isFinite(q)) throw new RangeError(`qIntensity must be finite and >= 0, got ${q}`);
  if (!(r >= 0) || !Number.isFinite(r)) throw new RangeError(`measurementVarM2 must be finite and >= 0, got ${r}`);
  if (opts.axis !== 'vertical' && opts.axis !== 'horizontal') throw new RangeError(`axis must be 'vertical' or 'horizontal', got ${String(opts.axis)}`);
  const g = opts.axis === 'vertical' ? gIn : 0;
  const model: NonlinearStateSpaceModel = {
    n: 2,
    m: 1,
    H: Float64Array.of(1, 0),
    R: Float64Array.of(r),
    x0: opts.x0 ? Float64Array.from(opts.x0) : new Float64Array(2),
    P0: opts.P0 ? Float64Array.from(opts.P0) : Float64Array.of(1e2, 0, 0, 1e2),
    propagate(dtS, x, xOff, xOut, xOutOff, F, Q) {
      let p = x[xOff], v = x[xOff + 1];
      // Phi = d(p, v)(t) / d(p, v)(0), starts at the identity
      let a00 = 1, a01 = 0, a10 = 0, a11 = 1;
      const steps = Math.max(1, Math.ceil(dtS / MAX_SUBSTEP_S));
      const h = dtS / steps;
      for (let s = 0; s < steps; s++) {
        // derivative of (p, v, Phi): p' = v, v' = -g - k|v|v, Phi' = [[0,1],[0,-2k|v|]] Phi
        const d1p = v, d1v = -g - k * Math.abs(v) * v, j1 = -2 * k * Math.abs(v);
        const d1a00 = a10, d1a01 = a11, d1a10 = j1 * a10, d1a11 = j1 * a11;
        const v2 = v + 0.5 * h * d1v;
        const b10 = a10 + 0.5 * h * d1a10, b11 = a11 + 0.5 * h * d1a11;
        const d2p = v2, d2v = -g - k * Math.abs(v2) * v2, j2 = -2 * k * Math.abs(v2);
        const d2a00 = b10, d2a01 = b11, d2a10 = j2 * b10, d2a11 = j2 * b11;
        const v3 = v + 0.5 * h * d2v;
        const c10 = a10 + 0.5 * h * d2a10, c11 = a11 + 0.5 * h * d2a11;
        const d3p = v3, d3v = -g - k * Math.abs(v3) * v3, j3 = -2 * k * Math.abs(v3);
        const d3a00 = c10, d3a01 = c11, d3a10 = j3 * c10, d3a11 = j3 * c11;
        const v4 = v + h * d3v;
        const e10 = a10 + h * d3a10, e11 = a11 + h * d3a11;
        const d4p = v4, d4v = -g - k * Math.abs(v4) * v4, j4 = -2 * k * Math.abs(v4);
        const d4a00 = e10, d4a01 = e11, d4a10 = j4 * e10, d4a11 = j4 * e11;
        const w = h / 6;
        p += w * (d1p + 2 * d2p + 2 * d3p + d4p);
        v += w * (d1v + 2 * d2v + 2 * d3v + d4v);
        a00 += w * (d1a00 + 2 * d2a00 + 2 * d3a00 + d4a00);
        a01 += w * (d1a01 + 2 * d2a01 + 2 * d3a01 + d4a01);
        a10 += w * (d1a10 + 2 * d2a10 + 2 * d3a10 + d4a10);
        a11 += w * (d1a11 + 2 * d2a11 + 2 * d3a11 + d4a11);
      }
      xOut[xOutOff] = p;
      xOut[xOutOff + 1] = v;
      F[0] = a00; F[1] = a01; F[2] = a10; F[3] = a11;
      whiteNoiseAccelerationQ(dtS, q, Q, 2);
    },
  };
  validateModel(model);
  return model;
}
