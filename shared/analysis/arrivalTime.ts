/**
 * Time until an object moving with constant acceleration along the vertical first reaches a height below it.
 *
 * Solves p + v t + a t^2 / 2 = target for the smallest t > 0 (second-order time-to-contact,
 * T2 = (-v + sqrt(v^2 + 2 a d)) / a in FACTS.md's notation with d the distance and signs toward the target).
 * This is the allocation-free kernel used inside likelihood grids; single evaluations with an SD use the
 * engine's `predictArrival` (shared/ssm/arrival.ts).
 *
 * @param posM - current height, m (up positive)
 * @param velMps - current vertical velocity, m/s (negative = falling)
 * @param accMps2 - constant vertical acceleration, m/s^2 (free fall = -9.80665)
 * @param targetM - target height, m
 * @returns time until arrival, s; NaN when already at/below the target or never reaching it
 */
export function arrivalTimeS(posM: number, velMps: number, accMps2: number, targetM: number): number {
  const d = posM - targetM; // distance still to fall, m
  if (!(d > 0)) return NaN;
  // 0.5 a t^2 + v t + d = 0
  if (Math.abs(accMps2) < 1e-12) return velMps < 0 ? d / -velMps : NaN;
  const disc = velMps * velMps - 2 * accMps2 * d;
  if (disc < 0) return NaN;
  const sq = Math.sqrt(disc);
  // numerically stable roots: q = -(v + sign(v) sq) / 2 ; t1 = q / (a/2), t2 = d / q
  const q = -0.5 * (velMps + (velMps >= 0 ? sq : -sq));
  const r1 = q / (0.5 * accMps2);
  const r2 = q !== 0 ? d / q : NaN;
  let best = NaN;
  if (r1 > 0) best = r1;
  if (r2 > 0 && !(r2 >= best)) best = r2;
  return best;
}
