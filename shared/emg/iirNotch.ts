/**
 * Mains-interference notch filters: a second-order IIR notch per harmonic, as second-order sections.
 */
import type { Sos } from './zpkToSos';

/**
 * Second-order IIR notch at f0 with quality factor Q (-3 dB bandwidth f0 / Q), as one section:
 * beta = tan(pi bw / fs), g = 1 / (1 + beta), b = g [1, -2 cos w0, 1], a = [1, -2 g cos w0, 2 g - 1].
 * @param f0Hz - notch frequency, Hz, in (0, rateHz/2)
 * @param q - quality factor (> 0)
 * @param rateHz - sample rate, Hz
 * @returns one section [b0 b1 b2 1 a1 a2]
 * @throws RangeError when f0 is not strictly between 0 and the Nyquist frequency, or Q is not positive
 * @see Orfanidis S.J. (1996) Introduction to Signal Processing, Prentice-Hall (design
 *   equations as in scipy.signal.iirnotch, scipy 1.10)
 */
export function iirNotchSos(f0Hz: number, q: number, rateHz: number): Sos {
  if (!(rateHz > 0) || !Number.isFinite(rateHz)) throw new RangeError(`iirNotchSos: sample rate must be positive, got ${rateHz} Hz`);
  if (!(f0Hz > 0 && f0Hz < rateHz / 2)) {
    throw new RangeError(`iirNotchSos: notch ${f0Hz} Hz must be between 0 and the Nyquist frequency ${rateHz / 2} Hz (sample rate ${rateHz} Hz)`);
  }
  if (!(q > 0) || !Number.isFinite(q)) throw new RangeError(`iirNotchSos: quality factor must be positive, got ${q}`);
  const w0 = (2 * f0Hz) / rateHz;
  const bw = w0 / q;
  // gb = 1/sqrt(2): beta = sqrt(1 - gb^2)/gb * tan(pi bw / 2) = tan(pi bw / 2)
  const gb = 1 / Math.sqrt(2);
  const beta = (Math.sqrt(1 - gb ** 2) / gb) * Math.tan((bw * Math.PI) / 2);
  const gain = 1 / (1 + beta);
  const c = Math.cos(w0 * Math.PI);
  return Float64Array.of(gain, -2 * gain * c, gain, 1, -2 * gain * c, 2 * gain - 1);
}

/**
 * Notches at the mains frequency and its harmonics below the Nyquist frequency, one section each.
 * @param mainsHz - 50 or 60 (any positive frequency is accepted)
 * @param harmonics - number of frequencies notched: mainsHz, 2 mainsHz, ... (those at or above Nyquist are skipped)
 * @param q - quality factor of every notch
 * @param rateHz - sample rate, Hz
 * @returns stacked sections (n x 6)
 * @throws RangeError when even the fundamental is at or above the Nyquist frequency, or harmonics < 1
 */
export function mainsNotchSos(mainsHz: number, harmonics: number, q: number, rateHz: number): Sos {
  if (!Number.isInteger(harmonics) || !(harmonics >= 1)) throw new RangeError(`mainsNotchSos: harmonics must be a positive integer, got ${harmonics}`);
  const kept: number[] = [];
  for (let h = 1; h <= harmonics; h++) if (h * mainsHz < rateHz / 2) kept.push(h * mainsHz);
  if (kept.length === 0) {
    throw new RangeError(`mainsNotchSos: mains ${mainsHz} Hz is not below the Nyquist frequency ${rateHz / 2} Hz (sample rate ${rateHz} Hz)`);
  }
  const sos = new Float64Array(kept.length * 6);
  kept.forEach((f, i) => sos.set(iirNotchSos(f, q, rateHz), i * 6));
  return sos;
}
