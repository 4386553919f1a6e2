/**
 * Measured contact: the first instant after `fromS` at which the object's height comes down to the target
 * height, linearly interpolated between the two samples around the crossing.
 *
 * @param timesS - sample times, s
 * @param heightM - object height per sample, m (smoothed or gap-filled; NaN samples are skipped)
 * @param targetM - target height per sample, m
 * @param fromS - search from this time, s (release)
 * @returns contact time, s, or null when the object never reaches the target
 */
export function detectHeightContact(timesS: Float64Array, heightM: Float64Array, targetM: Float64Array, fromS: number): number | null {
  let prevI = -1;
  for (let i = 0; i < timesS.length; i++) {
    if (timesS[i] < fromS) continue;
    const d = heightM[i] - targetM[i];
    if (!Number.isFinite(d)) continue;
    if (d <= 0) {
      if (prevI < 0) return timesS[i];
      const d0 = heightM[prevI] - targetM[prevI];
      return timesS[prevI] + (d0 / (d0 - d)) * (timesS[i] - timesS[prevI]);
    }
    prevI = i;
  }
  return null;
}

/**
 * Contact from an impact channel: the first sample at or after `fromS` whose absolute value exceeds the
 * threshold.
 *
 * @param values - channel samples
 * @param rateHz - sampling rate, Hz
 * @param startS - time of sample 0, s
 * @param threshold - in the channel's units
 * @param fromS - search from this time, s
 * @returns contact time, s, or null
 */
export function detectImpactContact(values: Float64Array | Float32Array, rateHz: number, startS: number, threshold: number, fromS: number): number | null {
  const i0 = Math.max(0, Math.ceil((fromS - startS) * rateHz));
  for (let i = i0; i < values.length; i++) if (Math.abs(values[i]) > threshold) return startS + i / rateHz;
  return null;
}
