/**
 * Zeros, poles and gain (ZPK) of a filter, with the few complex operations the Butterworth design needs.
 * Design-time only: these small objects never appear in a per-sample loop.
 */

/** A complex number. */
export interface Complex {
  re: number;
  im: number;
}

/** Zeros, poles and gain of a transfer function (analog in s or digital in z). */
export interface Zpk {
  zeros: Complex[];
  poles: Complex[];
  gain: number;
}

/**
 * Complex sum.
 * @param a - first term
 * @param b - second term
 * @returns a + b
 */
export function cAdd(a: Complex, b: Complex): Complex {
  return { re: a.re + b.re, im: a.im + b.im };
}

/**
 * Complex difference.
 * @param a - minuend
 * @param b - subtrahend
 * @returns a - b
 */
export function cSub(a: Complex, b: Complex): Complex {
  return { re: a.re - b.re, im: a.im - b.im };
}

/**
 * Complex product.
 * @param a - first factor
 * @param b - second factor
 * @returns a b
 */
export function cMul(a: Complex, b: Complex): Complex {
  return { re: a.re * b.re - a.im * b.im, im: a.re * b.im + a.im * b.re };
}

/**
 * Complex number times a real number.
 * @param a - complex number
 * @param s - real factor
 * @returns a s
 */
export function cScale(a: Complex, s: number): Complex {
  return { re: a.re * s, im: a.im * s };
}

/**
 * Complex quotient (Smith's algorithm, robust to large or small parts).
 * @param a - dividend
 * @param b - divisor (non-zero)
 * @returns a / b
 */
export function cDiv(a: Complex, b: Complex): Complex {
  if (Math.abs(b.re) >= Math.abs(b.im)) {
    const r = b.im / b.re;
    const d = b.re + b.im * r;
    return { re: (a.re + a.im * r) / d, im: (a.im - a.re * r) / d };
  }
  const r = b.re / b.im;
  const d = b.re * r + b.im;
  return { re: (a.re * r + a.im) / d, im: (a.im * r - a.re) / d };
}

/**
 * Principal square root (branch cut on the negative real axis, as numpy.sqrt for complex input).
 * @param a - complex number
 * @returns sqrt(a) with non-negative real part
 */
export function cSqrt(a: Complex): Complex {
  if (a.re === 0 && a.im === 0) return { re: 0, im: a.im };
  const m = Math.hypot(a.re, a.im);
  const re = Math.sqrt((m + a.re) / 2);
  const imAbs = Math.sqrt((m - a.re) / 2);
  return { re, im: a.im < 0 || (a.im === 0 && Object.is(a.im, -0)) ? -imAbs : imAbs };
}

/**
 * Modulus.
 * @param a - complex number
 * @returns |a|
 */
export function cAbs(a: Complex): number {
  return Math.hypot(a.re, a.im);
}

/**
 * Complex conjugate.
 * @param a - complex number
 * @returns conj(a)
 */
export function cConj(a: Complex): Complex {
  return { re: a.re, im: -a.im };
}

/**
 * A real number as a complex one.
 * @param x - real number
 * @returns x + 0i
 */
export function cReal(x: number): Complex {
  return { re: x, im: 0 };
}

/**
 * Product of a list of complex numbers.
 * @param values - factors
 * @returns their product (1 for an empty list)
 */
export function cProd(values: Complex[]): Complex {
  let acc: Complex = { re: 1, im: 0 };
  for (const v of values) acc = cMul(acc, v);
  return acc;
}
