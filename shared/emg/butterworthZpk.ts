/**
 * Digital Butterworth filters as zeros, poles and gain: analog prototype poles, frequency transformation
 * (low-pass to low/high/band-pass/band-stop) and the bilinear transform with pre-warped edges.
 * The steps and their order follow scipy.signal (buttap, lp2*_zpk, bilinear_zpk) so that the resulting
 * sections agree with `scipy.signal.butter(..., output='sos')` to rounding.
 */
import { cAdd, cDiv, cMul, cProd, cReal, cScale, cSqrt, cSub, type Complex, type Zpk } from './complexZpk';

/** Kind of Butterworth response. */
export type FilterType = 'lowpass' | 'highpass' | 'bandpass' | 'bandstop';

/**
 * Poles of the normalised analog Butterworth low-pass prototype of order N (cutoff 1 rad/s):
 * p_m = -exp(j pi m / (2N)), m = -N+1, -N+3, ..., N-1; no zeros; gain 1.
 * @param order - prototype order N (>= 1)
 * @returns the prototype's zeros, poles and gain
 * @see Butterworth S. (1930) On the theory of filter amplifiers, Wireless Engineer 7:536-541
 */
export function butterworthPrototype(order: number): Zpk {
  const poles: Complex[] = [];
  for (let m = -order + 1; m < order; m += 2) {
    const theta = (Math.PI * m) / (2 * order);
    poles.push({ re: -Math.cos(theta), im: -Math.sin(theta) });
  }
  return { zeros: [], poles, gain: 1 };
}

function negProd(values: Complex[]): Complex {
  return cProd(values.map((v) => cScale(v, -1)));
}

/**
 * Maps an analog low-pass prototype (cutoff 1 rad/s) to an analog filter with edge(s) in rad/s.
 * @param proto - analog low-pass prototype
 * @param type - response kind
 * @param edgesRad - one edge (low/high-pass) or [low, high] (band-pass/stop), rad/s, positive and increasing
 * @returns the analog filter's zeros, poles and gain
 */
export function transformPrototype(proto: Zpk, type: FilterType, edgesRad: number[]): Zpk {
  const degree = proto.poles.length - proto.zeros.length;
  if (type === 'lowpass') {
    const wo = edgesRad[0];
    return {
      zeros: proto.zeros.map((z) => cScale(z, wo)),
      poles: proto.poles.map((p) => cScale(p, wo)),
      gain: proto.gain * wo ** degree,
    };
  }
  if (type === 'highpass') {
    const wo = cReal(edgesRad[0]);
    const zeros = proto.zeros.map((z) => cDiv(wo, z));
    for (let i = 0; i < degree; i++) zeros.push(cReal(0));
    const ratio = cDiv(negProd(proto.zeros), negProd(proto.poles));
    return { zeros, poles: proto.poles.map((p) => cDiv(wo, p)), gain: proto.gain * ratio.re };
  }
  const [lo, hi] = edgesRad;
  const bw = hi - lo;
  const wo = Math.sqrt(lo * hi);
  const wo2 = cReal(wo * wo);
  // Each prototype root r maps to the two roots of s^2 - (r bw) s + wo^2 = 0 (band-pass)
  // or of s^2 - (bw / r) s + wo^2 = 0 (band-stop).
  const split = (r: Complex): [Complex, Complex] => {
    const root = cSqrt(cSub(cMul(r, r), wo2));
    return [cAdd(r, root), cSub(r, root)];
  };
  const splitAll = (roots: Complex[]): Complex[] => {
    const pairs = roots.map(split);
    return [...pairs.map((p) => p[0]), ...pairs.map((p) => p[1])];
  };
  if (type === 'bandpass') {
    const zeros = splitAll(proto.zeros.map((z) => cScale(z, bw / 2)));
    for (let i = 0; i < degree; i++) zeros.push(cReal(0));
    return { zeros, poles: splitAll(proto.poles.map((p) => cScale(p, bw / 2))), gain: proto.gain * bw ** degree };
  }
  const half = cReal(bw / 2);
  const zeros = splitAll(proto.zeros.map((z) => cDiv(half, z)));
  for (let i = 0; i < degree; i++) zeros.push({ re: 0, im: wo });
  for (let i = 0; i < degree; i++) zeros.push({ re: 0, im: -wo });
  const ratio = cDiv(negProd(proto.zeros), negProd(proto.poles));
  return { zeros, poles: splitAll(proto.poles.map((p) => cDiv(half, p))), gain: proto.gain * ratio.re };
}

/**
 * Bilinear transform s = 2 fs (z - 1) / (z + 1) of an analog ZPK system; zeros at infinity go to z = -1.
 * @param analog - analog zeros, poles and gain
 * @param fs - sample rate used by the transform (the designer uses 2, with edges pre-warped to match)
 * @returns the digital zeros, poles and gain
 * @see Oppenheim & Schafer (2010) Discrete-Time Signal Processing, 3rd ed., section 7.2.2
 */
export function bilinearZpk(analog: Zpk, fs: number): Zpk {
  const fs2 = cReal(2 * fs);
  const degree = analog.poles.length - analog.zeros.length;
  const zeros = analog.zeros.map((z) => cDiv(cAdd(fs2, z), cSub(fs2, z)));
  for (let i = 0; i < degree; i++) zeros.push(cReal(-1));
  const poles = analog.poles.map((p) => cDiv(cAdd(fs2, p), cSub(fs2, p)));
  const num = cProd(analog.zeros.map((z) => cSub(fs2, z)));
  const den = cProd(analog.poles.map((p) => cSub(fs2, p)));
  return { zeros, poles, gain: analog.gain * cDiv(num, den).re };
}
