/**
 * Dynamics hypotheses: named, parameterised per-axis models of how the object moves.
 *
 * Per axis, coordinates "up positive" on the vertical axis (so gravity acts as -g). Layouts:
 * - 'constant-velocity': [p, v], continuous white-noise acceleration, no gravity term;
 * - 'gravity': [p, v], the same noise with the input term u = [-g dt^2/2, -g dt] on the vertical axis;
 * - 'fitted-gravity': [p, v, g] on the vertical axis, g a constant state (downward magnitude, m/s^2)
 *   estimated with its uncertainty; [p, v] constant velocity on a horizontal axis;
 * - 'free-acceleration': [p, v, a], white jerk (constant unknown acceleration);
 * - 'drag': [p, v] with quadratic air drag, nonlinear: see `makeDragAxisModel` (extended Kalman filter).
 * Gravity kinds on a horizontal axis reduce to constant velocity (gravity acts only vertically).
 */
import type { StateSpaceModel } from './stateSpaceModel';
import { validateModel } from './stateSpaceModel';
import { whiteJerkQ, whiteNoiseAccelerationQ } from './processNoise';

/** The dynamics hypotheses Forecatch knows. */
export type HypothesisKind = 'constant-velocity' | 'gravity' | 'fitted-gravity' | 'free-acceleration' | 'drag';

/** A named hypothesis with its parameters. */
export interface HypothesisSpec {
  /** Stable identifier used in tables and files. */
  id: string;
  /** Which dynamics. */
  kind: HypothesisKind;
  /** Gravity magnitude for 'gravity' (and 'drag'), m/s^2; default {@link STANDARD_GRAVITY_MPS2}. */
  gMps2?: number;
  /** Quadratic drag coefficient k in a = -k |v| v, 1/m (for 'drag'). */
  dragPerM?: number;
  /** Human-readable label. */
  label?: string;
}

/** Standard acceleration of gravity, m/s^2, exact by definition (3rd CGPM 1901; ISO 80000-3). */
export const STANDARD_GRAVITY_MPS2 = 9.80665;

/** Options of {@link makeAxisModel}. */
export interface AxisModelOptions {
  /** 'vertical' (up positive, gravity applies) or 'horizontal'. */
  axis: 'vertical' | 'horizontal';
  /** Process-noise spectral density: m^2/s^3 for [p, v] models, m^2/s^5 for white jerk. */
  qIntensity: number;
  /** Measurement-noise variance of the position, m^2. */
  measurementVarM2: number;
  /** Prior mean of the state at the first sample (zeros by default). */
  x0?: Float64Array;
  /** Prior covariance (default diagonal: 1e2 m^2, 1e2 m^2/s^2, 1e4 m^2/s^4 for a third state). */
  P0?: Float64Array;
}

/**
 * Names of the states of the model {@link makeAxisModel} builds for a hypothesis on an axis.
 * @param spec - the hypothesis
 * @param axis - 'vertical' or 'horizontal'
 * @returns e.g. ['posM', 'velMps'] or ['posM', 'velMps', 'gMps2']
 */
export function axisStateLayout(spec: HypothesisSpec, axis: 'vertical' | 'horizontal'): readonly string[] {
  if (spec.kind === 'free-acceleration') return ['posM', 'velMps', 'accMps2'];
  if (spec.kind === 'fitted-gravity' && axis === 'vertical') return ['posM', 'velMps', 'gMps2'];
  return ['posM', 'velMps'];
}

function gravityOf(spec: HypothesisSpec): number {
  const g = spec.gMps2 ?? STANDARD_GRAVITY_MPS2;
  if (!Number.isFinite(g)) throw new RangeError(`hypothesis ${spec.id}: gMps2 must be finite, got ${spec.gMps2}`);
  return g;
}

/**
 * Builds the per-axis linear-Gaussian model of a hypothesis (position observed, m = 1).
 * @param spec - the hypothesis ('drag' is nonlinear and is refused here: use `makeDragAxisModel`)
 * @param opts - axis, noise levels and optional prior
 * @returns the model, with `discretize(dtS, F, u, Q)` implementing the hypothesis
 * @throws RangeError for negative or non-finite noise levels, non-finite gravity, or kind 'drag'
 * @throws DimensionMismatchError when x0/P0 do not fit the state layout
 * @see Bar-Shalom, Li & Kirubarajan (2001), ch. 6, for the noise models
 */
