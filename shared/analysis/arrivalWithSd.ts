import { arrivalTimeS } from './arrivalTime';

/**
 * Arrival time under constant acceleration and its SD by the delta method.
 * t solves f = d + v t + a t^2 / 2 = 0 with d = p - target; by the implicit function theorem
 * dt/dp = -1/f_t, dt/dv = -t/f_t, dt/da = -(t^2/2)/f_t with f_t = v + a t, and var(t) = J Sigma J'.
 *
 * @param posM - height, m
 * @param velMps - velocity, m/s
 * @param accMps2 - acceleration used, m/s^2
 * @param targetM - target height, m
 * @param cov - 3x3 row-major covariance of (p, v, a) (zeros where fixed)
 * @param out - receives [time s (NaN if unreachable), SD s]
 * @see Casella & Berger 2002, Statistical Inference, sec. 5.5.4 (delta method)
 */
export function arrivalWithSd(posM: number, velMps: number, accMps2: number, targetM: number, cov: Float64Array, out: Float64Array): void {
  const t = arrivalTimeS(posM, velMps, accMps2, targetM);
  out[0] = t;
  if (!Number.isFinite(t)) {
    out[1] = NaN;
    return;
  }
  const ft = velMps + accMps2 * t;
  if (ft === 0) {
    out[1] = NaN;
    return;
  }
  const j0 = -1 / ft;
  const j1 = -t / ft;
  const j2 = -(0.5 * t * t) / ft;
  const v =
    j0 * (cov[0] * j0 + cov[1] * j1 + cov[2] * j2) +
    j1 * (cov[3] * j0 + cov[4] * j1 + cov[5] * j2) +
    j2 * (cov[6] * j0 + cov[7] * j1 + cov[8] * j2);
  out[1] = Math.sqrt(Math.max(v, 0));
}
