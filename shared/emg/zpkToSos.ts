/**
 * Conversion of a digital ZPK system to second-order sections with scipy's 'nearest' pairing, so that
 * Forecatch's sections match `scipy.signal.zpk2sos(z, p, k)` section by section: the pole closest to the
 * unit circle is placed last, and each pole pair takes the nearest zero(s).
 */
import { cAbs, cSub, type Complex, type Zpk } from './complexZpk';

/** Second-order sections, row-major: section s is [b0, b1, b2, a0, a1, a2] at 6s..6s+5, with a0 = 1. */
export type Sos = Float64Array;

interface Root {
  c: Complex;
  real: boolean;
}

/** Splits roots into one representative per conjugate pair (positive imaginary part) then the real roots. */
function conjugatePairs(roots: Complex[]): Root[] {
  const eps = 2.220446049250313e-16;
  const reals: number[] = [];
  const pos: Complex[] = [];
  const neg: Complex[] = [];
  for (const r of roots) {
    if (Math.abs(r.im) <= 100 * eps * cAbs(r)) reals.push(r.re);
    else if (r.im > 0) pos.push(r);
    else neg.push(r);
  }
  if (pos.length !== neg.length) throw new RangeError('zpkToSos: a complex root has no conjugate partner');
  const byReIm = (a: Complex, b: Complex): number => a.re - b.re || Math.abs(a.im) - Math.abs(b.im);
  pos.sort(byReIm);
  neg.sort(byReIm);
  const out: Root[] = [];
  const used = new Uint8Array(neg.length);
  for (const p of pos) {
    let best = -1;
    let bestD = Infinity;
    for (let i = 0; i < neg.length; i++) {
      if (used[i]) continue;
      const d = Math.hypot(p.re - neg[i].re, p.im + neg[i].im);
      if (d < bestD) {
        bestD = d;
        best = i;
      }
    }
    used[best] = 1;
    out.push({ c: { re: (p.re + neg[best].re) / 2, im: (p.im - neg[best].im) / 2 }, real: false });
  }
  reals.sort((a, b) => a - b);
  for (const r of reals) out.push({ c: { re: r, im: 0 }, real: true });
  return out;
}

function idxWorst(roots: Root[], among?: (r: Root) => boolean): number {
  let best = -1;
  let bestD = Infinity;
  for (let i = 0; i < roots.length; i++) {
    if (among && !among(roots[i])) continue;
    const d = Math.abs(1 - cAbs(roots[i].c));
    if (d < bestD) {
      bestD = d;
      best = i;
    }
  }
  return best;
}

function nearestIdx(from: Root[], to: Complex, which: 'real' | 'complex' | 'any'): number {
  const order = from.map((r, i) => ({ i, d: cAbs(cSub(r.c, to)) }));
  order.sort((a, b) => a.d - b.d || a.i - b.i);
  for (const o of order) {
    const r = from[o.i];
    if (which === 'any' || (which === 'real') === r.real) return o.i;
  }
  throw new RangeError(`zpkToSos: no ${which} root left to pair`);
}

/** Monic polynomial with the given (conjugate-closed) roots, real part, length roots.length + 1. */
function poly(roots: Complex[]): number[] {
  let re = [1];
  let im = [0];
  for (const r of roots) {
    const nre = new Array<number>(re.length + 1).fill(0);
    const nim = new Array<number>(re.length + 1).fill(0);
    for (let i = 0; i < re.length; i++) {
      nre[i] += re[i];
      nim[i] += im[i];
      nre[i + 1] -= re[i] * r.re - im[i] * r.im;
      nim[i + 1] -= re[i] * r.im + im[i] * r.re;
    }
    re = nre;
    im = nim;
  }
  return re;
}

function section(out: Float64Array, si: number, zeros: Complex[], poles: Complex[]): void {
  const b = poly(zeros);
  const a = poly(poles);
  for (let i = 0; i < b.length; i++) out[si * 6 + 3 - b.length + i] = b[i];
  for (let i = 0; i < a.length; i++) out[si * 6 + 6 - a.length + i] = a[i];
}

/**
 * Second-order sections of a digital ZPK system ('nearest' pairing, gain folded into the first section).
 * @param zpk - digital zeros, poles and gain (complex roots in conjugate pairs)
 * @returns sections, row-major n x 6
 * @throws RangeError when a complex root has no conjugate
 * @see scipy.signal.zpk2sos (scipy 1.10), whose pairing rules this reproduces
 */
export function zpkToSos(zpk: Zpk): Sos {
  const zIn = zpk.zeros.slice();
  const pIn = zpk.poles.slice();
  const zero: Complex = { re: 0, im: 0 };
  while (pIn.length < zIn.length) pIn.push(zero);
  while (zIn.length < pIn.length) zIn.push(zero);
  const nSections = Math.floor((pIn.length + 1) / 2);
  if (pIn.length % 2 === 1) {
    pIn.push(zero);
    zIn.push(zero);
  }
  const out = new Float64Array(Math.max(1, nSections) * 6);
  if (pIn.length === 0) {
    out.set([zpk.gain, 0, 0, 1, 0, 0]);
    return out;
  }
  const z = conjugatePairs(zIn);
  const p = conjugatePairs(pIn);
  const countReal = (rs: Root[]): number => rs.reduce((n, r) => n + (r.real ? 1 : 0), 0);
  const conj = (c: Complex): Complex => ({ re: c.re, im: -c.im });
  for (let si = nSections - 1; si >= 0; si--) {
    const p1 = p.splice(idxWorst(p), 1)[0];
    if (p1.real && countReal(p) === 0) {
      const z1 = z.splice(nearestIdx(z, p1.c, 'real'), 1)[0];
      section(out, si, [z1.c, zero], [p1.c, zero]);
    } else if (p.length + 1 === z.length && !p1.real && countReal(p) === 1 && countReal(z) === 1) {
      const z1 = z.splice(nearestIdx(z, p1.c, 'complex'), 1)[0];
      section(out, si, [z1.c, conj(z1.c)], [p1.c, conj(p1.c)]);
    } else {
      const p2 = p1.real ? p.splice(idxWorst(p, (r) => r.real), 1)[0].c : conj(p1.c);
      if (z.length > 0) {
        const z1 = z.splice(nearestIdx(z, p1.c, 'any'), 1)[0];
        if (!z1.real) section(out, si, [z1.c, conj(z1.c)], [p1.c, p2]);
        else if (z.length > 0) {
          const z2 = z.splice(nearestIdx(z, p1.c, 'real'), 1)[0];
          section(out, si, [z1.c, z2.c], [p1.c, p2]);
        } else section(out, si, [z1.c], [p1.c, p2]);
      } else section(out, si, [], [p1.c, p2]);
    }
  }
  for (let i = 0; i < 3; i++) out[i] *= zpk.gain;
  return out;
}
