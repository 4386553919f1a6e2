/**
 * Motion start (release): the first sample from which the downward speed of the reconstructed state stays
 * above a threshold for a sustained time, moved back to where the speed extrapolates to zero with the
 * acceleration at that sample (t0 = t - speed / downward acceleration, at most 0.2 s back).
 *
 * @param timesS - sample times, s
 * @param state - T x 3 states [height m, velocity m/s, acceleration m/s^2] (up positive)
 * @param speedThresholdMps - downward speed that counts as moving, m/s
 * @param sustainMs - how long it must stay above, ms
 * @param untilS - search no later than this, s (e.g. the raw contact)
 * @returns release time, s, or null when the object never starts moving
 */
export function detectRelease(timesS: Float64Array, state: Float64Array, speedThresholdMps: number, sustainMs: number, untilS = Infinity): number | null {
  const T = timesS.length;
  let runStart = -1;
  for (let i = 0; i < T && timesS[i] <= untilS; i++) {
    const speedDown = -state[i * 3 + 1];
    if (speedDown > speedThresholdMps) {
      if (runStart < 0) runStart = i;
      if ((timesS[i] - timesS[runStart]) * 1000 >= sustainMs) {
        const t = timesS[runStart];
        const s = -state[runStart * 3 + 1];
        const aDown = -state[runStart * 3 + 2];
        const back = aDown > 0.5 ? Math.min(s / aDown, 0.2) : 0;
        return Math.max(timesS[0], t - back);
      }
    } else runStart = -1;
  }
  return null;
}
