import { createAxisLogLik, kalmanFilter, makeAxisModel, rtsSmooth, type HypothesisSpec } from '../ssm';
import type { ReconstructionSettings } from './types';
import { fitAxisNoiseGrid, refineAxisNoiseMle, refineAxisNoiseNewton } from './fitAxisNoiseGrid';
import { G0_MPS2 } from './hypothesisTtc';

/** Filtered and smoothed vertical states in the common 3-state layout [height, velocity, acceleration]. */
export interface VerticalReconstruction {
  /** T x 3 and T x 9, smoothed. */
  smoothedState: Float64Array;
  smoothedCov: Float64Array;
  /** T x 3 and T x 9, filtered (causal). */
  filteredState: Float64Array;
  filteredCov: Float64Array;
  noise: { qIntensity: number; measurementVarM2: number; logLik: number; fitted: boolean };
}

/**
 * Copies an n-state result (n = 2: [p, v]; n = 3: [p, v, a] or [p, v, g] with a = -g) into the 3-state
 * layout; for n = 2 the acceleration is the fixed value `accFixed` with zero variance.
 */
function toThreeState(x: Float64Array, P: Float64Array, n: number, T: number, kind: string, accFixed: number, outX: Float64Array, outP: Float64Array): void {
  const flip = kind === 'fitted-gravity' ? -1 : 1;
  for (let k = 0; k < T; k++) {
    for (let i = 0; i < 3; i++) {
      outX[k * 3 + i] = i < n ? (i === 2 ? flip * x[k * n + i] : x[k * n + i]) : accFixed;
      for (let j = 0; j < 3; j++) {
        let v = 0;
        if (i < n && j < n) {
          v = P[k * n * n + i * n + j];
          if ((i === 2) !== (j === 2)) v *= flip;
        }
        outP[k * 9 + i * 3 + j] = v;
      }
    }
  }
}

/**
 * Reconstructs the vertical motion of the object: Kalman filter and RTS smoother under the reconstruction
 * hypothesis with noise fitted by maximum likelihood (a bounded log grid, refined by Newton steps on the log noise levels;
 * or fixed), giving position, velocity, acceleration and
 * their covariances at every sample.
 *
 * @param heightM - measured heights, m (NaN = missing), length T
 * @param timesS - sample times, s, strictly increasing
 * @param settings - reconstruction model and noise settings
 * @returns filtered and smoothed states in the 3-state layout
 * @throws RangeError when fewer than 3 heights are observed
 * @see Rauch, Tung & Striebel 1965, AIAA J 3:1445-1450
 */
export function reconstructVertical(heightM: Float64Array, timesS: Float64Array, settings: ReconstructionSettings): VerticalReconstruction {
  const T = timesS.length;
  let first = NaN;
  let count = 0;
  for (let i = 0; i < T; i++) {
    if (Number.isFinite(heightM[i])) {
      if (Number.isNaN(first)) first = heightM[i];
      count++;
    }
  }
  if (count < 3) throw new RangeError(`reconstructVertical: need at least 3 observed heights, got ${count}`);
  const spec: HypothesisSpec = { id: 'reconstruction', kind: settings.kind };
  const n = settings.kind === 'gravity' ? 2 : 3;
  const x0 = new Float64Array(n);
  x0[0] = first;
  if (settings.kind === 'fitted-gravity') x0[2] = G0_MPS2;
  const P0 = new Float64Array(n * n);
  P0[0] = 0.01;
  P0[n + 1] = 4;
  if (n === 3) P0[8] = 400;
  let noise: VerticalReconstruction['noise'];
  if (settings.noise.kind === 'fixed') {
    noise = { qIntensity: settings.noise.qIntensity, measurementVarM2: settings.noise.measurementVarM2, logLik: NaN, fitted: false };
  } else {
    // a bounded log grid finds the basin (28 filter runs); Newton steps on (ln q, ln R) refine it from
    // there (Nelder-Mead, the search of the engine's fitNoiseMle, when Newton cannot proceed), kept when it
    // does not lower the likelihood. All run the likelihood-only filter into one reused buffer.
    const logLik = createAxisLogLik(spec, heightM, timesS, x0, P0);
    let fit: { qIntensity: number; measurementVarM2: number; logLik: number } = fitAxisNoiseGrid(spec, heightM, timesS, x0, P0, logLik);
    const refined = refineAxisNoiseNewton(logLik, fit.qIntensity, fit.measurementVarM2) ?? refineAxisNoiseMle(logLik, fit.qIntensity, fit.measurementVarM2, 1e-6, 60);
    if (refined.logLik >= fit.logLik && refined.qIntensity > 0 && refined.measurementVarM2 > 0) fit = refined;
    noise = { qIntensity: fit.qIntensity, measurementVarM2: fit.measurementVarM2, logLik: fit.logLik, fitted: true };
  }
  const model = makeAxisModel(spec, { axis: 'vertical', qIntensity: noise.qIntensity, measurementVarM2: noise.measurementVarM2, x0, P0 });
  const filt = kalmanFilter(model, heightM, timesS);
  if (!noise.fitted) noise.logLik = filt.logLik;
  const sm = rtsSmooth(model, filt);
  const out: VerticalReconstruction = {
    smoothedState: new Float64Array(T * 3),
    smoothedCov: new Float64Array(T * 9),
    filteredState: new Float64Array(T * 3),
    filteredCov: new Float64Array(T * 9),
    noise,
  };
  const accFixed = settings.kind === 'gravity' ? -G0_MPS2 : 0;
  toThreeState(sm.xSmooth, sm.PSmooth, n, T, settings.kind, accFixed, out.smoothedState, out.smoothedCov);
  toThreeState(filt.xFilt, filt.PFilt, n, T, settings.kind, accFixed, out.filteredState, out.filteredCov);
  return out;
}
