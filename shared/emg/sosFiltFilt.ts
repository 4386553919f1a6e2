/**
 * Zero-phase forward-backward filtering through second-order sections, with odd-extension padding and
 * steady-state initial conditions, matching scipy.signal.sosfiltfilt(sos, x) with its defaults
 * (padtype='odd', padlen = 3 * (2 * n_sections + 1 - min(#b2 == 0, #a2 == 0))).
 */
import { filtFiltFrom } from './filtFiltFrom';
import { checkSos } from './sosKernel';
import type { Sos } from './zpkToSos';

/** Options of {@link sosFiltFilt}. */
export interface SosFiltFiltOptions {
  /** Samples of odd extension at each end; default {@link defaultPadLength}(sos) as in scipy. 0 disables padding. */
  padLength?: number;
  /** Output buffer of the input's length (may be the input itself when it is a Float64Array). */
  out?: Float64Array;
}

/**
 * scipy's default odd-extension length for sosfiltfilt: 3 * (2 n + 1 - min(number of sections with b2 = 0,
 * number with a2 = 0)), n the number of sections.
 * @param sos - sections, n x 6
 * @returns pad length in samples
 */
export function defaultPadLength(sos: Sos): number {
  const n = sos.length / 6;
  let zb = 0;
  let za = 0;
  for (let s = 0; s < n; s++) {
    if (sos[s * 6 + 2] === 0) zb++;
    if (sos[s * 6 + 5] === 0) za++;
  }
  return 3 * (2 * n + 1 - Math.min(zb, za));
}

/**
 * Zero-phase filtering: the signal, extended at both ends by odd reflection (2 x[0] - x[k], 2 x[N-1] - x[N-1-k]),
 * is filtered forward from steady-state states scaled by its first sample, then backward from states scaled
 * by the forward output's last sample; the extension is then cut off. The magnitude response is |H|^2
 * (see butterworthSos's correctForPasses: 2 to keep the -3 dB point where it was asked).
 * @param sos - sections, n x 6, a0 = 1
 * @param x - input samples (finite; not modified unless passed as opts.out)
 * @param opts - {@link SosFiltFiltOptions}
 * @returns the zero-phase filtered samples
 * @throws RangeError for malformed sections, a bad padLength, or a signal not longer than the pad length
 *   (the message names both numbers)
 * @see Gustafsson F. (1996) Determining the initial states in forward-backward filtering, IEEE Trans Signal
 *   Process 44:988-992; scipy.signal.sosfiltfilt (scipy 1.10)
 */
export function sosFiltFilt(sos: Sos, x: Float64Array | Float32Array, opts: SosFiltFiltOptions = {}): Float64Array {
  checkSos(sos, 'sosFiltFilt');
  const n = x.length;
  const edge = opts.padLength ?? defaultPadLength(sos);
  if (!Number.isInteger(edge) || !(edge >= 0)) throw new RangeError(`sosFiltFilt: padLength must be a non-negative integer, got ${edge}`);
  if (!(n > edge)) {
    throw new RangeError(`sosFiltFilt: the signal has ${n} samples; it must be longer than the pad length ${edge} samples`);
  }
  if (opts.out && opts.out.length !== n) throw new RangeError(`sosFiltFilt: out has ${opts.out.length} samples, input has ${n}`);
  const out = opts.out ?? new Float64Array(n);
  // Read straight from x unless it is another view of out's memory (then copy first, as set() handles overlap).
  if (x instanceof Float64Array && ((x as unknown) === out || x.buffer !== out.buffer)) filtFiltFrom(sos, x, 0, out, edge);
  else {
    out.set(x);
    filtFiltFrom(sos, out, 0, out, edge);
  }
  return out;
}
