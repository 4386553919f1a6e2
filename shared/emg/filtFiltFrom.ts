/**
 * The arithmetic of sosFiltFilt, taking its input from a source array with an offset subtracted: the copy into
 * the output and the offset removal are one loop, and the odd-extension padding is read from the source.
 */
import { bandCascadePlan, bandFiltFilt } from './bandCascade';
import { oddExtensions } from './oddExtensions';
import { sosFiltZi } from './sosFilt';
import { sosFilterInPlace } from './sosKernel';
import type { Sos } from './zpkToSos';

/**
 * out = sosFiltFilt(sos, src - shift) with odd-extension padding of `edge` samples (see sosFiltFilt for the
 * method). Arguments are not checked: sos valid, out of src's length (may be src itself), src.length > edge >= 0.
 * @param sos - sections, n x 6, a0 = 1
 * @param src - input samples (not modified unless it is out)
 * @param shift - subtracted from every input sample (0 for none: x - 0 === x exactly)
 * @param out - output buffer
 * @param edge - odd-extension length, samples
 * @see sosFiltFilt in sosFiltFilt.ts; Gustafsson F. (1996) IEEE Trans Signal Process 44:988-992
 */
export function filtFiltFrom(sos: Sos, src: Float64Array, shift: number, out: Float64Array, edge: number): void {
  // Butterworth band-passes take the cheaper band-pass cascade (same transfer function, see bandCascade.ts).
  const band = bandCascadePlan(sos);
  if (band) {
    bandFiltFilt(band, src, shift, out, edge);
    return;
  }
  const n = src.length;
  const { left, right } = oddExtensions(src, shift, edge);
  const x0 = src[0] - shift;
  const zi = sosFiltZi(sos);
  const state = new Float64Array(zi.length);
  let first = edge > 0 ? left[0] : x0;
  for (let i = 0; i < zi.length; i++) state[i] = zi[i] * first;
  sosFilterInPlace(sos, left, 0, edge, false, state);
  sosFilterInPlace(sos, out, 0, n, false, state, src, shift);
  sosFilterInPlace(sos, right, 0, edge, false, state);
  first = edge > 0 ? right[edge - 1] : out[n - 1];
  for (let i = 0; i < zi.length; i++) state[i] = zi[i] * first;
  sosFilterInPlace(sos, right, 0, edge, true, state);
  sosFilterInPlace(sos, out, 0, n, true, state);
}
