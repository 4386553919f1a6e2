import type { AnalysisHypothesis } from './types';
import type { CutoffRows } from './cutoffRows';
import { arrivalTimeS } from './arrivalTime';
import type { PreparedTrial } from './types';

/** Standard acceleration of gravity, m/s^2 (exact; 3rd CGPM 1901, ISO 80000-3). */
export const G0_MPS2 = 9.80665;

/**
 * Posterior mean of the vertical acceleration for the Bayesian observer: a precision-weighted mean of a
 * Gaussian prior N(-gPrior, sigmaPrior^2) and the filter's estimate N(accFilt, accFiltVar).
 *   w = (1/sigmaPrior^2) / (1/sigmaPrior^2 + 1/accFiltVar);  a = w * (-gPrior) + (1 - w) * accFilt
 *
 * @param accFilt - filtered acceleration at the cutoff, m/s^2 (up positive)
 * @param accFiltVar - its variance, (m/s^2)^2
 * @param gPrior - prior centre magnitude, m/s^2
 * @param sigmaPrior - prior SD, m/s^2
 * @returns weight on the prior (0..1); posterior mean via {@link bayesPosteriorAcc}
 * @see Bishop 2006, Pattern Recognition and Machine Learning, eq. 2.141-2.142 (Gaussian with known
 *   variance: posterior mean as precision-weighted average)
 */
export function bayesPriorWeight(accFiltVar: number, sigmaPrior: number): number {
  const pp = 1 / (sigmaPrior * sigmaPrior);
  const pf = accFiltVar > 0 ? 1 / accFiltVar : Infinity;
  if (pf === Infinity) return 0;
  return pp / (pp + pf);
}

/**
 * Posterior mean acceleration of the Bayesian observer (see {@link bayesPriorWeight}).
 *
 * @param accFilt - filtered acceleration, m/s^2
 * @param accFiltVar - its variance, (m/s^2)^2
 * @param gPrior - prior centre magnitude, m/s^2
 * @param sigmaPrior - prior SD, m/s^2
 * @returns posterior mean, m/s^2 (up positive)
 */
export function bayesPosteriorAcc(accFilt: number, accFiltVar: number, gPrior: number, sigmaPrior: number): number {
  const w = bayesPriorWeight(accFiltVar, sigmaPrior);
  return w * -gPrior + (1 - w) * accFilt;
}

/**
 * Arrival time under quadratic drag opposing a downward motion, a(v) = -g + k v^2 (v < 0), by RK4 with
 * 1 ms steps (at most 10 s), the last step interpolated linearly.
 *
 * @param posM - height, m
 * @param velMps - velocity, m/s
 * @param gMps2 - gravity magnitude, m/s^2
 * @param kPerM - drag coefficient, 1/m
 * @param targetM - target height, m
 * @returns arrival time, s (NaN when never reached within 10 s)
 */
export function dragArrivalS(posM: number, velMps: number, gMps2: number, kPerM: number, targetM: number): number {
  if (!(posM > targetM)) return NaN;
  const h = 0.001;
  let p = posM;
  let v = velMps;
  const acc = (vv: number): number => -gMps2 + (vv < 0 ? kPerM * vv * vv : -kPerM * vv * vv);
  for (let i = 0; i < 10000; i++) {
    const k1p = v;
    const k1v = acc(v);
    const k2p = v + 0.5 * h * k1v;
    const k2v = acc(v + 0.5 * h * k1v);
    const k3p = v + 0.5 * h * k2v;
    const k3v = acc(v + 0.5 * h * k2v);
    const k4p = v + h * k3v;
    const k4v = acc(v + h * k3v);
    const pn = p + (h / 6) * (k1p + 2 * k2p + 2 * k3p + k4p);
    const vn = v + (h / 6) * (k1v + 2 * k2v + 2 * k3v + k4v);
    if (pn <= targetM) return i * h + (h * (p - targetM)) / (p - pn);
    p = pn;
    v = vn;
  }
  return NaN;
}

/**
 * The acceleration a hypothesis extrapolates with for one row, and its variance.
 *
 * @param h - hypothesis
 * @param rows - cutoff rows
 * @param r - row index
 * @param trial - the row's prepared trial (for the fitted constant acceleration)
 * @param sigmaPrior - Bayesian observer prior SD for this row's subject, m/s^2 (ignored otherwise)
 * @param out - receives [acceleration m/s^2, variance (m/s^2)^2, prior weight or NaN]
 */
