/**
 * Butterworth filter design in second-order sections, with an optional cutoff correction for filters run
 * more than once (forward-backward zero-phase filtering runs them twice).
 */
import { bilinearZpk, butterworthPrototype, transformPrototype, type FilterType } from './butterworthZpk';
import { zpkToSos, type Sos } from './zpkToSos';

export type { FilterType } from './butterworthZpk';
export type { Sos } from './zpkToSos';

/** Options of {@link butterworthSos}. */
export interface ButterworthOptions {
  /**
   * Number of passes n the filter will be run (2 for forward-backward zero-phase filtering). When above 1,
   * the design edges are moved so that the n-pass response is at -3 dB at the requested cutoff(s).
   * Default 1 (no correction).
   */
  correctForPasses?: number;
}

/**
 * Cutoff correction factor for n passes of an order-N Butterworth: C = (2^(1/n) - 1)^(1/(2N)).
 * @param order - Butterworth (prototype) order N
 * @param passes - number of passes n (2 for forward-backward)
 * @returns C (0.802 for N = 2, n = 2)
 * @see Winter D.A. (2009) Biomechanics and Motor Control of Human Movement, 4th ed., p. 69
 */
export function passCorrectionFactor(order: number, passes: number): number {
  return (2 ** (1 / passes) - 1) ** (1 / (2 * order));
}

function checkArgs(order: number, edges: number[], sampleRateHz: number, type: FilterType): void {
  if (!Number.isInteger(order) || !(order >= 1 && order <= 24)) {
    throw new RangeError(`butterworthSos: order must be an integer from 1 to 24, got ${order}`);
  }
  if (!(sampleRateHz > 0) || !Number.isFinite(sampleRateHz)) {
    throw new RangeError(`butterworthSos: sample rate must be a positive finite number of Hz, got ${sampleRateHz}`);
  }
  const band = type === 'bandpass' || type === 'bandstop';
  if (band !== (edges.length === 2)) {
    throw new RangeError(`butterworthSos: a ${type} filter takes ${band ? 'two cutoffs [lowHz, highHz]' : 'one cutoff'}, got ${edges.length}`);
  }
  const nyquist = sampleRateHz / 2;
  for (const f of edges) {
    if (!(f > 0)) throw new RangeError(`butterworthSos: cutoff must be above 0 Hz, got ${f} Hz`);
    if (!(f < nyquist)) {
      throw new RangeError(
        `butterworthSos: cutoff ${f} Hz is not below the Nyquist frequency ${nyquist} Hz (sample rate ${sampleRateHz} Hz); raise the sample rate or lower the cutoff`,
      );
    }
  }
  if (band && !(edges[0] < edges[1])) {
    throw new RangeError(`butterworthSos: band edges must increase, got [${edges[0]}, ${edges[1]}] Hz`);
  }
}

/**
 * Pre-warped design edges (tan(pi f / fs), dimensionless) after the n-pass correction.
 * Low-pass: divided by C; high-pass: multiplied by C; band-pass (band-stop): same geometric centre,
 * bandwidth divided (multiplied) by C, which is the exact image of the low-pass rule under the band transform.
 */
function prewarpedEdges(edgesHz: number[], sampleRateHz: number, type: FilterType, order: number, passes: number): number[] {
  const w = edgesHz.map((f) => Math.tan((Math.PI * ((2 * f) / sampleRateHz)) / 2));
  if (!(passes > 1)) return w;
  const c = passCorrectionFactor(order, passes);
  if (type === 'lowpass') return [w[0] / c];
  if (type === 'highpass') return [w[0] * c];
  const centre2 = w[0] * w[1];
  const bw = type === 'bandpass' ? (w[1] - w[0]) / c : (w[1] - w[0]) * c;
  const lo = Math.sqrt((bw * bw) / 4 + centre2) - bw / 2;
  return [lo, lo + bw];
}

/**
 * Design cutoffs in Hz actually used for a filter corrected for n passes (equal to the request when n = 1).
 * Useful for methods text: "designed at 24.9 and 361 Hz so that the two-pass response is -3 dB at 20 and 450 Hz".
 * @param order - prototype order N
 * @param cutoffHz - requested cutoff or [low, high], Hz
 * @param sampleRateHz - sample rate, Hz
 * @param type - response kind
 * @param passes - number of passes n
 * @returns design cutoff(s) in Hz
 * @throws RangeError as {@link butterworthSos}
 */
export function correctedCutoffHz(order: number, cutoffHz: number | readonly number[], sampleRateHz: number, type: FilterType, passes: number): number[] {
  const edges = typeof cutoffHz === 'number' ? [cutoffHz] : [...cutoffHz];
  checkArgs(order, edges, sampleRateHz, type);
  return prewarpedEdges(edges, sampleRateHz, type, order, passes).map((w) => (sampleRateHz * Math.atan(w)) / Math.PI);
}

/**
 * Digital Butterworth filter as second-order sections, designed from the analog prototype poles with the
 * bilinear transform and pre-warped edges (agrees with `scipy.signal.butter(order, Wn, btype, fs=fs, output='sos')`).
 * Band-pass and band-stop filters of order N have 2N poles (N sections), as in scipy.
 * @param order - prototype order N (1-24)
 * @param cutoffHz - cutoff (low/high-pass) or [lowHz, highHz] (band-pass/stop), each in (0, rateHz/2)
 * @param sampleRateHz - sample rate, Hz
 * @param type - 'lowpass' | 'highpass' | 'bandpass' | 'bandstop'
 * @param opts - {@link ButterworthOptions}; `correctForPasses: 2` for forward-backward use
 * @returns sections, row-major n x 6 ([b0 b1 b2 1 a1 a2] per section)
 * @throws RangeError when the order is not an integer in range, or a cutoff is not strictly between 0 and
 *   the Nyquist frequency (the message names cutoff, Nyquist frequency and sample rate)
 * @see Butterworth S. (1930) Wireless Engineer 7:536-541; Oppenheim & Schafer (2010) section 7.2.2 (bilinear
 *   transform); Winter (2009) p. 69 (multi-pass cutoff correction)
 */
export function butterworthSos(
  order: number,
  cutoffHz: number | readonly number[],
  sampleRateHz: number,
  type: FilterType,
  opts: ButterworthOptions = {},
): Sos {
  const edges = typeof cutoffHz === 'number' ? [cutoffHz] : [...cutoffHz];
  checkArgs(order, edges, sampleRateHz, type);
  const passes = opts.correctForPasses ?? 1;
  if (!(passes >= 1) || !Number.isInteger(passes)) {
    throw new RangeError(`butterworthSos: correctForPasses must be a positive integer, got ${passes}`);
  }
  // Batch work designs the same few filters for every channel: designs are kept by their arguments and each
  // caller gets its own copy.
  const key = `${order}|${edges.join(',')}|${sampleRateHz}|${type}|${passes}`;
  let sos = designs.get(key);
  if (!sos) {
    // Pre-warping for the bilinear transform at fs = 2 (normalised): Omega = 2 fs tan(pi Wn / fs) = 4 tan(pi f / rate).
    const warped = prewarpedEdges(edges, sampleRateHz, type, order, passes).map((w) => 4 * w);
    const analog = transformPrototype(butterworthPrototype(order), type, warped);
    sos = zpkToSos(bilinearZpk(analog, 2));
    if (designs.size >= MAX_KEPT_DESIGNS) designs.clear();
    designs.set(key, sos);
  }
  return sos.slice();
}

const MAX_KEPT_DESIGNS = 64;
const designs = new Map<string, Sos>();