export function makeAxisModel(spec: HypothesisSpec, opts: AxisModelOptions): StateSpaceModel {
  const { axis, qIntensity: q, measurementVarM2: r } = opts;
  if (axis !== 'vertical' && axis !== 'horizontal') throw new RangeError(`axis must be 'vertical' or 'horizontal', got ${String(axis)}`);
  if (!(q >= 0) || !Number.isFinite(q)) throw new RangeError(`qIntensity must be finite and >= 0, got ${q}`);
  if (!(r >= 0) || !Number.isFinite(r)) throw new RangeError(`measurementVarM2 must be finite and >= 0, got ${r}`);
  if (spec.kind === 'drag') {
    throw new RangeError(`hypothesis ${spec.id}: 'drag' is nonlinear; build it with makeDragAxisModel and run extendedKalmanFilter`);
  }
  const n = axisStateLayout(spec, axis).length;
  const H = new Float64Array(n);
  H[0] = 1;
  const P0 = opts.P0 ? Float64Array.from(opts.P0) : defaultP0(n);
  const x0 = opts.x0 ? Float64Array.from(opts.x0) : new Float64Array(n);
  let discretize: StateSpaceModel['discretize'];
  const vertical = axis === 'vertical';
  switch (spec.kind) {
    case 'constant-velocity':
    case 'gravity':
    case 'fitted-gravity': {
      const g = spec.kind === 'gravity' && vertical ? gravityOf(spec) : 0;
      if (n === 2) {
        // x_k = [[1, dt], [0, 1]] x_k-1 + [-g dt^2/2, -g dt] + w
        discretize = (dtS, F, u, Q) => {
          F[0] = 1; F[1] = dtS; F[2] = 0; F[3] = 1;
          u[0] = -0.5 * g * dtS * dtS; u[1] = -g * dtS;
          whiteNoiseAccelerationQ(dtS, q, Q, 2);
        };
      } else {
        // fitted gravity: [p, v, g], x_k = [[1, dt, -dt^2/2], [0, 1, -dt], [0, 0, 1]] x_k-1 + w, g noise-free
        discretize = (dtS, F, u, Q) => {
          F[0] = 1; F[1] = dtS; F[2] = -0.5 * dtS * dtS;
          F[3] = 0; F[4] = 1; F[5] = -dtS;
          F[6] = 0; F[7] = 0; F[8] = 1;
          u[0] = 0; u[1] = 0; u[2] = 0;
          Q.fill(0);
          whiteNoiseAccelerationQ(dtS, q, Q, 3);
        };
      }
      break;
    }
    case 'free-acceleration':
      // x_k = [[1, dt, dt^2/2], [0, 1, dt], [0, 0, 1]] x_k-1 + w, white jerk
      discretize = (dtS, F, u, Q) => {
        F[0] = 1; F[1] = dtS; F[2] = 0.5 * dtS * dtS;
        F[3] = 0; F[4] = 1; F[5] = dtS;
        F[6] = 0; F[7] = 0; F[8] = 1;
        u[0] = 0; u[1] = 0; u[2] = 0;
        whiteJerkQ(dtS, q, Q);
      };
      break;
    default:
      throw new RangeError(`unknown hypothesis kind ${String((spec as HypothesisSpec).kind)}`);
  }
  const model: StateSpaceModel = { n, m: 1, discretize, H, R: Float64Array.of(r), x0, P0 };
  validateModel(model);
  return model;
}

function defaultP0(n: number): Float64Array {
  const P0 = new Float64Array(n * n);
  P0[0] = 1e2;
  P0[n + 1] = 1e2;
  if (n === 3) P0[8] = 1e4;
  return P0;
}

/**
 * Reads which lab axis points up: '+z', '-z', '+y', '-y', '+x', '-x' (a bare 'z' means '+z';
 * case and surrounding blanks are ignored).
 * @param text - the axis description
 * @returns the lab axis index (0 = x, 1 = y, 2 = z) and the sign that maps it to "up positive"
 * @throws RangeError for anything else
 */
export function parseUpAxis(text: string): { index: 0 | 1 | 2; sign: 1 | -1 } {
  const t = String(text).trim().toLowerCase();
  const m = /^([+-]?)([xyz])$/.exec(t);
  if (!m) throw new RangeError(`up axis must be one of +x, -x, +y, -y, +z, -z; got '${text}'`);
  const index = (m[2] === 'x' ? 0 : m[2] === 'y' ? 1 : 2) as 0 | 1 | 2;
  return { index, sign: m[1] === '-' ? -1 : 1 };
}
