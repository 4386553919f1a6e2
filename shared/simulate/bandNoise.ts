import type { SeededRandom } from '../analysis/seededRandom';

/**
 * Band-limited Gaussian noise: white noise through a 2nd-order resonator (RBJ band-pass biquad, constant
 * 0 dB peak gain), scaled to a unit RMS. Used for simulated surface EMG (energy mostly 20-250 Hz).
 *
 * @param n - samples
 * @param rateHz - sampling rate, Hz
 * @param centreHz - centre frequency, Hz
 * @param q - quality factor (centre / bandwidth)
 * @param rng - seeded generator
 * @returns n samples with RMS about 1
 * @see R. Bristow-Johnson, "Cookbook formulae for audio EQ biquad filter coefficients" (band-pass,
 *   constant 0 dB peak gain), common practice
 */
export function bandNoise(n: number, rateHz: number, centreHz: number, q: number, rng: SeededRandom): Float64Array {
  const w0 = (2 * Math.PI * centreHz) / rateHz;
  const alpha = Math.sin(w0) / (2 * q);
  const a0 = 1 + alpha;
  const b0 = alpha / a0;
  const b2 = -alpha / a0;
  const a1 = (-2 * Math.cos(w0)) / a0;
  const a2 = (1 - alpha) / a0;
  const out = new Float64Array(n);
  let x1 = 0;
  let x2 = 0;
  let y1 = 0;
  let y2 = 0;
  let ss = 0;
  for (let i = 0; i < n; i++) {
    const x = rng.normal();
    const y = b0 * x + b2 * x2 - a1 * y1 - a2 * y2;
    x2 = x1;
    x1 = x;
    y2 = y1;
    y1 = y;
    out[i] = y;
    ss += y * y;
  }
  const rms = Math.sqrt(ss / Math.max(n, 1)) || 1;
  for (let i = 0; i < n; i++) out[i] /= rms;
  return out;
}