export function hypothesisAcceleration(
  h: AnalysisHypothesis,
  rows: CutoffRows,
  r: number,
  trial: PreparedTrial,
  sigmaPrior: number,
  out: Float64Array,
): void {
  out[2] = NaN;
  switch (h.kind) {
    case 'constant-velocity':
      out[0] = 0;
      out[1] = 0;
      return;
    case 'gravity':
    case 'drag':
      out[0] = -(h.gMps2 ?? G0_MPS2);
      out[1] = 0;
      return;
    case 'fitted-gravity':
      out[0] = trial.fittedAccMps2;
      out[1] = trial.fittedAccSdMps2 * trial.fittedAccSdMps2;
      return;
    case 'free-acceleration':
      out[0] = rows.state[r * 3 + 2];
      out[1] = rows.cov[r * 9 + 8];
      return;
    case 'bayesian-observer': {
      const g = h.priorGMps2 ?? G0_MPS2;
      const vf = rows.accFiltVar[r];
      const w = bayesPriorWeight(vf, sigmaPrior);
      out[0] = w * -g + (1 - w) * rows.accFilt[r];
      out[1] = 1 / (1 / (sigmaPrior * sigmaPrior) + (vf > 0 ? 1 / vf : Infinity));
      out[2] = w;
      return;
    }
  }
}

/**
 * The Jacobian |d ttc / d onset| that converts a deviation of ttc at onset from the threshold into a
 * deviation of the onset time from the instant the threshold was reached (time residual = (ttc - theta) / J).
 * With cutoff = onset - delay, ttc = cutoff + tau - onset where tau solves
 * (p - target) + v tau + A tau^2 / 2 = 0 under the hypothesis' acceleration A, while the state itself moves
 * with the seen acceleration a (dp/dt = v, dv/dt = a); implicit differentiation gives
 *   d ttc / d onset = d tau / dt = -(v + a tau) / (v + A tau),
 * which is -1 when A = a (the hypothesis' predicted arrival does not drift). Floored at 1e-3.
 *
 * @param velMps - velocity at the cutoff, m/s
 * @param accSeenMps2 - acceleration of the state at the cutoff, m/s^2
 * @param accHypMps2 - acceleration the hypothesis extrapolates with, m/s^2
 * @param tauS - predicted arrival time from the cutoff, s
 * @returns |d ttc / d onset| (dimensionless)
 */
export function onsetJacobian(velMps: number, accSeenMps2: number, accHypMps2: number, tauS: number): number {
  const j = -(velMps + accSeenMps2 * tauS) / (velMps + accHypMps2 * tauS);
  return Math.max(Math.abs(j), 1e-3);
}

const acc3 = new Float64Array(3);

/**
 * Time-to-contact at onset (s) of every row under one hypothesis, allocation-free:
 * ttc = cutoff + arrival(state at cutoff, acceleration under h) - onset, and the Jacobian
 * |d ttc / d onset| ({@link onsetJacobian}; 1 when the cutoff does not move with the onset). NaN where the row has no base state or the target is unreachable.
 *
 * @param h - hypothesis
 * @param rows - cutoff rows (filled)
 * @param prepared - prepared trials the rows index
 * @param sigmaByRow - Bayesian prior SD per row, m/s^2 (only read for `bayesian-observer`)
 * @param out - receives n ttc values, s
 * @param outJac - receives n Jacobians
 * @param cutoffMovesWithOnset - false for the `after-release` rule (Jacobian 1)
 */
export function ttcUnderHypothesis(
  h: AnalysisHypothesis,
  rows: CutoffRows,
  prepared: readonly PreparedTrial[],
  sigmaByRow: Float64Array | null,
  out: Float64Array,
  outJac: Float64Array,
  cutoffMovesWithOnset: boolean,
): void {
  for (let r = 0; r < rows.n; r++) {
    if (!rows.base[r]) {
      out[r] = NaN;
      outJac[r] = NaN;
      continue;
    }
    const p = rows.state[r * 3];
    const v = rows.state[r * 3 + 1];
    // the state's own acceleration for the Jacobian: the trial's fitted constant acceleration (robust),
    // the reconstruction's estimate at the cutoff when no fit exists
    const fitted = prepared[rows.trialIndex[r]].fittedAccMps2;
    const aSeen = Number.isFinite(fitted) ? fitted : rows.state[r * 3 + 2];
    const target = rows.targetM[r];
    let t: number;
    let aHyp: number;
    if (h.kind === 'drag') {
      const g = h.gMps2 ?? G0_MPS2;
      const k = h.dragPerM ?? 0;
      t = dragArrivalS(p, v, g, k, target);
      aHyp = -g + k * v * v;
    } else {
      hypothesisAcceleration(h, rows, r, prepared[rows.trialIndex[r]], sigmaByRow ? sigmaByRow[r] : 1, acc3);
      aHyp = h.kind === 'free-acceleration' ? aSeen : acc3[0];
      t = arrivalTimeS(p, v, acc3[0], target);
    }
    out[r] = rows.cutoffS[r] + t - rows.onsetS[r];
    outJac[r] = cutoffMovesWithOnset ? onsetJacobian(v, aSeen, aHyp, t) : 1;
  }
}
